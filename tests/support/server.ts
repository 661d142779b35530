import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** A built Traceloom server started for one test file: free port, temporary database, demo seed. */
export interface TestServer {
  baseUrl: string;
  dbFile: string;
  output: () => string;
  stop: () => Promise<void>;
}

/**
 * Starts `node dist/server/main.js` (run `npm run build` first) on port 0 with a fresh temporary
 * SQLite file in demo mode, and resolves once it prints the address it serves on.
 */
export async function startServer(extraEnv: Record<string, string> = {}): Promise<TestServer> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-e2e-'));
  const dbFile = path.join(dir, 'traceloom.sqlite');
  const child: ChildProcess = spawn(process.execPath, ['dist/server/main.js'], {
    cwd: root,
    env: { ...process.env, PORT: '0', TRACELOOM_DB: dbFile, TRACELOOM_MODE: 'demo', ...extraEnv },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  const baseUrl = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${log}`)), 60_000);
    const onData = (chunk: Buffer) => {
      log += chunk.toString();
      const match = /serving on (http:\/\/localhost:\d+)/.exec(log);
      if (match) {
        clearTimeout(timer);
        resolve(match[1]);
      }
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', onData);
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited with ${code}:\n${log}`));
    });
  });
  return {
    baseUrl,
    dbFile,
    output: () => log,
    stop: async () => {
      if (child.exitCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
        if (child.exitCode === null) child.kill('SIGKILL');
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
