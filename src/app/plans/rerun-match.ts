import type { RehearsalDetail } from '../../../shared/api/plans';

export interface RerunMatch {
  identical: boolean;
  /** People compared and how many differ. */
  people: number;
  differing: number;
  line: string;
}

/**
 * Compares a re-run with the rehearsal it repeats: same seed and runs must give the very same
 * numbers (per-person means and intervals, room average, capped walks), not just close ones.
 */
export function rerunMatch(original: RehearsalDetail, rerun: RehearsalDetail): RerunMatch {
  const byId = new Map(original.people.map((p) => [p.personId, p]));
  let differing = 0;
  for (const p of rerun.people) {
    const o = byId.get(p.personId);
    if (!o || o.mean !== p.mean || o.low99 !== p.low99 || o.high99 !== p.high99 || o.capped !== p.capped) differing++;
  }
  const sameAverage = original.average === rerun.average && original.capped === rerun.capped;
  const identical =
    differing === 0 &&
    sameAverage &&
    rerun.people.length === original.people.length &&
    original.seed === rerun.seed &&
    original.runs === rerun.runs;
  const line = identical
    ? `Identical to rehearsal #${original.id}: seed "${rerun.seed}", ${rerun.runs.toLocaleString('en')} cascades, room average ${rerun.average?.toFixed(4)} both times, every person the same.`
    : `Differs from rehearsal #${original.id}: ${differing} of ${rerun.people.length} people changed (average ${original.average?.toFixed(4)} then, ${rerun.average?.toFixed(4)} now). Has the room changed since?`;
  return { identical, people: rerun.people.length, differing, line };
}
