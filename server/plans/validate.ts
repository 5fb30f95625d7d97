/**
 * Checks a plan request on the request thread before any work is queued, so every bad input is
 * a specific 400 at once (never a failed background job): person ids, k, the closed groups, the
 * exhaustive size limit. The engine's own validation (planContext, O(n + m) here) gives the codes.
 */
import { isEngineError, unreachablePeople, type PreparedRoom } from '../../shared/engine/index';
import type { ErrorCode } from '../../shared/api/errors';
import { planContext } from '../../shared/engine/plan-context';
import { PLAN_LIMITS, type CreatePlanRequest } from '../../shared/api/plans';
import { planRequestProblems, startersProblem, type RuleProblem } from '../../shared/api/plan-rules';
import { HttpError } from '../core/http-error';
import { engineCode } from './engine-code';
import type { RoomSnapshot } from './compute';
import { personAt } from './snapshot';

export function planError(code: ErrorCode, message: string, details?: Record<string, unknown>): HttpError {
  return new HttpError(400, code, message, details);
}

/** Engine errors become 400 answers with the engine's code; anything else is rethrown. */
export function fromEngine(e: unknown): never {
  if (isEngineError(e)) throw planError(engineCode(e.code), e.message, e.detail);
  throw e;
}

/** Person ids -> engine indices, naming every id that is not (or no longer) in the room. */
export function indicesOfPeople(snapshot: RoomSnapshot, ids: readonly number[], what: string): number[] {
  const index = new Map(snapshot.personIds.map((id, i) => [id, i]));
  const missing = ids.filter((id) => !index.has(id));
  if (missing.length > 0) {
    throw planError(
      'unknown_person',
      `${what}: ${missing.length === 1 ? `person ${missing[0]} is` : `people ${missing.join(', ')} are`} not in this room ` +
        '(deleted, or from another room). Reload the room and choose again.',
      { personIds: missing },
    );
  }
  const dupes = ids.filter((id, i) => ids.indexOf(id) !== i);
  const twice = dupes[0] === undefined ? undefined : index.get(dupes[0]);
  if (twice !== undefined)
    throw planError('invalid_starters', `${what}: ${personAt(snapshot, twice).name} is listed twice.`, { personIds: dupes });
  return ids.map((id) => index.get(id)!);
}

/** The shared rule's problem as a 400 naming the form field it belongs to (`details.field`). */
function ruleError(p: RuleProblem, details: Record<string, unknown> = {}): HttpError {
  return planError(p.code, p.message, { ...details, field: p.field });
}

export function checkPlannerRequest(
  room: PreparedRoom,
  snapshot: RoomSnapshot,
  body: CreatePlanRequest,
  must: number[],
  exclude: number[],
): void {
  const n = room.n;
  const k = body.k!;
  const nameOf = new Map(snapshot.personIds.map((id, i) => [id, snapshot.names[i]]));
  const [first] = planRequestProblems(
    { k, mustBrief: body.mustBrief ?? [], cannotBrief: body.cannotBrief ?? [], noShow: body.noShow },
    n,
    (id) => nameOf.get(id) ?? `#${id}`,
  );
  if (first) throw ruleError(first, { k, people: n });
  if (body.method === 'exhaustive' && n > PLAN_LIMITS.exhaustiveMaxPeople) {
    throw planError(
      'exhaustive_infeasible',
      `Exhaustive search is offered for rooms of at most ${PLAN_LIMITS.exhaustiveMaxPeople} people; this room has ${n}. ` +
        'Use auto (widened greedy then swap polish, with a proven gap) or swap polish instead.',
      { people: n, limit: PLAN_LIMITS.exhaustiveMaxPeople, suggest: 'auto' },
    );
  }
  try {
    planContext(room, { k, method: body.method ?? 'auto', mustInclude: must, exclude });
  } catch (e) {
    fromEngine(e);
  }
}

export function checkHandMade(room: PreparedRoom, snapshot: RoomSnapshot, starters: number[]): void {
  const n = room.n;
  const problem = startersProblem(starters.length, n);
  if (problem) throw ruleError(problem, { k: starters.length, people: n });
  const lost = unreachablePeople(room, starters);
  if (lost.length > 0) {
    const people = lost.map((u) => ({ personId: snapshot.personIds[u.index], name: snapshot.names[u.index], reason: u.reason }));
    const named = people
      .slice(0, 5)
      .map((p) => p.name)
      .join(', ');
    throw planError(
      'unreachable_people',
      `With these starters ${people.length} ${people.length === 1 ? 'person' : 'people'} can never hear (${named}${people.length > 5 ? ', ...' : ''}): ` +
        'add a starter in each part of the room that questions cannot leave.',
      { people },
    );
  }
}
