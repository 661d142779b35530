import { FormGroup } from '@angular/forms';
import { ApiError, fieldName } from './api-error';

/**
 * Shows a server validation error on the form control it names (as the `server` error, so the
 * template prints the server's message under the field). Returns false when the error names no
 * control of this form, so the caller shows it elsewhere.
 */
export function showOnField(form: FormGroup, error: unknown, fieldFor?: (e: ApiError) => string | undefined): boolean {
  if (!(error instanceof ApiError)) return false;
  const name = fieldFor?.(error) ?? fieldName(error);
  const control = name ? form.get(name) : null;
  if (!control) return false;
  control.setErrors({ server: error.message });
  control.markAsTouched();
  return true;
}
