/** `reach`: exact expected hops to hear for a starter set (shared/engine/reach.ts). */
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

export const reachCommand: Command = {
  name: 'reach',
  summary: 'exact expected hops to hear for each person, given the starters',
  flags: { ...ROOM_FLAGS, ...STARTER_FLAGS, ...WALK_FLAGS },
  help: `Usage: npm run -s cli -- reach --graph FILE --starters ID[,ID...] [--laziness A] [--mixing B]

Prints {"n", "starters", "total", "average", "reach": {"<id>": hops}, "unreachable": [ids],
"reasons", "reachableTotal", "reachableAverage", "solver", "elapsedMs"}.
"reach" holds every person who can be reached (starters with 0); "total" is the sum over
the people who are not starters and "average" is total / (n - number of starters).

${ROOM_HELP}
  --starters IDS      the people briefed first, ids as in the file, separated by commas
  --starters-file F   the same, one id per line
${WALK_HELP}

${ID_LIST_HELP}

${UNREACHABLE_HELP}`,
  async run(argv) {
    const start = performance.now();
    const { exactReach } = await import('../reach');
    const ids = starterIds(argv);
    const { graph, warnings, file } = loadRoom(argv);
    const starters = starterIndices(graph, argv, file, ids);
    const r = exactReach(graph, starters, walkOptions(argv));
    const reach = new Map<string, number>();
    const out = unreachableFields(r.n, r.unreachable);
    for (let i = 0; i < r.n; i++) if (!out.lost.has(i)) reach.set(graph.ids[i], r.h[i]);
    const complete = out.ids.length === 0;
    const notes = warningNotes(warnings, file);
    if (out.note) notes.push(out.note);
    return {
      result: {
        n: r.n,
        starters: r.starters.map((i) => graph.ids[i]),
        total: complete ? r.total : null,
        average: complete ? r.average : null,
        reach,
        unreachable: out.ids,
        reasons: out.reasons,
        reachableTotal: r.reachableTotal,
        reachableAverage: r.reachableAverage,
        solver: r.solver,
        elapsedMs: ms(start),
      },
      notes,
    };
  },
};
