import type { BoundSource, PlanSummary, PlanWarningCode } from '../../../shared/api/plans';

/** Plain words for what proved a lower bound, with the technical term for the tooltip. */
export const BOUND_WORDS: Record<BoundSource, { plain: string; term: string }> = {
  search: { plain: 'a search of every possible group', term: 'branch-and-bound lower bound' },
  supermodular: {
    plain: 'the most any remaining starters could still save',
    term: 'supermodularity bound (total minus the k largest single gains)',
  },
  cover: { plain: 'the fact that nobody can hear in less than one hop', term: 'vertex-cover bound n − k' },
  single: { plain: 'scoring every single starter', term: 'exhaustive scan of all one-person plans' },
};

const hops = (v: number) => `${v.toFixed(1)} hops`;

/** One line under the gap to best: what is proven, in hops and minutes. */
export function gapLine(p: PlanSummary): string {
  const mph = p.settings.minutesPerHop;
  const rest = p.people - p.k;
  if (p.certified) {
    const how = p.boundSource ? BOUND_WORDS[p.boundSource].plain : 'a proven bound';
    return `No plan of ${p.k} starters is faster: proven by ${how}.`;
  }
  if (p.lowerBound === null || rest <= 0) return 'No proven bound is known for this plan yet.';
  const best = p.lowerBound / rest;
  return (
    `Proven: no plan of ${p.k} starters gets the room average below ${hops(best)} (≈ ${Math.round(best * mph)} min), ` +
    `so the best one cuts this plan's waiting by at most ${((p.gapShare ?? 0) * 100).toFixed(1)} %.`
  );
}

/** Shown when another plan of the same problem is known to be faster. */
export function fasterKnownLine(p: PlanSummary): string | null {
  if (p.bestKnownTotal === null || p.total === null || !(p.bestKnownTotal < p.total * (1 - 1e-9))) return null;
  const rest = p.people - p.k;
  return `A faster plan with the same budget and constraints is saved: room average ${hops(p.bestKnownTotal / rest)}.`;
}

/** What the quality rank means, in our words. */
export const RANK_LINE = '0 = as slow as briefing only the worst-placed person; 1 = as fast as a group that everyone talks to directly.';

/** The method card's line: what was run and what the search did, in plain words. */
export function methodLine(p: PlanSummary): string {
  const parts: string[] = [];
  if (p.methodRequested === 'auto') parts.push('Chosen automatically');
  const x = p.extras;
  if (x?.nodes) parts.push(`${x.nodes.toLocaleString('en-US')} partial groups examined`);
  if (x && x.searchLeft !== null && x.searchLeft > 0)
    parts.push(
      p.certified
        ? `its own search ${x.stopped ? 'was stopped' : 'reached its time limit'}; a later search proved it best`
        : `${x.stopped ? 'stopped' : 'time limit reached'} with ${(x.searchLeft * 100).toFixed(1)} % of the possible groups not yet ruled out`,
    );
  if (p.elapsedMs !== null) parts.push(`computed in ${formatDuration(p.elapsedMs)}`);
  return parts.join(' · ') + '.';
}

/**
 * Warnings that the run making the plan was cut short (its search stopped or reached the time
 * limit, or widening or swap polish did): history once the plan is proven best.
 */
const CUT_SHORT: ReadonlySet<PlanWarningCode> = new Set<PlanWarningCode>([
  'search-stopped',
  'search-time-limit',
  'widening-time-limit',
  'swap-time-limit',
]);

/** Said instead of the cut-short warnings of a plan proven best since. */
export const CUT_SHORT_SINCE_PROVEN =
  'This plan was made by a run that stopped before it finished; it has since been proven best, so the stop no longer matters.';

/**
 * The plan's warnings as they read now (their texts). Once the plan is proven best (by a later
 * search of the same problem, or a bound), a warning that its own run was cut short is history,
 * said as such; the other warnings stay. Decided by the warnings' codes, never their words.
 */
export function currentWarnings(p: PlanSummary): string[] {
  const texts = p.warnings.map((w) => w.text);
  if (!p.certified) return texts;
  const rest = p.warnings.filter((w) => !CUT_SHORT.has(w.code));
  if (rest.length === p.warnings.length) return texts;
  return [...rest.map((w) => w.text), CUT_SHORT_SINCE_PROVEN];
}

export function formatDuration(ms: number): string {
  return ms < 1000 ? `${Math.round(ms)} ms` : `${(ms / 1000).toFixed(1)} s`;
}
