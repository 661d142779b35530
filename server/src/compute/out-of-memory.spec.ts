import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AppError } from '../http/app-error.js';
import { TaskRunner } from './run-task.js';

// A real worker thread with a small heap that allocates until V8 stops it: the error the pool
// rejects with is the one Node raises (ERR_WORKER_OUT_OF_MEMORY), not a stand-in.
const HEAP_MB = 16;
let dir: string;
let pool: Piscina;

beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'traceloom-oom-'));
  const file = path.join(dir, 'hog.mjs');
  writeFileSync(
    file,
    'export default () => { const keep = []; for (;;) keep.push(new Array(1e5).fill(keep.length)); };\n',
  );
  pool = new Piscina({
    filename: pathToFileURL(file).href,
    minThreads: 1,
    maxThreads: 1,
    resourceLimits: { maxOldGenerationSizeMb: HEAP_MB },
  });
});

afterAll(async () => {
  await pool.destroy();
  rmSync(dir, { recursive: true, force: true });
});

describe('a task whose worker runs out of memory', () => {
  it('Node raises ERR_WORKER_OUT_OF_MEMORY for it', async () => {
    const err = await pool.run({}).then(
      () => null,
      (e: unknown) => e,
    );
    expect((err as { code?: unknown }).code).toBe('ERR_WORKER_OUT_OF_MEMORY');
  });

  it('answers 422 saying it ran out of memory, with the limit and what to reduce', async () => {
    const runner = new TaskRunner({ runs: pool, quick: pool, probe: pool }, { runs: HEAP_MB });
    const err = await runner.runTask('verify', { snapshot: '' }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(AppError);
    expect(err).toMatchObject({ status: 422, code: 'cannot_compute' });
    const message = (err as AppError).message;
    expect(message).toMatch(/ran out of memory/);
    expect(message).toContain(`the limit is ${HEAP_MB} MB per task`);
    expect(message).toMatch(/smaller N_max/);
  });

  it('a caller that reads the failure its own way keeps its message', async () => {
    const runner = new TaskRunner({ runs: pool, quick: pool, probe: pool });
    const mine = new AppError(413, 'file_too_complex', 'file: split the table.', 'file');
    await expect(
      runner.runTask('reference', {} as never, { outOfMemory: () => mine }),
    ).rejects.toBe(mine);
  });
});
