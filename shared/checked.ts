/**
 * Checked reads for `noUncheckedIndexedAccess` (tsconfig.strict.json, tsconfig.app.json): an index the
 * code produced itself (a person's position in a room snapshot, the one row a COUNT or a single insert
 * returns) is in range by construction, so a miss is a programming error. These read it, and a miss
 * throws an error that says what was being read instead of letting `undefined` travel on.
 * Input a user can get wrong is checked where it is parsed, with an HttpError, never here.
 */

/** `items[i]`, or a RangeError naming `what` when `i` is outside the list. */
export function itemAt<T>(items: ArrayLike<T>, i: number, what: string): T {
  const item = items[i];
  if (item === undefined) throw new RangeError(`${what}: index ${i} is outside 0..${items.length - 1}.`);
  return item;
}

/** The first element of a list that must have one (the row of a COUNT, the id of a single insert). */
export function firstOf<T>(items: ArrayLike<T>, what: string): T {
  const item = items[0];
  if (item === undefined) throw new RangeError(`${what}: expected at least one, got none.`);
  return item;
}

/** The last element of a list that must have one. */
export function lastOf<T>(items: ArrayLike<T>, what: string): T {
  return itemAt(items, items.length - 1, what);
}
