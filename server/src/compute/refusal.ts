import type { Piscina } from 'piscina';
import { fieldLabel } from '@traceloom/shared/format';
import { AppError } from '../http/app-error.js';
import type { WorkerRefusal } from '../runs/worker.js';

/**
 * The API error for a worker's refusal of a spec: 400 `invalid_spec` with `field` = `spec.<path>`
 * and a message that names the field by its label in the gas form (`fieldLabel`), or
 * for an engine failure that is not a refusal 422 `cannot_compute` (field `spec`), worded for a
 * person and without any stack.
 */
export function specRefusal(output: WorkerRefusal): AppError {
  if (output.internal) {
    return new AppError(422, 'cannot_compute', `Gas: ${output.message}.`, 'spec');
  }
  const field = output.field ? `spec.${output.field}` : 'spec';
  return new AppError(400, 'invalid_spec', `${fieldLabel(field)}: ${output.message}.`, field);
}

/**
 * Runs a task on `pool` with a wall-clock limit: at `limitMs` the task is aborted (piscina
 * terminates its worker) and the answer is `onTimeout()` at once, without waiting for the
 * worker to wind down.
 */
export async function runWithin(
  pool: Piscina,
  task: unknown,
  limitMs: number,
  onTimeout: () => AppError,
): Promise<unknown> {
  const controller = new AbortController();
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      reject(onTimeout());
      controller.abort();
    }, limitMs);
  });
  const work = pool.run(task, { signal: controller.signal });
  work.catch(() => undefined);
  try {
    return await Promise.race([work, timeout]);
  } finally {
    clearTimeout(timer);
  }
}
