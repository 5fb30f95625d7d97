import { strengthOf, type BuildMode, type SurveyLevel } from '../../shared/api/workshops';

/**
 * Turns survey nominations ("I ask them", with how often) into the room's ties. Pure.
 *   directed     - one tie per nomination, source = the person who answered.
 *   reciprocated - an undirected tie only where both named each other; strength is the mean
 *                  of the two levels.
 *   either       - an undirected tie where at least one named the other; strength is the mean
 *                  when both did, else the one level given.
 */
export interface NominationEdge {
  from: number;
  to: number;
  level: SurveyLevel;
}

export interface BuiltTie {
  source: number;
  target: number;
  strength: number;
}

export function tiesFromAnswers(edges: readonly NominationEdge[], mode: BuildMode): BuiltTie[] {
  if (mode === 'directed')
    return edges.filter((e) => e.from !== e.to).map((e) => ({ source: e.from, target: e.to, strength: strengthOf(e.level) }));
  const pairs = new Map<string, { a: number; b: number; ab?: number; ba?: number }>();
  for (const e of edges) {
    if (e.from === e.to) continue;
    const [a, b] = e.from < e.to ? [e.from, e.to] : [e.to, e.from];
    const key = `${a}:${b}`;
    const pair = pairs.get(key) ?? { a, b };
    if (e.from === a) pair.ab = strengthOf(e.level);
    else pair.ba = strengthOf(e.level);
    pairs.set(key, pair);
  }
  const out: BuiltTie[] = [];
  for (const p of pairs.values()) {
    const both = p.ab !== undefined && p.ba !== undefined;
    if (mode === 'reciprocated' && !both) continue;
    const strength = both ? (p.ab! + p.ba!) / 2 : (p.ab ?? p.ba)!;
    out.push({ source: p.a, target: p.b, strength });
  }
  return out.sort((x, y) => x.source - y.source || x.target - y.target);
}

/** What a missing answer means for the map, per person who did not answer. */
export function missingMeaning(nominatedBy: number, mode: BuildMode): string {
  if (mode === 'directed') {
    return nominatedBy > 0
      ? `Named by ${nominatedBy}, but with no answer of their own they have no one to ask: in a directed map the model treats them as waiting until someone tells them, so their expected hops cannot be computed.`
      : 'Nobody named them and they did not answer: they are cut off in the map, so the message cannot reach them in the model.';
  }
  if (mode === 'reciprocated') {
    return 'With only mutual ties kept, a person who did not answer has no ties at all: they are cut off in the map and the message cannot reach them in the model.';
  }
  return nominatedBy > 0
    ? `Known only through the ${nominatedBy} ${nominatedBy === 1 ? 'person who named them' : 'people who named them'}; the people they would have named are missing, so their place in the map may be understated.`
    : 'Nobody named them and they did not answer: they are cut off in the map, so the message cannot reach them in the model.';
}
