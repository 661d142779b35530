// `npm run bench -- --queue`: the same 8 runs through the job queue on 1 and on 2 worker
// processes (one thread each), on a throw-away redis-server; prints both wall clocks and the ratio.
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { root } from './lib.mjs';

/** One run of the ladder q^L/(1-q^L) to order 2500 for N <= 100 (about 2 s on one thread). */
const SPEC = {
  format: 'traceloom.gas/1',
  title: 'bench ladder',
  statistics: 'fermion',
  variable: 'q',
  step: '1',
  order: '2500',
  nMax: 100,
  weights: { kind: 'formula', expression: 'q^L/(1-q^L)' },
};
const RUNS = 8;

const freePort = () =>
  new Promise((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const { port } = probe.address();
      probe.close(() => resolve(port));
    });
  });

/** Starts a process and resolves once it printed a line matching `pattern`. */
function started(command, args, pattern, env = process.env) {
  const child = spawn(command, args, { env, stdio: ['ignore', 'pipe', 'inherit'] });
  return new Promise((resolve, reject) => {
    let text = '';
    child.output = () => text;
    child.stdout.on('data', (chunk) => {
      text += chunk;
      if (pattern.test(text)) resolve(child);
    });
    child.once('exit', (code) => reject(new Error(`${command} exited (${code}):\n${text}`)));
  });
}

/** Times RUNS runs on `workers` worker processes; answers milliseconds. */
async function timeOn(workers, url, RemoteRuns, round) {
  const entry = path.join(root, 'dist', 'server', 'queue', 'worker-main.js');
  const env = { ...process.env, TRACELOOM_QUEUE_URL: url, TRACELOOM_WORKER_THREADS: '1' };
  const children = await Promise.all(
    Array.from({ length: workers }, () =>
      started(process.execPath, [entry], /Traceloom worker/, env),
    ),
  );
  const remote = new RemoteRuns(url, RUNS);
  const t0 = performance.now();
  const outputs = await Promise.all(
    Array.from({ length: RUNS }, (_, i) =>
      remote.run(`bench-${round}-${i}`, SPEC, new AbortController().signal, () => {}),
    ),
  );
  const ms = performance.now() - t0;
  const taken = children.map((c) => (c.output().match(/took job/g) ?? []).length);
  console.log(`  ${workers} worker(s): jobs taken per worker ${taken.join(' + ')}`);
  await remote.close();
  for (const child of children) child.kill('SIGKILL');
  if (!outputs.every((o) => o.ok)) throw new Error('a bench run failed');
  return ms;
}

/** Runs the queue benchmark and prints the figures. */
export async function benchQueue() {
  if (spawnSync('sh', ['-c', 'command -v redis-server']).status !== 0) {
    console.error('bench --queue: redis-server not found (apt-get install redis-server)');
    process.exit(2);
  }
  const dir = mkdtempSync(path.join(tmpdir(), 'traceloom-bench-redis-'));
  const port = await freePort();
  const redis = await started(
    'redis-server',
    ['--port', String(port), '--dir', dir, '--save', ''],
    /Ready to accept connections/,
  );
  try {
    const { RemoteRuns } = await import(
      pathToFileURL(path.join(root, 'dist', 'server', 'queue', 'remote-runs.js')).href
    );
    const url = `redis://127.0.0.1:${port}`;
    const one = await timeOn(1, url, RemoteRuns, 'one');
    const two = await timeOn(2, url, RemoteRuns, 'two');
    console.log(`queue: ${RUNS} runs (ladder, order 2500, N <= 100)`);
    console.log(`  1 worker process : ${(one / 1000).toFixed(1)} s`);
    console.log(`  2 worker processes: ${(two / 1000).toFixed(1)} s`);
    console.log(`  ratio 1 : 2 = ${(one / two).toFixed(2)}x`);
  } finally {
    redis.kill('SIGTERM');
    rmSync(dir, { recursive: true, force: true });
  }
}
