import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** The Redis server binary the queue tests start (Debian's redis-server). */
export const REDIS_SERVER = process.env.TRACELOOM_REDIS_SERVER ?? 'redis-server';

/** True when `redis-server` can be started here. */
export function redisAvailable(): boolean {
  return spawnSync(REDIS_SERVER, ['--version']).status === 0;
}

/** A free TCP port on this machine. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolve(port));
    });
  });
}

/** Waits until `child` printed a line matching `pattern` (or throws after `timeoutMs`). */
export function waitForLine(child: ChildProcess, pattern: RegExp, timeoutMs = 30_000) {
  return new Promise<string>((resolve, reject) => {
    let text = '';
    const timer = setTimeout(
      () => reject(new Error(`no line matching ${pattern} within ${timeoutMs} ms:\n${text}`)),
      timeoutMs,
    );
    const onData = (chunk: Buffer) => {
      text += chunk.toString();
      const line = text.split('\n').find((l) => pattern.test(l));
      if (line === undefined) return;
      clearTimeout(timer);
      child.stdout?.off('data', onData);
      resolve(line);
    };
    child.stdout?.on('data', onData);
  });
}

/**
 * A throw-away Redis with the append-only file on, in its own temp directory, on a free port;
 * `restart` stops it (SHUTDOWN writes the file) and starts it again on the same port and file.
 */
export async function startRedis() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-redis-'));
  const port = await freePort();
  let child: ChildProcess;
  const start = async () => {
    child = spawn(
      REDIS_SERVER,
      ['--port', String(port), '--dir', dir, '--appendonly', 'yes', '--save', ''],
      { stdio: ['ignore', 'pipe', 'inherit'] },
    );
    await waitForLine(child, /Ready to accept connections/);
  };
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  await start();
  return {
    url: `redis://127.0.0.1:${port}`,
    async restart() {
      await stop();
      await start();
    },
    async stop() {
      await stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

const serverDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** Starts a worker process from the TypeScript source (as `npm run worker` does from dist/). */
export async function startWorker(url: string, env: Record<string, string> = {}) {
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', path.join(serverDir, 'src/queue/worker-main.ts')],
    {
      env: {
        ...process.env,
        TSX_TSCONFIG_PATH: path.join(serverDir, 'tsconfig.dev.json'),
        TRACELOOM_QUEUE_URL: url,
        ...env,
      },
      stdio: ['ignore', 'pipe', 'inherit'],
    },
  );
  const taken: string[] = [];
  child.stdout!.on('data', (chunk: Buffer) => {
    for (const m of chunk.toString().matchAll(/took job (\S+)/g)) taken.push(m[1]!);
  });
  await waitForLine(child, /Traceloom worker \d+/, 60_000);
  return {
    child,
    taken,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGKILL');
      }),
  };
}
