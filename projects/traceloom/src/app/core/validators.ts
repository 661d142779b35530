import { AbstractControl, ValidationErrors } from '@angular/forms';

/** Fails with `{blank: true}` when a non-empty value is only whitespace (titles are trimmed). */
export function notBlank(control: AbstractControl<string>): ValidationErrors | null {
  const value = control.value ?? '';
  return value.length > 0 && value.trim().length === 0 ? { blank: true } : null;
}
