/** `reach`: exact expected hops to hear for a starter set (shared/engine/reach.ts). */
import {
  ms,
  ROOM_FLAGS,
  ROOM_HELP,
  starterIndices,
  UNREACHABLE_HELP,
  WALK_FLAGS,
  WALK_HELP,
  walkOptions,
  warningNotes,
  type Command,
} from './command';
import { loadRoom } from './load-room';

export const reachCommand: Command = {
  name: 'reach',
  summary: 'exact expected hops to hear for each person, given the starters',
  flags: { ...ROOM_FLAGS, starters: { required: true }, ...WALK_FLAGS },
  help: `Usage: npm run -s cli -- reach --graph FILE --starters ID[,ID...] [--laziness A] [--mixing B]

Prints {"n", "starters", "total", "average", "reach": {"<id>": hops}, "unreachable": [ids],
"reasons", "reachableTotal", "reachableAverage", "solver", "elapsedMs"}.
"reach" holds every person who can be reached (starters with 0); "total" is the sum over
the people who are not starters and "average" is total / (n - number of starters).

${ROOM_HELP}
  --starters IDS      the people briefed first, ids as in the file, separated by commas
${WALK_HELP}

${UNREACHABLE_HELP}`,
  async run(argv) {
    const start = performance.now();
    const { exactReach } = await import('../reach');
    const { graph, warnings, file } = loadRoom(argv);
    const starters = starterIndices(graph, argv, file);
    const r = exactReach(graph, starters, walkOptions(argv));
    const reach: Record<string, number> = {};
    const lost = new Set(r.unreachable.map((u) => u.index));
    for (let i = 0; i < r.n; i++) if (!lost.has(i)) reach[graph.ids[i]] = r.h[i];
    const reasons: Record<string, string> = {};
    for (const u of r.unreachable) reasons[u.id] = u.message;
    const complete = r.unreachable.length === 0;
    const notes = warningNotes(warnings, file);
    if (!complete)
      notes.push(`note: ${r.unreachable.length} of ${r.n} people cannot reach any starter; total and average are null (see "unreachable")`);
    return {
      result: {
        n: r.n,
        starters: r.starters.map((i) => graph.ids[i]),
        total: complete ? r.total : null,
        average: complete ? r.average : null,
        reach,
        unreachable: r.unreachable.map((u) => u.id),
        reasons,
        reachableTotal: r.reachableTotal,
        reachableAverage: r.reachableAverage,
        solver: r.solver,
        elapsedMs: ms(start),
      },
      notes,
    };
  },
};
