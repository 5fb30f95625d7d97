/**
 * Typed errors of the engine. Every validation failure carries a stable `code` (for the
 * CLI's exit status and the server's JSON answer) and a message that says what to fix.
 */
export type EngineErrorCode =
  | 'EMPTY_ROOM'
  | 'INVALID_OPTION'
  | 'UNKNOWN_PERSON'
  | 'INVALID_K'
  | 'K_BELOW_CLOSED_GROUPS'
  | 'MUST_INCLUDE_TOO_MANY'
  | 'CONFLICTING_CONSTRAINTS'
  | 'NO_FEASIBLE_PLAN'
  | 'EXHAUSTIVE_INFEASIBLE'
  | 'ROOM_TOO_LARGE'
  | 'INVALID_STARTERS'
  | 'SOLVER_FAILED'
  | 'INVALID_INPUT';

export class EngineError extends Error {
  readonly code: EngineErrorCode;
  /** Optional machine-readable detail (indices, sizes) for callers that build their own message. */
  readonly detail?: Record<string, unknown>;

  constructor(code: EngineErrorCode, message: string, detail?: Record<string, unknown>) {
    super(message);
    this.name = 'EngineError';
    this.code = code;
    this.detail = detail;
  }
}

export function isEngineError(e: unknown): e is EngineError {
  return e instanceof EngineError;
}
