import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { PASSWORD_MAX, PASSWORD_MIN } from './account-types';

/** The two fields of a new password agree (on the group; the error sits on `repeat`'s group). */
export const samePasswords: ValidatorFn = (group: AbstractControl): ValidationErrors | null => {
  const a = group.get('password')?.value as string | undefined;
  const b = group.get('repeat')?.value as string | undefined;
  return a && b && a !== b ? { different: true } : null;
};

/** The words under a new-password field for its errors, or null. */
export function newPasswordError(control: AbstractControl): string | null {
  if (control.hasError('required')) return 'Choose a password.';
  if (control.hasError('minlength')) return `At least ${PASSWORD_MIN} characters.`;
  if (control.hasError('maxlength')) return `At most ${PASSWORD_MAX} characters.`;
  return null;
}
