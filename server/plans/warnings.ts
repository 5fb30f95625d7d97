/**
 * Plan warnings between the engine, the database and the API. The engine's warnings carry the
 * same codes as the API's (plus 'note' there); plans saved before warnings had codes hold the
 * text alone, and are read here by recognising the engine's words of that time.
 */
import { PLAN_WARNING_CODES, type PlanWarning, type PlanWarningCode } from '../../shared/api/plans';
import type { PlanWarning as EngineWarning, PlanWarningCode as EngineWarningCode } from '../../shared/engine/index';
import type { StoredPlanWarning } from '../../db/schema/plans';

/** Fails the type check when the API lists a code the engine does not have (besides 'note'). */
type ApiOnly = Exclude<PlanWarningCode, EngineWarningCode | 'note'>;
const everyApiCodeIsTheEngines: [ApiOnly] extends [never] ? true : never = true;
void everyApiCodeIsTheEngines;

/** The engine's warnings as the API's; the return type fails the check when the engine gains a code the API lacks. */
export function apiWarnings(warnings: readonly EngineWarning[]): PlanWarning[] {
  return warnings.map((w) => ({ code: w.code, text: w.text }));
}

/**
 * The words of each engine warning before warnings had codes (fixed: these are the texts old
 * rows hold, whatever the engine says today).
 */
const OLD_TEXTS: readonly { code: PlanWarningCode; pattern: RegExp }[] = [
  { code: 'search-stopped', pattern: /^The search was stopped after \d+ steps with .* still open/ },
  { code: 'search-time-limit', pattern: /^Time limit reached after \d+ search steps with .* still open/ },
  { code: 'widening-time-limit', pattern: /^Time limit reached after \d+ of \d+ seeds\.$/ },
  { code: 'widening-time-limit', pattern: /^Time limit reached while widening\.$/ },
  { code: 'swap-time-limit', pattern: /^Swap polish stopped at the time limit after \d+ pass/ },
  { code: 'over-dense-limit', pattern: /^The room has \d+ people, above the dense limit of \d+: (exact|lazy) greedy was used instead of / },
  { code: 'no-show-not-exhaustive', pattern: /^Too many plans of this size to score each on the expected total/ },
];

/** The code of a warning stored as text alone: the kind its words name, else 'note'. */
export function codeOfOldText(text: string): PlanWarningCode {
  return OLD_TEXTS.find((t) => t.pattern.test(text))?.code ?? 'note';
}

const KNOWN_CODES: ReadonlySet<string> = new Set(PLAN_WARNING_CODES);

/**
 * A plan row's warnings as the API answers them: new rows' { code, text } as stored (an unknown
 * code, say from a newer server, becomes 'note'), old rows' texts with the code their words name.
 */
export function storedWarnings(stored: readonly StoredPlanWarning[] | null | undefined): PlanWarning[] {
  return (stored ?? []).map(readOne);
}

function readOne(w: StoredPlanWarning): PlanWarning {
  if (typeof w === 'string') return { code: codeOfOldText(w), text: w };
  return { code: KNOWN_CODES.has(w.code) ? w.code : 'note', text: w.text };
}
