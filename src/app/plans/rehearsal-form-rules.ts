import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { runsProblem, seedProblem } from '../../../shared/api/plan-rules';

/** A fresh random seed: 10 characters of letters and digits. */
export function randomSeed(): string {
  const alphabet = 'abcdefghijkmnpqrstuvwxyz23456789';
  const bytes = crypto.getRandomValues(new Uint8Array(10));
  return Array.from(bytes, (b) => alphabet[b % alphabet.length]).join('');
}

/** The seed by the shared rule (shared/api/plan-rules.ts); the error carries its message. */
export function seedValidator(c: AbstractControl): ValidationErrors | null {
  const p = seedProblem(c.value ?? '');
  return p ? { seed: p.message } : null;
}

/** Cascades: a whole number from 1 to the server's cap (shared rule). */
export function runsValidator(cap: () => number): ValidatorFn {
  return (c) => {
    const p = runsProblem(c.value, cap());
    return p ? { runs: p.message } : null;
  };
}

/** The message of the current errors (never an earlier one: it is read from the errors themselves). */
export function runsMessage(errors: ValidationErrors | null): string | null {
  return (errors?.['runs'] as string | undefined) ?? null;
}

export function seedMessage(errors: ValidationErrors | null): string | null {
  return (errors?.['seed'] as string | undefined) ?? null;
}
