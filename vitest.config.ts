import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const sharedSrc = fileURLToPath(new URL('./shared/src/', import.meta.url));
/** `@traceloom/shared[/api|/engine]` resolve to the library's TypeScript source in tests. */
const alias = [
  { find: /^@traceloom\/shared$/, replacement: `${sharedSrc}index.ts` },
  { find: /^@traceloom\/shared\/(api|engine)$/, replacement: `${sharedSrc}$1/index.ts` },
];

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
          testTimeout: 30_000,
          hookTimeout: 60_000,
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
