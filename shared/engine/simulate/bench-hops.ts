/**
 * Benchmark rows for simulated cascades (engine.md section 6: >= 50 M hops/s per core,
 * 10 000 cascades on a 300-person room < 1 s). The reference is a plain walker in the same
 * process: seedrandom's xor128 called per draw and a linear scan of the row's strengths
 * (O(degree) per hop instead of the alias table's O(1)). Node only (the two-worker row uses
 * the piscina pool).
 */
import seedrandom from 'seedrandom';
import { toCsr, type RoomGraph, type RoomTie } from '../graph';
import { SimulationPool } from './pool';
import { simulate } from './run-local';

export interface HopsBenchRow {
  readonly case: string;
  readonly n: number;
  readonly m: number;
  /** Starters. */
  readonly k: number;
  /** Median wall time over the repetitions. */
  readonly ms: number;
  /** Reference time for the same number of hops divided by ours (higher is better). */
  readonly ratio: number;
  readonly hopsPerSecond: number;
  readonly note: string;
}

/** A connected random weighted room: a ring plus random ties, from a fixed sequence. */
export function benchRoom(n: number, m: number, seed = 1): RoomGraph {
  let s = seed >>> 0;
  const next = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const seen = new Set<string>();
  const ties: RoomTie[] = [];
  const add = (a: number, b: number) => {
    const key = a < b ? `${a},${b}` : `${b},${a}`;
    if (a === b || seen.has(key)) return;
    seen.add(key);
    ties.push({ source: a, target: b, strength: 0.1 + 2 * next() });
  };
  for (let i = 0; i < n; i++) add(i, (i + 1) % n);
  while (ties.length < m) add(Math.floor(next() * n), Math.floor(next() * n));
  return {
    ids: Array.from({ length: n }, (_, i) => `p${i}`),
    directed: false,
    ties,
  };
}

/** Plain walks: one seedrandom call per draw, linear scan for the weighted choice. Returns hops. */
function referenceWalks(graph: RoomGraph, starters: readonly number[], runs: number): number {
  const csr = toCsr(graph);
  const isStarter = new Uint8Array(csr.n);
  for (const a of starters) isStarter[a] = 1;
  let hops = 0;
  for (let r = 0; r < runs; r++) {
    const rand = seedrandom.xor128(`ref/${r}`);
    for (let i = 0; i < csr.n; i++) {
      let v = i;
      while (!isStarter[v]) {
        let u = rand() * csr.outStrength[v];
        let e = csr.rowStart[v];
        const end = csr.rowStart[v + 1] - 1;
        while (e < end && u >= csr.weight[e]) u -= csr.weight[e++];
        v = csr.col[e];
        hops++;
      }
    }
  }
  return hops;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time<T>(f: () => T): { ms: number; value: T } {
  const t = performance.now();
  const value = f();
  return { ms: performance.now() - t, value };
}

/** Rows: a 300-person room with 5 starters (long walks) and with 30 starters, one thread and two workers. */
export async function benchSimulatedHops(repeats = 3): Promise<HopsBenchRow[]> {
  const n = 300;
  const graph = benchRoom(n, 1500);
  const m = graph.ties.length;
  const runs = 10_000;
  simulate(graph, [0], 200, 'warm-up');
  referenceWalks(graph, [0, 1, 2], 20);
  const rows: HopsBenchRow[] = [];
  const started = performance.now();
  const pool = new SimulationPool(2);
  await pool.simulate(graph, [0, 150], 20, 'warm-up');
  const startMs = performance.now() - started;
  try {
    for (const k of [5, 30]) {
      const starters = Array.from({ length: k }, (_, q) => Math.floor((q * n) / k));
      const local = Array.from({ length: repeats }, () => time(() => simulate(graph, starters, runs, 'bench')));
      const ms1 = median(local.map((x) => x.ms));
      const hops = local[0].value.hops;
      const ref = Array.from({ length: repeats }, () => time(() => referenceWalks(graph, starters, Math.ceil(runs / 20))));
      const refMsPerHop = median(ref.map((x) => x.ms / x.value));
      const detail = `${runs} cascades, ${(hops / 1e6).toFixed(1)} M hops; plain walker ${(1 / refMsPerHop / 1000).toFixed(1)} M hops/s`;
      rows.push({
        case: 'simulated cascades, 1 thread',
        n,
        m,
        k,
        ms: ms1,
        ratio: (refMsPerHop * hops) / ms1,
        hopsPerSecond: hops / (ms1 / 1000),
        note: detail,
      });
      const pooled: number[] = [];
      for (let q = 0; q < repeats; q++) {
        const t = performance.now();
        await pool.simulate(graph, starters, runs, 'bench');
        pooled.push(performance.now() - t);
      }
      const ms2 = median(pooled);
      rows.push({
        case: 'simulated cascades, 2 workers',
        n,
        m,
        k,
        ms: ms2,
        ratio: (refMsPerHop * hops) / ms2,
        hopsPerSecond: hops / (ms2 / 1000),
        note: `${detail}; warm pool (starting it took ${Math.round(startMs)} ms)`,
      });
    }
  } finally {
    await pool.close();
  }
  return rows;
}
