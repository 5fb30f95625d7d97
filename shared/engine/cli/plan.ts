/** `plan`: choose k starters (shared/engine/plan.ts) with total, rank, proven bound and certification. */
import { availableParallelism } from 'node:os';
import type { NoShowReport, PlanMethodChoice, PlanProgress } from '../plan-types';
import { CliError, integerFlag, numberFlag, type Flags } from './args';
import { clipId, ID_LIST_HELP, ms, ROOM_FLAGS, ROOM_HELP, WALK_FLAGS, WALK_HELP, walkOptions, warningNotes, type Command } from './command';
import { loadRoom } from './load-room';
import { idsFromFlags } from './read-file';
import type { RoomGraph } from '../graph';

export const planCommand: Command = {
  name: 'plan',
  summary: 'choose k starters so that people hear as soon as possible',
  flags: {
    ...ROOM_FLAGS,
    k: { required: true },
    method: {},
    nu: {},
    'time-limit': {},
    'no-show': {},
    include: {},
    exclude: {},
    'include-file': {},
    'exclude-file': {},
    ...WALK_FLAGS,
  },
  help: `Usage: npm run -s cli -- plan --graph FILE --k K --method greedy|widened|swap|exhaustive|auto|screen
                             [--nu X] [--time-limit SECONDS] [--laziness A] [--mixing B]
                             [--include IDS | --include-file F] [--exclude IDS | --exclude-file F] [--no-show P]

Prints {"method", "k", "starters": [ids in the order chosen], "total", "average", "rank",
"lowerBound", "certified", "elapsedMs", "gap", "coverSize", "solverPath", "notes", "warnings"}.
"total" is the sum of expected hops to hear over the people who are not starters, "average"
is total / (n - k), "rank" the quality rank (0 = as good as the worst single starter, 1 = the
cover bound), "lowerBound" a proven lower bound on the best total of any plan of size k
(under the same constraints), "certified" true when "total" is proven to be the best,
"relativeGap" (total - lowerBound) / total, "searchLeft" the share of plans the search had not
ruled out when it stopped (0 when certified), "nodes" the search steps, "bestSingle" the best
single starter {"person", "total"}, "fewestForOneHop" the fewest starters after whom everyone
hears in one hop, "fewestToReachAll" the fewest starters with whom everyone can hear at all.
"notes" say how the plan was made; "warnings" what limited it, each {"code", "text"}: the
code one of search-stopped, search-time-limit (the branch and bound was stopped or reached its
time limit), widening-time-limit, swap-time-limit, over-dense-limit (a greedy ran instead of
the method asked for), no-show-not-exhaustive; the text says it in words with its numbers.
With --no-show P: "noShow": P, "expectedTotal" (expected total given at least one starter
shows; absent starters must hear too), "nobodyChance" P^k, "worstAbsence" {"person", "total"}
(the starter whose absence costs most; total null when k = 1), "standIns" [{"starter",
"person", "total"}], "expectedExact" (false above 12 starters: sampled, "expectedError" is the
standard error).

${ROOM_HELP}
  --k K               number of starters, 1 <= K < number of people
  --method M          greedy, widened (widened greedy), swap (greedy then swap polish),
                      exhaustive (branch and bound, certified or with a proven gap at the time
                      limit), auto (chooses by size; the default), lazy-greedy (large rooms),
                      screen (bottleneck screen for very large rooms: candidate sets ranked by
                      cut sizes, the best few hundred evaluated exactly within the time limit)
  --nu X              widened: keep small sets of quality rank >= X, 0 <= X <= 1 (default 0.9)
  --time-limit S      exhaustive and auto: time budget in seconds (default 10); screen: (default 480)
  --include IDS       people who must be briefed (ids separated by commas)
  --exclude IDS       people who cannot be briefed
  --include-file F    --exclude-file F: the same, one id per line
  --no-show P         chance that a starter does not show up, 0 <= P <= 0.5: the plan minimises
                      the expected total (exact over all attendance subsets up to 12 starters)
${WALK_HELP}

${ID_LIST_HELP}

Rooms where some people cannot reach any starter need at least one starter in each closed
group; when K is too small for that, the command says so (exit status 2).`,
  async run(argv: Flags) {
    const start = performance.now();
    // Loaded on use, so a problem in one engine module cannot break the other commands.
    const { PLAN_METHODS } = await import('../plan');
    // Branch and bound (exhaustive, auto) runs on two worker threads when the machine has them.
    const { planWithWorkers } = await import('../parallel/index');
    const { graph, warnings, file } = loadRoom(argv);
    const k = integerFlag(argv, 'k', 1, 1e9)!;
    const method = (argv.get('method') ?? 'auto') as PlanMethodChoice;
    if (!(PLAN_METHODS as readonly string[]).includes(method)) {
      throw new CliError(`--method must be one of ${PLAN_METHODS.join(', ')} (got "${method}")`);
    }
    const nu = numberFlag(argv, 'nu', 0, 1, true);
    const seconds = numberFlag(argv, 'time-limit', 0.001, 1e6, true);
    const noShow = numberFlag(argv, 'no-show', 0, 0.5, true);
    const r = await planWithWorkers(
      graph,
      {
        k,
        method,
        ...walkOptions(argv),
        ...(nu !== undefined ? { nu } : {}),
        ...(seconds !== undefined ? { timeLimitMs: seconds * 1000 } : {}),
        ...(noShow !== undefined ? { noShow } : {}),
        mustInclude: people(graph, argv, 'include', file),
        exclude: people(graph, argv, 'exclude', file),
        // The screen of a very large room runs for minutes: one progress line per evaluated set on stderr.
        ...(method === 'screen' ? { onProgress: (p: PlanProgress) => process.stderr.write(`${p.stage} ${p.done}/${p.of}\n`) } : {}),
      },
      Math.min(2, availableParallelism()),
    );
    const finite = (v: number) => (Number.isFinite(v) ? v : null);
    return {
      result: {
        method: r.method,
        k: r.k,
        starters: r.starters.map((i) => graph.ids[i]),
        total: finite(r.total),
        average: finite(r.average),
        rank: finite(r.rank),
        lowerBound: finite(r.lowerBound),
        certified: r.certified,
        elapsedMs: ms(start),
        gap: finite(r.gap),
        coverSize: r.coverSize,
        solverPath: r.solverPath ?? 'dense',
        relativeGap: finite(r.relativeGap),
        searchLeft: r.searchLeft ?? 0,
        nodes: r.nodes ?? 0,
        stopped: r.stopped === true,
        bestSingle: r.bestSingle ? { person: graph.ids[r.bestSingle.person], total: finite(r.bestSingle.total) } : null,
        fewestForOneHop: r.fewestForOneHop,
        fewestToReachAll: r.fewestToReachAll,
        ...(r.noShow ? noShowFields(graph, r.noShow) : {}),
        notes: r.notes,
        warnings: r.warnings,
      },
      notes: warningNotes(warnings, file),
    };
  },
};

function noShowFields(graph: RoomGraph, ns: NoShowReport): Record<string, unknown> {
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  return {
    noShow: ns.chance,
    expectedTotal: finite(ns.expectedTotal),
    nobodyChance: ns.nobodyChance,
    worstAbsence: { person: graph.ids[ns.worstAbsence.person], total: finite(ns.worstAbsence.total) },
    standIns: ns.standIns.map((s) => ({ starter: graph.ids[s.starter], person: graph.ids[s.person], total: finite(s.total) })),
    expectedExact: ns.exact,
    ...(ns.exact ? {} : { expectedError: ns.standardError }),
  };
}

function people(graph: RoomGraph, flags: Flags, name: string, file: string): number[] {
  const index = new Map(graph.ids.map((id, i) => [id, i]));
  return (idsFromFlags(flags, name) ?? []).map((id) => {
    const i = index.get(id);
    if (i === undefined) throw new CliError(`--${name}: "${clipId(id)}" is not a person in ${file}`);
    return i;
  });
}
