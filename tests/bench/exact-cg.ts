/**
 * The exact greedy on CG against the exact greedy on the sparse factor, same room, one process:
 *   npx tsx tests/bench/exact-cg.ts N K [small-world|grid] [skip]
 * prints each path's time, the totals and whether the picks agree; `skip` runs the CG path only
 * (for rooms whose factor does not fit). docs/sparse-greedy.md section 8 quotes its figures.
 */
import { performance } from 'node:perf_hooks';
import { plan } from '../../shared/engine/index';
import { gridEdges, roomFromEdges, smallWorldEdges } from './large-rooms';

const n = Number(process.argv[2] ?? 3000);
const k = Number(process.argv[3] ?? 50);
const kind = process.argv[4] ?? 'small-world';
const room = roomFromEdges(kind === 'grid' ? gridEdges(Math.round(Math.sqrt(n)), 5) : smallWorldEdges(n, 3, 0.1, 5));
let t = performance.now();
const cg = plan(room, { k, method: 'greedy', maxFill: 1, denseLimit: 1 });
console.log(`exact greedy on CG: ${(performance.now() - t).toFixed(0)} ms, total ${cg.total}`);
console.log(`  ${cg.notes.at(-1)}`);
if (process.argv[5] !== 'skip') {
  t = performance.now();
  const f = plan(room, { k, method: 'greedy' });
  console.log(`exact greedy, default path (${f.solverPath}): ${(performance.now() - t).toFixed(0)} ms, total ${f.total}`);
  const same = f.starters.join(',') === cg.starters.join(',');
  console.log(`same picks: ${same}; totals ${(Math.abs(f.total - cg.total) / f.total).toExponential(1)} apart (relative)`);
}
