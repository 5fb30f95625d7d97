/**
 * Room summary: counts, density, connected parts, isolated people, groups the message cannot
 * enter or leave (from the engine's closed-class analysis), and a first hint: the best single
 * starter and the room average it gives. The hint uses dense greedy up to HINT_DENSE_MAX people
 * and, above, the sparse exact greedy (undirected rooms) or lazy greedy (directed ones), so no
 * n x n matrix is built for a large room (a 3,000-person ring with chords: 0.6 s, measured).
 * It runs in the plan worker pool (`SummaryTask`), never on the request thread.
 */
import { classStructure, isEngineError, plan, prepareRoom, type RoomGraph } from '../../shared/engine/index';
import type { PersonRefDto, RoomGroupProblem, RoomHint, RoomSummary } from '../../shared/api/rooms';
import { firstOf, itemAt } from '../../shared/checked';
import type { LoadedRoomGraph } from './access';

const HINT_DENSE_MAX = 400;

/** The summary as a task of the plan worker pool (server/jobs/plan-worker.ts). */
export interface SummaryTask {
  kind: 'summary';
  loaded: LoadedRoomGraph;
}
const NAMED = 12;

/** Connected parts ignoring direction (union-find). */
function connectedParts(graph: RoomGraph): number {
  const parent = Int32Array.from({ length: graph.ids.length }, (_, i) => i);
  const up = (i: number) => itemAt(parent, i, 'union-find parent');
  const find = (i: number): number => {
    while (up(i) !== i) i = parent[i] = up(up(i));
    return i;
  };
  let parts = graph.ids.length;
  for (const t of graph.ties) {
    const a = find(t.source);
    const b = find(t.target);
    if (a !== b) {
      parent[a] = b;
      parts--;
    }
  }
  return parts;
}

export function summarize(loaded: LoadedRoomGraph): RoomSummary {
  const { graph, personIds, names, settings, version } = loaded;
  const n = graph.ids.length;
  const m = graph.ties.length;
  const ref = (i: number): PersonRefDto => ({ id: itemAt(personIds, i, 'person id'), name: itemAt(names, i, 'person name') });
  const groups = new Set(graph.groups?.filter((g) => g !== null)).size;
  const possible = settings.directed ? n * (n - 1) : (n * (n - 1)) / 2;
  const base: RoomSummary = {
    version,
    people: n,
    ties: m,
    groups,
    density: possible > 0 ? m / possible : 0,
    connectedParts: connectedParts(graph),
    isolated: [],
    problems: [],
    minStarters: n === 0 ? 0 : 1,
    hint: null,
    notes: [],
  };
  if (n === 0) {
    base.notes.push('The room is empty: add people and the ties between them.');
    return base;
  }
  const touched = new Uint8Array(n);
  for (const t of graph.ties) touched[t.source] = touched[t.target] = 1;
  for (let i = 0; i < n; i++) if (!touched[i]) base.isolated.push(ref(i));

  // The structure of the ties alone: background mixing joins everything, but slowly.
  const tiesOnly = prepareRoom(graph, { laziness: settings.laziness, mixing: 0 });
  const structure = classStructure(tiesOnly);
  const closed = structure.closedClasses;
  base.minStarters = settings.mixing > 0 ? 1 : closed.length;
  const describe = (members: number[]) => members.slice(0, NAMED).map(ref);
  if (closed.length > 1) base.problems.push(...closedGroupProblems(closed, touched, settings.directed, names, describe));
  if (settings.directed) base.problems.push(...cannotLeave(tiesOnly.csr.rowStart, tiesOnly.csr.col, structure, n, names, describe));
  if (base.isolated.length > 0) {
    base.notes.push(
      `${base.isolated.length} ${base.isolated.length === 1 ? 'person has' : 'people have'} no ties: they hear only if briefed${settings.mixing > 0 ? ' or by background mixing' : ''}. Add their ties, or brief them.`,
    );
  }
  if (settings.mixing > 0 && closed.length > 1) {
    base.notes.push('Background mixing lets the message reach every group in the end, but the groups above are reached slowly.');
  }
  base.hint = hint(loaded, base, base.notes);
  return base;
}

/** Each closed group of a room with several (an isolated person is listed as isolated instead). */
function closedGroupProblems(
  closed: number[][],
  touched: Uint8Array,
  directed: boolean,
  names: readonly string[],
  describe: (members: number[]) => PersonRefDto[],
): RoomGroupProblem[] {
  const problems: RoomGroupProblem[] = [];
  for (const members of closed) {
    const first = firstOf(members, 'closed group');
    if (members.length === 1 && !touched[first]) continue;
    problems.push(
      directed
        ? {
            kind: 'cannot-enter',
            people: describe(members),
            size: members.length,
            message:
              `${members.length === 1 ? `${itemAt(names, first, 'person name')} asks` : `These ${members.length} people ask only each other`}: ` +
              'the message gets in only if one of them is briefed. Brief one of them, or add a tie from one of them to someone outside.',
          }
        : {
            kind: 'separate-part',
            people: describe(members),
            size: members.length,
            message: `These ${members.length} people have no tie to the rest of the room: brief one of them as well, or add a tie that connects them.`,
          },
    );
  }
  return problems;
}

/** Directed rooms: components nobody outside asks. A starter there reaches only them. */
function cannotLeave(
  rowStart: Int32Array,
  col: Int32Array,
  structure: ReturnType<typeof classStructure>,
  n: number,
  names: string[],
  describe: (m: number[]) => PersonRefDto[],
): RoomGroupProblem[] {
  const componentOf = (i: number) => itemAt(structure.component, i, 'component');
  const asked = new Uint8Array(structure.componentCount);
  for (let i = 0; i < n; i++) {
    const own = componentOf(i);
    const end = itemAt(rowStart, i + 1, 'tie row end');
    for (let e = itemAt(rowStart, i, 'tie row start'); e < end; e++) {
      const c = componentOf(itemAt(col, e, 'tie target'));
      if (c !== own) asked[c] = 1;
    }
  }
  const members = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const c = componentOf(i);
    if (asked[c] || itemAt(structure.closedOf, i, 'closed group') >= 0) continue; // closed groups are reported above
    const list = members.get(c);
    if (list) list.push(i);
    else members.set(c, [i]);
  }
  if (members.size === 0) return [];
  const groups = [...members.values()];
  const singles = groups.filter((g) => g.length === 1).flat();
  const out: RoomGroupProblem[] = groups
    .filter((g) => g.length > 1)
    .map((g) => ({
      kind: 'cannot-leave' as const,
      people: describe(g),
      size: g.length,
      message: `Nobody outside these ${g.length} people asks them: a starter among them reaches only them. Brief someone others ask, or add ties towards them.`,
    }));
  if (singles.length > 0) {
    out.push({
      kind: 'cannot-leave',
      people: describe(singles),
      size: singles.length,
      message: `Nobody asks ${singles.length === 1 ? itemAt(names, firstOf(singles, 'single'), 'person name') : `these ${singles.length} people`}: briefing ${singles.length === 1 ? 'them' : 'one of them'} reaches only ${singles.length === 1 ? 'them' : 'that person'}. Choose starters others ask.`,
    });
  }
  return out;
}

function hint(loaded: LoadedRoomGraph, summary: RoomSummary, notes: string[]): RoomHint | null {
  const { graph, personIds, names, settings } = loaded;
  const n = graph.ids.length;
  if (n < 2 || graph.ties.length === 0) {
    notes.push('No starter hint yet: the room needs at least two people and one tie.');
    return null;
  }
  if (summary.minStarters > 1) {
    notes.push(
      `No single starter can reach everyone: brief at least ${summary.minStarters} people, one in each closed group (plan with k >= ${summary.minStarters}).`,
    );
    return null;
  }
  try {
    const room = prepareRoom(graph, { laziness: settings.laziness, mixing: settings.mixing });
    const best = plan(room, { k: 1, method: 'greedy', denseLimit: HINT_DENSE_MAX });
    const s = firstOf(best.starters, 'hint starter');
    const name = itemAt(names, s, 'person name');
    const minutes = best.average * settings.minutesPerHop;
    return {
      starter: { id: itemAt(personIds, s, 'person id'), name },
      average: best.average,
      minutes,
      message:
        `Briefing only ${name} gives a room average of ${best.average.toFixed(1)} expected hops to hear (about ${Math.round(minutes)} minutes). ` +
        'This says where they sit in the map, not what they are worth. Plan with more starters to bring it down.',
    };
  } catch (e) {
    if (isEngineError(e)) {
      notes.push(`No starter hint: ${e.message}`);
      return null;
    }
    throw e;
  }
}
