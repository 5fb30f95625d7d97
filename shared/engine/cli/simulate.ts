/** `simulate`: a seeded rehearsal of simulated cascades (shared/engine/simulate). */
import { SIMULATE_DEFAULTS } from '../simulate/plan';
import { simulate } from '../simulate/run-local';
import type { SimulationSummary } from '../simulate/summary';
import { CliError, clipText, integerFlag, type Flags } from './args';
import {
  ms,
  ROOM_FLAGS,
  ROOM_HELP,
  ID_LIST_HELP,
  STARTER_FLAGS,
  starterIds,
  starterIndices,
  UNREACHABLE_HELP,
  WALK_FLAGS,
  WALK_HELP,
  unreachableFields,
  walkOptions,
  warningNotes,
  type Command,
} from './command';
import { loadRoom } from './load-room';

export const simulateCommand: Command = {
  name: 'simulate',
  summary: 'seeded simulated cascades: mean hops to hear per person, with standard errors',
  flags: {
    ...ROOM_FLAGS,
    ...STARTER_FLAGS,
    runs: { required: true },
    seed: { required: true },
    workers: {},
    'hop-cap': {},
    ...WALK_FLAGS,
  },
  help: `Usage: npm run -s cli -- simulate --graph FILE --starters IDS --runs R --seed S [--workers W]
                                 [--laziness A] [--mixing B] [--hop-cap H]

Runs R cascades: in each, every person who is not a starter passes the question along ties
(in proportion to strength) until it reaches a starter; the hops taken are when they hear.
Prints {"runs", "seed", "total", "average", "reach": {"<id>": mean}, "stderr": {"<id>": se},
"capped", "elapsedMs", "n", "starters", "totalStderr", "averageStderr", "hopCap", "hops",
"workers", "unreachable", "reasons", "reachableTotal", "reachableAverage"}.
The same seed gives the same numbers, whatever the number of workers: run r draws from its
own stream derived from (seed, r).

${ROOM_HELP}
  --starters IDS      the people briefed first, ids as in the file, separated by commas
  --starters-file F   the same, one id per line
  --runs R            number of cascades, 1 to 10000000
  --seed S            1 to 64 letters, digits, "-" or "_" (the same seeds as on the web); the run
                      uses the seed as text, so 07 and 7 are different seeds; "seed" prints it
                      back exactly (as a JSON number only when the number prints as the same text)
  --workers W         worker threads, 1 to 16 (default 1: this thread)
  --hop-cap H         longest walk before it is stopped (default ${SIMULATE_DEFAULTS.hopCap}); "capped"
                      counts stopped walks, which enter the means at H (the mean is then a lower bound)
${WALK_HELP}

${ID_LIST_HELP}

${UNREACHABLE_HELP}`,
  async run(argv: Flags) {
    const start = performance.now();
    const ids = starterIds(argv);
    const { graph, warnings, file } = loadRoom(argv);
    const starters = starterIndices(graph, argv, file, ids);
    const runs = integerFlag(argv, 'runs', 1, 10_000_000)!;
    const seedText = argv.get('seed')!;
    if (!SEED.test(seedText)) {
      throw new CliError(`--seed must be 1 to 64 letters, digits, "-" or "_", as on the web (got "${clipText(seedText)}")`);
    }
    const workers = integerFlag(argv, 'workers', 1, 16) ?? 1;
    const hopCap = integerFlag(argv, 'hop-cap', 1, 2 ** 31 - 1);
    const options = { ...walkOptions(argv), samples: 0, ...(hopCap !== undefined ? { hopCap } : {}) };
    let s: SimulationSummary;
    if (workers === 1) {
      s = simulate(graph, starters, runs, seedText, options);
    } else {
      const { simulateInPool } = await import('../simulate/pool');
      s = await simulateInPool(graph, starters, runs, seedText, options, workers);
    }
    const reach = new Map<string, number>();
    const stderr = new Map<string, number>();
    const out = unreachableFields(s.n, s.unreachable);
    for (let i = 0; i < s.n; i++) {
      if (out.lost.has(i)) continue;
      reach.set(graph.ids[i], s.mean[i]);
      stderr.set(graph.ids[i], s.stderr[i]);
    }
    const complete = out.ids.length === 0;
    const notes = warningNotes(warnings, file);
    if (out.note) notes.push(out.note);
    if (s.capped > 0)
      notes.push(`note: ${s.capped} walks reached the hop cap of ${s.hopCap} and were stopped; their means are lower bounds`);
    return {
      result: {
        runs: s.runs,
        seed: printedSeed(seedText),
        total: complete ? s.total : null,
        average: complete ? s.average : null,
        reach,
        stderr,
        capped: s.capped,
        elapsedMs: ms(start),
        n: s.n,
        starters: s.starters.map((i) => graph.ids[i]),
        totalStderr: s.totalStderr,
        averageStderr: s.averageStderr,
        hopCap: s.hopCap,
        hops: s.hops,
        workers,
        unreachable: out.ids,
        reasons: out.reasons,
        reachableTotal: s.total,
        reachableAverage: s.average,
      },
      notes,
    };
  },
};

/** The seeds the web accepts (REHEARSAL_LIMITS.seedPattern; a test keeps the two equal). */
export const CLI_SEED_PATTERN = '^[A-Za-z0-9_-]{1,64}$';
const SEED = new RegExp(CLI_SEED_PATTERN);

/** The seed as used: a number only when printing that number gives back the same text (7, not 07). */
export function printedSeed(seed: string): string | number {
  const n = Number(seed);
  return /^\d+$/.test(seed) && Number.isSafeInteger(n) && String(n) === seed ? n : seed;
}
