import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { ROOM_LIMITS, SETTINGS_LIMITS } from '../../../../shared/api/rooms';

/** One plain message per field, the same rules the server applies (shared/api/rooms.ts limits). */
export function personNameProblem(name: string): string | null {
  const v = name.trim();
  if (!v) return 'A name is needed.';
  if (v.length > ROOM_LIMITS.personNameMax) return `At most ${ROOM_LIMITS.personNameMax} characters.`;
  return null;
}

export function groupProblem(group: string): string | null {
  if (group.trim().length > ROOM_LIMITS.groupMax) return `At most ${ROOM_LIMITS.groupMax} characters.`;
  return null;
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export function emailProblem(email: string): string | null {
  const v = email.trim();
  if (!v) return null;
  if (v.length > ROOM_LIMITS.emailMax) return `At most ${ROOM_LIMITS.emailMax} characters.`;
  if (!EMAIL.test(v)) return 'This does not look like an e-mail address (name@example.org).';
  return null;
}

/** Strength is "how often": a positive number, not absurdly large. */
export function strengthProblem(value: unknown): string | null {
  const n =
    typeof value === 'number'
      ? value
      : Number(
          String(value ?? '')
            .trim()
            .replace(',', '.'),
        );
  if (value === '' || value === null || value === undefined || !Number.isFinite(n)) return 'Give a number, e.g. 1 or 2.5.';
  if (n <= 0) return 'Strength must be above 0 (delete the tie instead).';
  if (n > ROOM_LIMITS.maxStrength) return `At most ${ROOM_LIMITS.maxStrength.toLocaleString('en')}: is the unit right?`;
  return null;
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
  const v = key.trim();
  if (!v) return 'A key is needed (it names the person in files).';
  if (v.length > ROOM_LIMITS.personKeyMax) return `At most ${ROOM_LIMITS.personKeyMax} characters.`;
  if (taken(v)) return 'Another person already has this key.';
  return null;
}

/** Wraps a problem function as a form validator: { problem: message }. */
export function problemValidator(check: (value: never) => string | null): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const problem = check(control.value as never);
    return problem ? { problem } : null;
  };
}
