/**
 * The room as the engine sees it: people in input order (index 0..n-1) and ties with a
 * positive strength. Undirected ties are stored once; `toCsr` expands them both ways.
 * A directed tie reads "source asks target".
 */
export interface RoomGraph {
  /** Person ids as they appear in the input, in input order (the tie-break order). */
  readonly ids: readonly string[];
  /** Optional display names, same order as ids. */
  readonly labels?: readonly string[];
  /** Optional group of each person (team, table), same order as ids. */
  readonly groups?: readonly (string | null)[];
  readonly directed: boolean;
  readonly ties: readonly RoomTie[];
}

export interface RoomTie {
  readonly source: number;
  readonly target: number;
  readonly strength: number;
}

/** Walk options of engine.md section 1. */
export interface WalkOptions {
  /** Probability of staying put at each step, 0 <= laziness < 1. */
  readonly laziness?: number;
  /** Probability of asking a uniformly random person, 0 <= mixing < 1. */
  readonly mixing?: number;
}

/** Compressed sparse rows of the out-strengths: row i lists whom i may ask, and how strongly. */
export interface Csr {
  readonly n: number;
  readonly rowStart: Int32Array; // length n + 1
  readonly col: Int32Array;
  readonly weight: Float64Array;
  /** Sum of out-strengths per person. */
  readonly outStrength: Float64Array;
}

/** Builds the CSR of the walk's out-strengths; parallel ties are summed. */
export function toCsr(graph: RoomGraph): Csr {
  const n = graph.ids.length;
  const rows: Map<number, number>[] = Array.from({ length: n }, () => new Map<number, number>());
  const add = (i: number, j: number, w: number) => rows[i].set(j, (rows[i].get(j) ?? 0) + w);
  for (const t of graph.ties) {
    add(t.source, t.target, t.strength);
    if (!graph.directed) add(t.target, t.source, t.strength);
  }
  const rowStart = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) rowStart[i + 1] = rowStart[i] + rows[i].size;
  const m = rowStart[n];
  const col = new Int32Array(m);
  const weight = new Float64Array(m);
  const outStrength = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let p = rowStart[i];
    for (const [j, w] of [...rows[i].entries()].sort((a, b) => a[0] - b[0])) {
      col[p] = j;
      weight[p] = w;
      outStrength[i] += w;
      p++;
    }
  }
  return { n, rowStart, col, weight, outStrength };
}
