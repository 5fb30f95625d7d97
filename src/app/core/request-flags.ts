import { HttpContext, HttpContextToken } from '@angular/common/http';

/**
 * The per-request flags the interceptors read. A caller sets them on the request's HttpContext
 * (nothing goes over the wire).
 */

/** Set on a request whose errors the caller shows itself (forms with field errors, 409 dialogs). */
export const HANDLES_ERRORS = new HttpContextToken<boolean>(() => false);

/** Set on polling and other background reads: the shell's busy bar does not count them. */
export const QUIET = new HttpContextToken<boolean>(() => false);

/** A request context with the given flags set. */
export function requestFlags(flags: { ownErrors?: boolean; quiet?: boolean }): HttpContext {
  const context = new HttpContext();
  if (flags.ownErrors) context.set(HANDLES_ERRORS, true);
  if (flags.quiet) context.set(QUIET, true);
  return context;
}
