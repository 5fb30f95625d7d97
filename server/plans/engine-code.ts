import type { ErrorCode } from '../../shared/api/errors';
import type { EngineErrorCode } from '../../shared/engine/index';

/**
 * The API's code for an engine error: the same word in snake_case (`INVALID_K` -> `invalid_k`).
 * The engine keeps its own upper-case codes for the command line; the return type makes the type
 * check fail when the engine gains a code that ERROR_CODES lacks.
 */
export function engineCode(code: EngineErrorCode): ErrorCode {
  return code.toLowerCase() as Lowercase<EngineErrorCode>;
}
