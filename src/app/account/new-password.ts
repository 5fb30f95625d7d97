import { type AbstractControl, NonNullableFormBuilder, type ValidationErrors, Validators } from '@angular/forms';
import { PASSWORD_MAX, PASSWORD_MIN } from '../../../shared/api/accounts';

/** The new-password + repeat pair used by accept, reset and change-password forms. */
export function newPasswordGroup(fb: NonNullableFormBuilder) {
  return fb.group(
    {
      password: ['', [Validators.required, Validators.minLength(PASSWORD_MIN), Validators.maxLength(PASSWORD_MAX)]],
      repeat: ['', [Validators.required]],
    },
    { validators: samePassword },
  );
}

function samePassword(group: AbstractControl): ValidationErrors | null {
  const password = group.get('password')!.value;
  const repeat = group.get('repeat')!;
  const mismatch = repeat.value && password !== repeat.value;
  // The error sits on the repeat field so mat-error can show it there.
  if (mismatch && !repeat.hasError('mismatch')) repeat.setErrors({ ...repeat.errors, mismatch: true });
  if (!mismatch && repeat.hasError('mismatch')) {
    const { mismatch: _m, ...rest } = repeat.errors ?? {};
    repeat.setErrors(Object.keys(rest).length ? rest : null);
  }
  return null;
}

export const PASSWORD_RULE = { min: PASSWORD_MIN, max: PASSWORD_MAX };
