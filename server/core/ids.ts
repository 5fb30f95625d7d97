import { z } from 'zod';
import { ID_PATTERN } from '../../shared/api/ids';
import { notFound } from './http-error';

/** The one pattern for ids in URLs (shared/api/ids.ts), small enough to be a safe integer. */
export { ID_PATTERN };

/** The id if `raw` is one, else undefined. */
export function asId(raw: unknown): number | undefined {
  if (typeof raw === 'number') return Number.isSafeInteger(raw) && raw > 0 ? raw : undefined;
  if (typeof raw !== 'string' || !ID_PATTERN.test(raw)) return undefined;
  const id = Number(raw);
  return Number.isSafeInteger(id) ? id : undefined;
}

/** Parses an id from a URL; anything else answers 404 naming `what`. */
export function idOf(raw: unknown, what = 'That item'): number {
  const id = asId(raw);
  if (id === undefined) throw notFound(what);
  return id;
}

/** The same rule as a zod schema, for `parse(…, req.params)`: a bad id is a 404, not a 400. */
export const idParam = (what = 'That item') => z.string().transform((raw) => idOf(raw, what));
