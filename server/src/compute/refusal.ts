import { fieldLabel } from '@traceloom/shared/format';
import { AppError } from '../http/app-error.js';
import type { WorkerRefusal } from './tasks.js';

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
