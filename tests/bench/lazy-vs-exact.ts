/**
 * Does the iterative path (lazy greedy on CG) give the exact greedy's picks? Runs both on the
 * same small-world room (`tsx tests/bench/lazy-vs-exact.ts N K [CHECKS]`, CHECKS = lazyChecks,
 * default 3) and prints the first differing pick, the starters both share, both totals and the times.
 */
import { plan } from '../../shared/engine/index';
import { roomFromEdges, smallWorldEdges } from './large-rooms';

const [nText, kText, checksText] = process.argv.slice(2);
const n = Number(nText);
const k = Number(kText);
const room = roomFromEdges(smallWorldEdges(n, 3, 0.1, 5));
let t = performance.now();
const exact = plan(room, { k, method: 'greedy', sparseFrom: 2 });
const exactMs = performance.now() - t;
t = performance.now();
const lazy = plan(room, { k, method: 'lazy-greedy', lazyChecks: Number(checksText ?? 3) });
const lazyMs = performance.now() - t;
const firstDiff = exact.starters.findIndex((p, i) => lazy.starters[i] !== p);
const common = exact.starters.filter((p) => lazy.starters.includes(p)).length;
console.log(
  JSON.stringify({
    n,
    k,
    exactPath: exact.solverPath,
    exactMs: Math.round(exactMs),
    lazyMs: Math.round(lazyMs),
    firstDifferentPick: firstDiff,
    sharedStarters: common,
    exactTotal: exact.total,
    lazyTotal: lazy.total,
    lazyAboveExact: lazy.total / exact.total - 1,
    lazyNotes: lazy.notes,
  }),
);
