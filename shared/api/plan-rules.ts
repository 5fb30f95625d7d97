/**
 * One rule set for the plan and rehearsal forms, used by the client (to show each message under
 * its field and keep submit disabled while anything is wrong) and by the server (to answer a bad
 * request with the very same words). Plain functions: no Node, no DOM, no Angular.
 *
 * Order matters and is the same on both sides: the budget first; the constraints only once the
 * budget is valid (so "k = 61" reads as a budget problem, never as a constraint problem).
 */
import type { ErrorCode } from './errors';
import { SEED_PATTERN } from './ids';
import { PLAN_LIMITS } from './plans';

export type PlanField = 'k' | 'mustBrief' | 'cannotBrief' | 'starters' | 'noShow' | 'timeLimitSeconds';

export interface RuleProblem<F extends string = PlanField> {
  field: F;
  /** The server's error code for this problem. */
  code: ErrorCode;
  message: string;
}

/** No-show chance as a share (0..0.5); the form shows it in percent (0..50). */
export const NO_SHOW_LIMITS = { min: 0, max: 0.5 } as const;

const people = (n: number) => `${n} ${n === 1 ? 'person' : 'people'}`;

/** The budget's valid range for a room of n people: 1 to n - 1 (briefing everyone needs no plan). */
export function budgetRange(roomSize: number): { min: number; max: number } {
  return { min: 1, max: Math.max(1, roomSize - 1) };
}

export function budgetProblem(k: unknown, roomSize: number): RuleProblem | null {
  const bad = (message: string): RuleProblem => ({ field: 'k', code: 'invalid_k', message });
  if (roomSize < 2) return bad(`This room has ${people(roomSize)}: a plan needs at least 2 people.`);
  const { max } = budgetRange(roomSize);
  if (k === null || k === undefined || k === '' || typeof k !== 'number' || !Number.isFinite(k))
    return bad('Enter how many people you can brief first.');
  if (!Number.isInteger(k)) return bad(`The budget is a whole number of people: 1 to ${max}.`);
  if (k < 1) return bad(`Brief at least 1 person: the budget is 1 to ${max}.`);
  if (k > max) return bad(`At most ${max} in a room of ${roomSize}: briefing everyone needs no plan. Choose 1 to ${max}.`);
  return null;
}

export function noShowProblem(chance: unknown): RuleProblem | null {
  if (chance === null || chance === undefined || chance === '') return null;
  if (typeof chance !== 'number' || !Number.isFinite(chance) || chance < NO_SHOW_LIMITS.min || chance > NO_SHOW_LIMITS.max)
    return { field: 'noShow', code: 'invalid_option', message: 'The no-show chance is 0 to 50 %.' };
  return null;
}

/** The search's time limit in seconds (empty: the default). */
export function timeLimitProblem(seconds: unknown): RuleProblem | null {
  if (seconds === null || seconds === undefined || seconds === '') return null;
  const { min, max } = PLAN_LIMITS.timeLimitSeconds;
  if (typeof seconds !== 'number' || !Number.isFinite(seconds) || seconds < min || seconds > max)
    return { field: 'timeLimitSeconds', code: 'invalid_option', message: `The time limit is ${min} to ${max} seconds.` };
  return null;
}

export interface PlanRuleInput {
  k: unknown;
  mustBrief: readonly number[];
  cannotBrief: readonly number[];
  noShow?: unknown;
}

/** Every problem of a computed-plan request, in the order both sides report them. */
export function planRequestProblems(input: PlanRuleInput, roomSize: number, nameOf: (id: number) => string): RuleProblem[] {
  const out: RuleProblem[] = [];
  const budget = budgetProblem(input.k, roomSize);
  if (budget) out.push(budget);
  const ns = noShowProblem(input.noShow);
  if (ns) out.push(ns);
  const cannot = new Set(input.cannotBrief);
  const both = input.mustBrief.filter((id) => cannot.has(id));
  if (both.length > 0) {
    out.push({
      field: 'cannotBrief',
      code: 'conflicting_constraints',
      message: `${both.map(nameOf).join(', ')} cannot be in both lists: remove ${both.length === 1 ? 'them' : 'each'} from one.`,
    });
  }
  if (budget) return out;
  const k = input.k as number;
  if (input.mustBrief.length > k) {
    out.push({
      field: 'mustBrief',
      code: 'must_include_too_many',
      message: `${people(input.mustBrief.length)} must be briefed but the budget is ${k}: raise the budget to ${input.mustBrief.length} or remove someone.`,
    });
  }
  const available = roomSize - cannot.size;
  if (both.length === 0 && available < k) {
    out.push({
      field: 'cannotBrief',
      code: 'no_feasible_plan',
      message: `Only ${available} of ${roomSize} people may be briefed, fewer than the budget of ${k}: allow more people or lower the budget.`,
    });
  }
  return out;
}

/** A hand-made plan: 1 to n - 1 starters. */
export function startersProblem(count: number, roomSize: number): RuleProblem | null {
  const { max } = budgetRange(roomSize);
  if (count < 1) return { field: 'starters', code: 'invalid_k', message: 'Pick at least one starter.' };
  if (count > max)
    return {
      field: 'starters',
      code: 'invalid_k',
      message: `Pick at most ${max} starters in a room of ${roomSize}: leave someone to hear it by word of mouth.`,
    };
  return null;
}

// ---- rehearsals ----

export type RehearsalField = 'runs' | 'seed';

/** Cascades: a whole number from 1 to the server's cap. */
export function runsProblem(runs: unknown, cap: number): RuleProblem<RehearsalField> | null {
  const bad = (code: ErrorCode, message: string): RuleProblem<RehearsalField> => ({ field: 'runs', code, message });
  if (runs === null || runs === undefined || runs === '' || typeof runs !== 'number' || !Number.isFinite(runs))
    return bad('invalid_option', 'Enter how many cascades to simulate.');
  if (!Number.isInteger(runs)) return bad('invalid_option', `Cascades are a whole number: 1 to ${cap.toLocaleString('en-US')}.`);
  if (runs < 1) return bad('invalid_option', `Simulate at least 1 cascade (at most ${cap.toLocaleString('en-US')}).`);
  if (runs > cap)
    return bad(
      'too_many_cascades',
      `At most ${cap.toLocaleString('en-US')} cascades per rehearsal (you asked for ${runs.toLocaleString('en-US')}): lower the number.`,
    );
  return null;
}

export function seedProblem(seed: unknown): RuleProblem<RehearsalField> | null {
  const s = typeof seed === 'string' ? seed : '';
  if (s === '') return { field: 'seed', code: 'invalid_seed', message: 'Enter a seed, or press the dice for a random one.' };
  if (!SEED_PATTERN.test(s))
    return {
      field: 'seed',
      code: 'invalid_seed',
      message: 'A seed is 1 to 64 letters, digits, "-" or "_" (for example 2026-allhands), no spaces.',
    };
  return null;
}
