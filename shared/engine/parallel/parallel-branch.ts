/**
 * Branch and bound on several worker threads: the main thread prepares the pieces (roots split
 * into two-starter pieces, sorted by bound, plan-exhaustive.ts), the workers take them from a
 * shared counter and share the best total (branch-shared.ts), the main thread reports progress
 * every 100 ms and raises the stop flag at the time limit or on cancel. The incumbent is the
 * heuristic plan, so the answer is never worse than it. The first pieces are searched on this
 * thread for up to SOLO_MS while the workers start, so small searches never wait for them. Node only (piscina).
 */
import { Piscina } from 'piscina';
import { BranchSearch, resumeFrom, type ExhaustiveOutcome } from '../plan-exhaustive';
import type { PlanContext } from '../plan-context';
import type { Piece } from '../plan-resume';
import type { AbsorbingState } from '../dense-state';
import { shouldStop } from '../plan-search-meter';
import { SharedSearchState } from './branch-shared';
import type { BranchWorkerData, BranchWorkerResult } from './branch-worker';

function workerFile(): URL {
  const here = import.meta.url;
  return new URL(here.endsWith('.ts') ? './branch-worker.ts' : './branch-worker.js', here);
}

/** The first pieces are searched on the calling thread for this long (measured: a worker starts in 0.1-0.5 s). */
const SOLO_MS = 600;
const SLICE_MS = 50;

let poolCache: { pool: Piscina; threads: number } | undefined;

/** One pool per process, reused across searches (idle workers are unref'd and leave after a minute). */
function branchPool(threads: number): Piscina {
  if (!poolCache || poolCache.threads !== threads) {
    void poolCache?.pool.destroy();
    poolCache = {
      pool: new Piscina({ filename: workerFile().href, minThreads: 0, maxThreads: threads, idleTimeout: 60_000 }),
      threads,
    };
  }
  return poolCache.pool;
}

export async function exhaustiveParallel(
  ctx: PlanContext,
  start: AbsorbingState,
  threads: number,
  soloMs = SOLO_MS,
): Promise<ExhaustiveOutcome> {
  const { saved, incumbent: first } = resumeFrom(ctx, start);
  const main = new BranchSearch(ctx, first);
  const items = main.start(saved);
  const t0 = performance.now();
  const pool = branchPool(threads);
  // The worker threads start (and load their code) while this thread searches the first pieces
  // in slices, returning to the event loop between slices so the pool can hand them work.
  const warm = soloMs > 0 ? Promise.all(Array.from({ length: threads }, () => pool.run({ warm: true }))).catch(() => undefined) : null;
  const next = await searchSolo(main, items, t0, soloMs);
  if (next >= items.length || main.halted)
    return main.outcome(main.saved(saved, { work: items, untakenFrom: next, partial: main.partial ? [main.partial] : [] }));
  await warm;
  const solo = main.threadResult();
  const space = main.space();
  const state = SharedSearchState.create(threads, solo.rawTotal, next);
  const incumbent = { starters: [...solo.starters], rawTotal: solo.rawTotal, scale: start.scale };
  const watch = new WorkerWatch(ctx, state, items, threads, main.closedSets());
  const nodesBefore = main.priorNodes() + solo.nodes;
  const timer = setInterval(() => watch.report(start.scale, space, nodesBefore), 100);
  let results: BranchWorkerResult[];
  try {
    const base = workerData(ctx, items, incumbent, state, threads);
    results = (await Promise.all(Array.from({ length: threads }, (_, slot) => pool.run({ ...base, slot })))) as BranchWorkerResult[];
  } finally {
    clearInterval(timer);
  }
  const stopped = shouldStop(ctx);
  const halted = results.some((r) => r.halted);
  let best = { starters: incumbent.starters, rawTotal: incumbent.rawTotal };
  for (const r of results) if (r.rawTotal < best.rawTotal - 1e-12 * Math.abs(best.rawTotal)) best = r;
  let lb = best.rawTotal;
  if (halted) {
    lb = watch.lowerRaw();
    for (const r of results) lb = Math.min(lb, r.pendingRaw);
  }
  const { closed } = watch.status();
  const nodes = solo.nodes + results.reduce((t, r) => t + r.nodes, 0);
  const resume = main.saved(
    saved,
    { work: items, untakenFrom: Math.min(items.length, state.taken()), partial: results.flatMap((r) => (r.partial ? [r.partial] : [])) },
    { closed, nodes, best: best.starters, bestRaw: best.rawTotal, lowerRaw: Math.max(ctx.n - ctx.k, Math.min(lb, best.rawTotal)) },
  );
  return {
    state: { starters: best.starters, total: best.rawTotal * start.scale },
    complete: !halted,
    stopped: halted && stopped,
    nodes,
    lowerBound: resume.lowerRaw * start.scale,
    searchLeft: halted ? Math.min(1, Math.max(0, 1 - closed / space)) : 0,
    resume,
    resumed: resume.runs > 1,
  };
}

/** Searches pieces on this thread in slices of SLICE_MS until `soloMs` after `t0`; returns the first piece not taken. */
async function searchSolo(main: BranchSearch, items: Piece[], t0: number, soloMs: number): Promise<number> {
  let next = 0;
  while (next < items.length && !main.halted && performance.now() - t0 < soloMs) {
    const sliceEnd = Math.min(t0 + soloMs, performance.now() + SLICE_MS);
    main.searchItems(items, () => (next < items.length && performance.now() < sliceEnd ? next++ : -1));
    await new Promise((done) => setImmediate(done));
  }
  return next;
}

function workerData(
  ctx: PlanContext,
  items: Piece[],
  incumbent: BranchWorkerData['incumbent'],
  state: SharedSearchState,
  threads: number,
): Omit<BranchWorkerData, 'slot'> {
  return {
    room: ctx.room,
    k: ctx.k,
    mustInclude: ctx.mustInclude,
    exclude: ctx.exclude,
    ergodic: ctx.ergodic(),
    items,
    incumbent,
    timeLimitMs: Math.max(1, ctx.deadline - performance.now()),
    ...(ctx.options.maxNodes !== undefined ? { maxNodes: ctx.options.maxNodes } : {}),
    sab: state.sab,
    threads,
  };
}

/** The main thread's view of the workers while they search: their bound and counts, the stop flag, progress. */
class WorkerWatch {
  constructor(
    private readonly ctx: PlanContext,
    private readonly state: SharedSearchState,
    private readonly items: Piece[],
    private readonly threads: number,
    private readonly preClosed: number,
  ) {}

  /** The smallest raw total any plan not yet ruled out could have. */
  lowerRaw(): number {
    const { state, items, threads } = this;
    let lb = state.best();
    const from = Math.max(0, Math.min(items.length, state.taken()) - threads);
    if (from < items.length) lb = Math.min(lb, items[from].bound);
    for (let t = 0; t < threads; t++) lb = Math.min(lb, state.slot(t)[0]);
    return Math.max(this.ctx.n - this.ctx.k, lb);
  }

  status(): { closed: number; nodes: number } {
    let closed = this.preClosed;
    let nodes = 0;
    for (let t = 0; t < this.threads; t++) {
      closed += this.state.slot(t)[1];
      nodes += this.state.slot(t)[2];
    }
    return { closed, nodes };
  }

  /** Raises the stop flag when the search is cancelled or out of time, and reports progress. */
  report(scale: number, space: number, nodesBefore: number): void {
    const { ctx, state } = this;
    if (shouldStop(ctx) || performance.now() > ctx.deadline) state.requestStop();
    const { closed, nodes } = this.status();
    const best = state.best() * scale;
    const lb = Math.min(best, this.lowerRaw() * scale);
    ctx.options.onProgress?.({
      stage: 'exhaustive',
      done: Math.round((1000 * closed) / space),
      of: 1000,
      fraction: Math.min(1, closed / space),
      bestTotal: best,
      lowerBound: lb,
      gap: best > 0 ? (best - lb) / best : 0,
      nodes: nodesBefore + nodes,
    });
  }
}
