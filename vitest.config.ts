import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const sharedSrc = fileURLToPath(new URL('./shared/src/', import.meta.url));
/** `@traceloom/shared[/api|/engine|/format]` resolve to the library's TypeScript source in tests. */
const alias = [
  { find: /^@traceloom\/shared$/, replacement: `${sharedSrc}index.ts` },
  { find: /^@traceloom\/shared\/(api|engine|format)$/, replacement: `${sharedSrc}$1/index.ts` },
];

/** Server specs whose figures are wall-clock measurements. */
const TIMING_SPECS = [
  'server/src/runs/runs.spec.ts',
  'server/src/runs/large-result.spec.ts',
  'server/src/runs/run-streams.spec.ts',
  'server/src/datasets/large-dataset.spec.ts',
];

/** Specs that start redis-server and worker processes (queue mode). */
const QUEUE_SPECS = 'server/src/queue/**/*.spec.ts';

/**
 * Node-side test projects. The Angular client's unit tests run through `ng test`
 * (the @angular/build unit-test builder), not from here.
 */
export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: 'shared', environment: 'node', include: ['shared/src/**/*.spec.ts'] },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          environment: 'node',
          include: ['server/src/**/*.spec.ts'],
          exclude: [...TIMING_SPECS, QUEUE_SPECS],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        // Tests that measure latency and kill times run alone, after the rest of the server suite,
        // so that parallel test files do not eat the margins they measure.
        resolve: { alias },
        test: {
          name: 'server-timing',
          environment: 'node',
          include: TIMING_SPECS,
          testTimeout: 60_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
      {
        // Queue mode: a Redis server and worker processes of its own (skipped without redis-server).
        resolve: { alias },
        test: {
          name: 'server-queue',
          environment: 'node',
          include: [QUEUE_SPECS],
          testTimeout: 180_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/**/*.e2e.ts'],
          testTimeout: 120_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
