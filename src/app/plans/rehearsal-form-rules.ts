import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { REHEARSAL_LIMITS } from '../../../shared/api/plans';

const SEED = new RegExp(REHEARSAL_LIMITS.seedPattern);

/** A fresh random seed: 10 characters of letters and digits. */
export function randomSeed(): string {
  const alphabet = 'abcdefghijkmnpqrstuvwxyz23456789';
  const bytes = crypto.getRandomValues(new Uint8Array(10));
  return Array.from(bytes, (b) => alphabet[b % alphabet.length]).join('');
}

export function seedValidator(c: AbstractControl): ValidationErrors | null {
  const v = String(c.value ?? '');
  if (v === '') return { required: true };
  return SEED.test(v) ? null : { seed: true };
}

/** Cascades: a whole number from 1 to the server's cap. */
export function runsValidator(cap: () => number): ValidatorFn {
  return (c) => {
    const v = c.value;
    if (v === null || v === '' || typeof v !== 'number' || !Number.isFinite(v)) return { required: true };
    if (!Number.isInteger(v)) return { integer: true };
    if (v < 1) return { min: true };
    if (v > cap()) return { max: { max: cap() } };
    return null;
  };
}

export function runsMessage(errors: ValidationErrors | null, cap: number): string | null {
  if (!errors) return null;
  if (errors['required']) return 'Enter how many cascades to simulate.';
  if (errors['integer']) return 'Cascades are a whole number.';
  if (errors['min']) return 'Simulate at least 1 cascade.';
  if (errors['max']) return `The server allows at most ${cap.toLocaleString('en')} cascades per rehearsal.`;
  return null;
}

export function seedMessage(errors: ValidationErrors | null): string | null {
  if (!errors) return null;
  if (errors['required']) return 'Enter a seed, or press the dice for a random one.';
  if (errors['seed']) return 'Use 1 to 64 letters, digits, - or _ (no spaces).';
  return null;
}
