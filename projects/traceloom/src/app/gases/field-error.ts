import { AbstractControl } from '@angular/forms';

/**
 * The message shown under a gas editor field, naming the field: the required check, then the
 * shared schema's finding (`schema`), then the server's (`server`). A message that starts in lower
 * case (`must be a multiple of step`) is prefixed with the field's label.
 */
export function errorText(control: AbstractControl | null, label: string): string | null {
  if (!control?.errors) return null;
  if (control.hasError('required')) return `${label} is required.`;
  const raw = (control.getError('server') ?? control.getError('schema')) as string | undefined;
  if (!raw) return null;
  const text = /^[a-z]/.test(raw) ? `${label} ${raw}` : raw;
  return /[.!?]$/.test(text) ? text : `${text}.`;
}
