/** `cover`: a small vertex cover (shared/engine/cover.ts); briefing it makes everyone hear in one hop. */
import { ms, ROOM_FLAGS, ROOM_HELP, warningNotes, type Command } from './command';
import { loadRoom } from './load-room';

export const coverCommand: Command = {
  name: 'cover',
  summary: 'a small set of people such that everyone else asks only them (a vertex cover)',
  flags: { ...ROOM_FLAGS },
  help: `Usage: npm run -s cli -- cover --graph FILE

Prints {"size", "cover": [ids in input order], "exact", "elapsedMs"}. Briefing the cover
means everyone else hears in one hop, the least possible (total = n - size). "exact" is
true when the size is proven to be the smallest possible.

${ROOM_HELP}`,
  async run(argv) {
    const start = performance.now();
    const { vertexCover } = await import('../cover');
    const { graph, warnings, file } = loadRoom(argv);
    const c = vertexCover(graph);
    return {
      result: { size: c.size, cover: c.cover.map((i) => graph.ids[i]), exact: c.exact, elapsedMs: ms(start) },
      notes: warningNotes(warnings, file),
    };
  },
};
