/**
 * One case of the sparse benchmark in a fresh process, so its peak memory is its own:
 * `tsx tests/bench/bench-sparse-case.ts KIND N K [EDGEFILE]` with KIND grid | small-world | screen-*.
 * Prints one JSON line: wall ms, process CPU ms, peak resident MB, path, fill-reducing order, fill, total, starters.
 * With EDGEFILE the room is also written there for the Python peers.
 */
import { writeFileSync } from 'node:fs';
import { plan, type PlanMethodChoice } from '../../shared/engine/index';
import { edgesText, gridEdges, roomFromEdges, smallWorldEdges, type EdgeList } from './large-rooms';

export function benchEdges(kind: string, n: number): EdgeList {
  return kind.endsWith('grid') ? gridEdges(Math.round(Math.sqrt(n)), 5) : smallWorldEdges(n, 3, 0.1, 5);
}

function main(): void {
  const [kind, nText, kText, edgeFile] = process.argv.slice(2);
  const n = Number(nText);
  const k = Number(kText);
  const edges = benchEdges(kind, n);
  if (edgeFile) writeFileSync(edgeFile, edgesText(edges));
  const room = roomFromEdges(edges);
  const method: PlanMethodChoice = kind.startsWith('screen') ? ('screen' as PlanMethodChoice) : 'greedy';
  const runs = Number(process.env.RH_BENCH_RUNS ?? (n <= 500 ? 15 : n <= 3000 ? 3 : 1));
  const walls: { wall: number; cpu: number }[] = [];
  const onProgress = n > 100_000 ? progressLine() : undefined;
  // Warm-up runs (the JIT's first compilations), more for the small rooms that take milliseconds;
  // none above 3,000 people, where one plan takes seconds to minutes.
  let result = n <= 3000 ? plan(room, { k, method }) : null;
  for (let w = n <= 500 ? 5 : 0; w > 0; w--) result = plan(room, { k, method });
  for (let r = 0; r < runs; r++) {
    const c = process.cpuUsage();
    const t = performance.now();
    result = plan(room, { k, method, onProgress });
    const d = process.cpuUsage(c);
    walls.push({ wall: performance.now() - t, cpu: (d.user + d.system) / 1000 });
  }
  walls.sort((a, b) => a.wall - b.wall);
  const mid = walls[Math.floor(walls.length / 2)];
  if (!result || !mid) throw new Error('RH_BENCH_RUNS must be at least 1');
  const out = {
    ms: mid.wall,
    cpuMs: mid.cpu,
    maxRssMb: process.resourceUsage().maxRSS / 1024,
    path: result.solverPath ?? 'dense',
    fill: result.fill ?? null,
    total: result.total,
    lowerBound: result.lowerBound,
    starters: result.starters,
    m: edges.src.length,
    order: result.notes.map((t) => /(minimum-degree|nested-dissection) order/.exec(t)?.[1]).find(Boolean) ?? null,
    evaluated: result.notes.map((t) => /(\d+) evaluated/.exec(t)?.[1]).find(Boolean) ?? null,
  };
  process.stdout.write(JSON.stringify(out) + '\n');
}

/** Progress of one long plan on stderr, at most every 10 s: stage, done / of, minutes so far. */
function progressLine(): (p: { stage: string; done: number; of: number }) => void {
  const t0 = performance.now();
  let last = 0;
  return (p) => {
    const now = performance.now();
    if (now - last < 10_000 && p.done !== p.of) return;
    last = now;
    process.stderr.write(`    ${p.stage} ${p.done} / ${p.of} after ${((now - t0) / 60_000).toFixed(1)} min\n`);
  };
}

main();
