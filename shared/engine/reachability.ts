/**
 * Reachability analysis: strongly connected components (Tarjan 1972, iterative), the
 * closed classes of the walk (components no walk leaves), and for a starter set the
 * people whose expected hops to hear are infinite, each with the reason. O(n + m).
 *
 * With background mixing b > 0 the whole room is one closed class and everyone is reachable.
 */
import type { PreparedRoom } from './room';

export interface UnreachablePerson {
  readonly index: number;
  readonly id: string;
  /** `no-path`: no chain of ties leads from this person to any starter.
   *  `may-get-stuck`: a starter can be reached, but the question may drift into a part of the room with no way to a starter. */
  readonly reason: 'no-path' | 'may-get-stuck';
  readonly message: string;
}

export interface ClassStructure {
  /** Component index of each person. */
  readonly component: Int32Array;
  readonly componentCount: number;
  /** Closed classes (members in input order), ordered by their first member. */
  readonly closedClasses: number[][];
  /** Closed-class number of each person, or -1 for transient people. */
  readonly closedOf: Int32Array;
}

function successors(room: PreparedRoom): { start: Int32Array; adj: Int32Array } {
  const { csr } = room;
  return { start: csr.rowStart, adj: csr.col };
}

/** Strongly connected components and closed classes of the walk (ties only; mixing joins everything). */
export function classStructure(room: PreparedRoom): ClassStructure {
  const n = room.n;
  if (room.mixing > 0) {
    const all = Array.from({ length: n }, (_, i) => i);
    return { component: new Int32Array(n), componentCount: 1, closedClasses: [all], closedOf: new Int32Array(n) };
  }
  const { start, adj } = successors(room);
  const component = new Int32Array(n).fill(-1);
  // One loop per function (see linalg/sparse-ldl.ts on compiled code).
  const count = strongComponents(start, adj, component);
  const leaves = new Uint8Array(count);
  markLeaving(start, adj, component, leaves);
  const closedOf = new Int32Array(n).fill(-1);
  const closedClasses = closedMembers(component, leaves, closedOf);
  return { component, componentCount: count, closedClasses, closedOf };
}

/** Tarjan's components (component[i] set for everyone); returns their number. */
// Iterative (explicit stack): no recursion for rooms of a million people.
function strongComponents(start: Int32Array, adj: Int32Array, component: Int32Array): number {
  const n = component.length;
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const onStack = new Uint8Array(n);
  const stack = new Int32Array(n);
  let sp = 0;
  let count = 0;
  let counter = 0;
  const callNode = new Int32Array(n);
  const callEdge = new Int32Array(n);
  for (let root = 0; root < n; root++) {
    if (index[root] >= 0) continue;
    let depth = 0;
    callNode[0] = root;
    callEdge[0] = start[root];
    index[root] = low[root] = counter++;
    stack[sp++] = root;
    onStack[root] = 1;
    while (depth >= 0) {
      const v = callNode[depth];
      if (callEdge[depth] < start[v + 1]) {
        const w = adj[callEdge[depth]++];
        if (index[w] < 0) {
          index[w] = low[w] = counter++;
          stack[sp++] = w;
          onStack[w] = 1;
          depth++;
          callNode[depth] = w;
          callEdge[depth] = start[w];
        } else if (onStack[w] && index[w] < low[v]) low[v] = index[w];
      } else {
        if (low[v] === index[v]) {
          let w: number;
          do {
            w = stack[--sp];
            onStack[w] = 0;
            component[w] = count;
          } while (w !== v);
          count++;
        }
        depth--;
        if (depth >= 0) {
          const u = callNode[depth];
          if (low[v] < low[u]) low[u] = low[v];
        }
      }
    }
  }
  return count;
}

/** leaves[c] = 1 for every component with a tie out of it. */
function markLeaving(start: Int32Array, adj: Int32Array, component: Int32Array, leaves: Uint8Array): void {
  for (let i = 0; i < component.length; i++)
    for (let e = start[i]; e < start[i + 1]; e++) if (component[adj[e]] !== component[i]) leaves[component[i]] = 1;
}

/** Members of the closed components (input order), numbered by their first member; closedOf set for them. */
function closedMembers(component: Int32Array, leaves: Uint8Array, closedOf: Int32Array): number[][] {
  const classOfComp = new Int32Array(leaves.length).fill(-1);
  const closedClasses: number[][] = [];
  for (let i = 0; i < component.length; i++) {
    const c = component[i];
    if (leaves[c]) continue;
    if (classOfComp[c] < 0) {
      classOfComp[c] = closedClasses.length;
      closedClasses.push([]);
    }
    closedClasses[classOfComp[c]].push(i);
    closedOf[i] = classOfComp[c];
  }
  return closedClasses;
}

function predecessors(room: PreparedRoom): { start: Int32Array; adj: Int32Array } {
  const { n, csr } = room;
  const start = new Int32Array(n + 1);
  for (let e = 0; e < csr.col.length; e++) start[csr.col[e] + 1]++;
  for (let i = 0; i < n; i++) start[i + 1] += start[i];
  const fill = start.slice(0, n);
  const adj = new Int32Array(csr.col.length);
  for (let i = 0; i < n; i++) for (let e = csr.rowStart[i]; e < csr.rowStart[i + 1]; e++) adj[fill[csr.col[e]]++] = i;
  return { start, adj };
}

/** People with infinite expected hops to hear for this starter set, each with its reason. */
export function unreachablePeople(room: PreparedRoom, starters: readonly number[]): UnreachablePerson[] {
  const n = room.n;
  if (room.mixing > 0 && starters.length > 0) return [];
  const isStarter = new Uint8Array(n);
  for (const s of starters) isStarter[s] = 1;
  const pred = predecessors(room);
  const queue = new Int32Array(n);
  // People with a chain of ties to a starter.
  const reaches = new Uint8Array(n);
  let qt = 0;
  for (const s of starters)
    if (!reaches[s]) {
      reaches[s] = 1;
      queue[qt++] = s;
    }
  markBackwards(pred, reaches, queue, qt, null);
  // People who can get to a dead end (a person with no way to a starter) without passing a starter.
  const stuck = new Uint8Array(n);
  qt = 0;
  for (let i = 0; i < n; i++)
    if (!reaches[i]) {
      stuck[i] = 1;
      queue[qt++] = i;
    }
  markBackwards(pred, stuck, queue, qt, isStarter);
  const out: UnreachablePerson[] = [];
  for (let i = 0; i < n; i++) if (stuck[i]) out.push(unreachableReason(room, i, reaches[i] === 1, starters.length));
  return out;
}

/**
 * Breadth-first along ties taken backwards from the `count` people already in `queue` (and marked):
 * marks everyone who asks a marked person, except the people `stop` marks, who are neither marked nor passed.
 */
function markBackwards(
  pred: { start: Int32Array; adj: Int32Array },
  mark: Uint8Array,
  queue: Int32Array,
  count: number,
  stop: Uint8Array | null,
): void {
  let qh = 0;
  let qt = count;
  while (qh < qt) {
    const v = queue[qh++];
    for (let e = pred.start[v]; e < pred.start[v + 1]; e++) {
      const u = pred.adj[e];
      if (!mark[u] && !(stop !== null && stop[u])) {
        mark[u] = 1;
        queue[qt++] = u;
      }
    }
  }
}

function unreachableReason(room: PreparedRoom, i: number, reachesStarter: boolean, starterCount: number): UnreachablePerson {
  const id = room.ids[i];
  if (reachesStarter)
    return {
      index: i,
      id,
      reason: 'may-get-stuck',
      message: `${id} can reach a starter, but the question may drift into a group of people with no way to any starter: add a starter in that group.`,
    };
  const message =
    starterCount === 0
      ? `${id} cannot be reached: no starter is chosen.`
      : !room.directed
        ? `${id} is in a part of the room with no tie to any starter (the room is disconnected): add a starter there or connect it.`
        : `${id} has no chain of ties leading to any starter: add a starter in the group they ask, or add a tie.`;
  return { index: i, id, reason: 'no-path', message };
}
