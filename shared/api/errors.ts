/**
 * The one error envelope of the API and the list of its codes, shared by the client and the server
 * (no Node or DOM imports). Every answer of 400 and above is `{ error: { code, message, details } }`;
 * `code` is one of ERROR_CODES (snake_case), `message` says what to fix, `details` is optional.
 * The server's HttpError takes an ErrorCode, so it cannot answer with a code missing here; the
 * client switches on the same strings.
 */

export const ERROR_CODES = [
  // ---- generic ----
  'bad_request',
  'bad_json',
  'bad_encoding',
  'bad_upload',
  'too_large',
  'unauthorized',
  'forbidden',
  'csrf',
  'not_found',
  'conflict',
  'duplicate',
  'rate_limited',
  'busy',
  'busy_writing',
  'client_gone',
  'database_unavailable',
  'internal',
  // ---- accounts and sign-in ----
  'wrong_credentials',
  'wrong_password',
  'link_invalid',
  'mail_failed',
  'no_such_account',
  // ---- rooms ----
  'own_room',
  'already_shared',
  'stale_version',
  'unsupported_type',
  'too_big_to_read',
  'too_deep',
  'import_errors',
  'reciprocal_ties',
  'summary_failed',
  'summary_too_slow',
  // ---- plans and rehearsals (the engine's own codes, lower-cased, first) ----
  'empty_room',
  'invalid_option',
  'unknown_person',
  'invalid_k',
  'k_below_closed_groups',
  'must_include_too_many',
  'conflicting_constraints',
  'no_feasible_plan',
  'exhaustive_infeasible',
  'room_too_large',
  'invalid_starters',
  'solver_failed',
  'invalid_input',
  'unreachable_people',
  'too_many_cascades',
  'invalid_seed',
  'not_ready',
  'not_rerunnable',
  'wrong_room',
  'unknown_sample',
  'plan_too_slow',
  // ---- job quotas ----
  'quota_jobs',
  'quota_cascades',
  'quota_plans',
  // ---- workshops and participants ----
  'status_move',
  'workshop_closed',
  'survey_closed',
  'join_closed',
  'not_released',
  'no_room',
  'room_gone',
  'too_few',
  'bad_roster',
  'name_taken',
  'all_names_taken',
  'unknown_name',
  'empty_answer',
  'nobody_with_names',
  'too_many_nominations',
  'unknown_people',
  'self_nomination',
  'duplicate_nomination',
  'answers_changed',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

const KNOWN: ReadonlySet<string> = new Set(ERROR_CODES);

export function isErrorCode(value: unknown): value is ErrorCode {
  return typeof value === 'string' && KNOWN.has(value);
}

/** Field-level errors in 400 answers: `error.details.fields`. Batch ops are named `ops.3.strength`. */
export interface FieldError {
  field: string;
  message: string;
}

export interface ErrorBody {
  code: ErrorCode;
  message: string;
  /** `fields` for a refused form or query; other keys depend on the code (`field`, `suggest`, `report`, ...). */
  details?: unknown;
}

/** What every error answer carries. */
export interface ErrorEnvelope {
  error: ErrorBody;
}
