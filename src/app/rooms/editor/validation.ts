import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { email, group, personKey, personName, ruleProblem, strength } from '../../../../shared/api/room-rules';
import { SETTINGS_LIMITS } from '../../../../shared/api/rooms';

/** One plain message per field: the server's own rules and words (shared/api/room-rules.ts). */
export function personNameProblem(name: string): string | null {
  return ruleProblem(personName, name);
}

export function groupProblem(value: string): string | null {
  return ruleProblem(group, value);
}

export function emailProblem(value: string): string | null {
  return ruleProblem(email, value);
}

/** Strength is "how often": a positive number, not absurdly large. The form also takes a decimal comma. */
export function strengthProblem(value: unknown): string | null {
  const typed = typeof value === 'string' ? value.trim().replace(',', '.') : value;
  return ruleProblem(strength, typed === '' || typed === null ? undefined : typeof typed === 'string' ? Number(typed) : typed);
}

export function settingProblem(name: keyof typeof SETTINGS_LIMITS, value: unknown): string | null {
  const { min, max } = SETTINGS_LIMITS[name];
  const n = typeof value === 'number' ? value : Number(value);
  if (value === '' || value === null || !Number.isFinite(n)) return 'Give a number.';
  if (n < min || n > max) return `From ${min} to ${max}.`;
  return null;
}

/** A person's key must be unique in the room. */
export function keyProblem(key: string, taken: (key: string) => boolean): string | null {
  const problem = ruleProblem(personKey, key);
  if (problem) return problem;
  if (taken(key.trim())) return 'Another person already has this key.';
  return null;
}

/** Wraps a problem function as a form validator: { problem: message }. */
export function problemValidator(check: (value: never) => string | null): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const problem = check(control.value as never);
    return problem ? { problem } : null;
  };
}
