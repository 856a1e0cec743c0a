import { AbstractControl } from '@angular/forms';
import type { FieldError } from '@shared/contracts/problem';

/**
 * Puts each of the API's field errors on the form control its path names, under the `server` key,
 * and returns the messages no control matched (to show above the form). The error goes away on the
 * next edit of the field, when its validators run again.
 */
export function applyFieldErrors(form: AbstractControl, errors: readonly FieldError[]): string[] {
  const unmatched: string[] = [];
  for (const { path, message } of errors) {
    const control = path === '' ? null : form.get(path);
    if (control === null) {
      unmatched.push(message);
      continue;
    }
    control.setErrors({ ...control.errors, server: message });
    control.markAsTouched();
  }
  return unmatched;
}
