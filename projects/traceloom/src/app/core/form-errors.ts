import { FormGroup } from '@angular/forms';
import type { z } from 'zod';
import { ApiError, fieldName } from './api-error';

/**
 * Shows a server validation error on the form control it names (as the `server` error, so the
 * template prints the server's message under the field). Returns false when the error names no
 * control of this form, so the caller shows it elsewhere.
 */
export function showOnField(
  form: FormGroup,
  error: unknown,
  fieldFor?: (e: ApiError) => string | undefined,
): boolean {
  if (!(error instanceof ApiError)) return false;
  return setServerError(form, fieldFor?.(error) ?? fieldName(error), error.message);
}

/**
 * Checks a request body with the API's own schema (the one the server applies) before sending.
 * Returns the parsed body, or null after putting each problem under its field; problems that
 * name no field go to `onOther`.
 */
export function parseForRequest<S extends z.ZodType>(
  form: FormGroup,
  schema: S,
  body: unknown,
  onOther: (message: string) => void,
): z.output<S> | null {
  const result = schema.safeParse(body);
  if (result.success) return result.data;
  for (const issue of result.error.issues) {
    const message = sentence(issue.message);
    const name = typeof issue.path[0] === 'string' ? issue.path[0] : undefined;
    if (!setServerError(form, name, message)) onOther(message);
  }
  return null;
}

function setServerError(form: FormGroup, name: string | undefined, message: string): boolean {
  const control = name ? form.get(name) : null;
  if (!control) return false;
  control.setErrors({ server: message });
  control.markAsTouched();
  return true;
}

function sentence(message: string): string {
  const text = message.charAt(0).toUpperCase() + message.slice(1);
  return /[.!?]$/.test(text) ? text : `${text}.`;
}
