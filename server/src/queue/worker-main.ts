// `npm run worker`: a worker process taking run jobs from the queue at TRACELOOM_QUEUE_URL.
import { DEFAULT_CONFIG, positiveInt, queueUrlOf } from '../config.js';
import { startQueueWorker, type WorkerSettings } from './queue-worker.js';

/**
 * The worker's settings from the environment: `TRACELOOM_QUEUE_URL` (required),
 * `TRACELOOM_WORKER_THREADS` (runs at once, default 1), `TRACELOOM_QUEUE_LOCK_MS` (default
 * 30000), `TRACELOOM_RUN_HEAP_MB` (heap limit of a run's thread, default 1024).
 */
export function workerSettings(env: NodeJS.ProcessEnv = process.env): WorkerSettings {
  const url = queueUrlOf(env);
  if (!url) throw new Error('TRACELOOM_QUEUE_URL must be set (redis://host:port) for a worker');
  return {
    url,
    threads: positiveInt(env, 'TRACELOOM_WORKER_THREADS', 1),
    lockMs: positiveInt(env, 'TRACELOOM_QUEUE_LOCK_MS', 30_000),
    maxOldGenerationSizeMb: positiveInt(
      env,
      'TRACELOOM_RUN_HEAP_MB',
      DEFAULT_CONFIG.runs.maxOldGenerationSizeMb,
    ),
  };
}

async function main(): Promise<void> {
  const settings = workerSettings();
  const worker = await startQueueWorker(settings, console.error, (jobId) =>
    console.log(`took job ${jobId}`),
  );
  console.log(
    `Traceloom worker ${process.pid}: ${settings.threads} thread(s) on ${new URL(settings.url).host}`,
  );
  let stopping = false;
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      // first signal: finish the jobs in hand; a second one leaves them to another worker
      const force = stopping;
      stopping = true;
      worker.close(force).then(
        () => process.exit(0),
        () => process.exit(1),
      );
    });
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
