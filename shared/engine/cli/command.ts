/** What every command shares: its flags, help text, and the room and starters it reads. */
import type { RoomGraph } from '../graph';
import { describeIssue } from '../io/index';
import { CliError, numberFlag, type FlagSpec, type Flags } from './args';
import { idsFromFlags, MAX_FILE_BYTES, MAX_ID_FILE_BYTES } from './read-file';

export interface CliOutput {
  /** The one JSON object printed on stdout. */
  readonly result: Record<string, unknown>;
  /** Notes for stderr (exit status stays 0). */
  readonly notes: string[];
}

export interface Command {
  readonly name: string;
  readonly summary: string;
  readonly help: string;
  readonly flags: Record<string, FlagSpec>;
  run(flags: Flags): Promise<CliOutput> | CliOutput;
}

export const ROOM_FLAGS: Record<string, FlagSpec> = {
  graph: { required: true },
  people: {},
  directed: { boolean: true },
  'max-people': {},
};

/** --starters IDS or --starters-file FILE (one of them is required; starterIndices checks). */
export const STARTER_FLAGS: Record<string, FlagSpec> = { starters: {}, 'starters-file': {} };

export const WALK_FLAGS: Record<string, FlagSpec> = { laziness: {}, mixing: {} };

export const ROOM_HELP = `  --graph FILE        the room: .json (node-link), .csv (ties: source,target[,strength]) or .graphml;
                      a regular file of at most ${MAX_FILE_BYTES / 1024 / 1024} MiB (pipes, devices and folders are refused)
  --people FILE       (CSV only) people file with header id,name[,group]
  --directed          (CSV only) read each tie as "source asks target"; otherwise ties go both ways
  --max-people N      refuse rooms with more than N people (default 1000000)
Ids are matched and printed exactly as written in the file (JSON numbers keep their digits:
1.0, 1e3 and 12345678901234567891 stay as written; CSV cells are trimmed unless quoted).
Strengths: a missing strength means 1; an empty one (a blank CSV cell, an empty GraphML
<data>) also means 1, with a warning; JSON null or "" is refused. Strengths must be at
least 1e-100, and at least 1e-12 times the room's strongest tie (beyond that ratio double
precision cannot carry the weak tie).`;

/** How lists of ids are written, shared by every flag that takes ids. */
export const ID_LIST_HELP = `Id lists (IDS) are separated by commas; an unquoted id is trimmed, an id in double quotes
is kept exactly, with a quote inside written twice: --starters 'a,"Lee, A."," b"'.
--NAME-file FILE reads one id per line instead, exactly as written (nothing trimmed; blank
lines skipped; at most ${MAX_ID_FILE_BYTES / 1024 / 1024} MiB).`;

export const WALK_HELP = `  --laziness A        chance of staying put at each hop, 0 <= A < 1 (default 0)
  --mixing B          chance of asking anyone in the room at random, 0 <= B < 1 (default 0)`;

export function walkOptions(flags: Flags): { laziness?: number; mixing?: number } {
  const out: { laziness?: number; mixing?: number } = {};
  const a = numberFlag(flags, 'laziness', 0, 1);
  const b = numberFlag(flags, 'mixing', 0, 1);
  if (a !== undefined) out.laziness = a;
  if (b !== undefined) out.mixing = b;
  return out;
}

/** Maps --starters ids to person indices, naming any id not in the room. */
export function starterIds(flags: Flags): string[] {
  const ids = idsFromFlags(flags, 'starters');
  if (ids === undefined) throw new CliError('--starters is required (or --starters-file FILE, one id per line)');
  if (ids.length === 0) throw new CliError('--starters needs at least one person id');
  return ids;
}

/** Maps the starter ids to person indices, naming any id not in the room. */
export function starterIndices(graph: RoomGraph, flags: Flags, file: string, given?: readonly string[]): number[] {
  const ids = given ?? starterIds(flags);
  const index = new Map(graph.ids.map((id, i) => [id, i]));
  const seen = new Set<number>();
  const out: number[] = [];
  for (const id of ids) {
    const i = index.get(id);
    if (i === undefined)
      throw new CliError(`--starters: "${clipId(id)}" is not a person in ${file} (ids are matched exactly, as written in the file)`);
    if (seen.has(i)) throw new CliError(`--starters: "${clipId(id)}" is given twice`);
    seen.add(i);
    out.push(i);
  }
  return out;
}

export function clipId(id: string): string {
  return id.length > 40 ? `${id.slice(0, 40)}...` : id;
}

export function warningNotes(warnings: readonly { message: string }[], file: string): string[] {
  if (warnings.length === 0) return [];
  const first = describeIssue(warnings[0] as Parameters<typeof describeIssue>[0]);
  return [`note: ${file}: ${warnings.length} warning${warnings.length === 1 ? '' : 's'}; first: ${first}`];
}

/** Rounds to 0.1 ms for the elapsedMs field. */
export function ms(start: number): number {
  return Math.round((performance.now() - start) * 10) / 10;
}

/** The unreachable rule shared by reach and simulate: see the help texts. */
export const UNREACHABLE_HELP = `When some people cannot reach any starter (a disconnected room, or a directed room
where a group asks only itself), their expected hops are infinite: they are left out of
"reach" and listed in "unreachable" (with the reason in "reasons"); "total" and "average"
are then null (the true values are infinite), "reachableTotal" and "reachableAverage" give
the sum and mean over the people who can be reached, and one note line goes to stderr.`;

/** The fields reach and simulate share: who is out of reach, why, and the stderr note. */
export function unreachableFields(
  n: number,
  unreachable: readonly { readonly index: number; readonly id: string; readonly message: string }[],
): { lost: Set<number>; ids: string[]; reasons: Map<string, string>; note?: string } {
  // A Map, so an id such as "__proto__" is an ordinary key (the output writer turns Maps into objects).
  const reasons = new Map<string, string>();
  for (const u of unreachable) reasons.set(u.id, u.message);
  return {
    lost: new Set(unreachable.map((u) => u.index)),
    ids: unreachable.map((u) => u.id),
    reasons,
    ...(unreachable.length > 0
      ? { note: `note: ${unreachable.length} of ${n} people cannot reach any starter; total and average are null (see "unreachable")` }
      : {}),
  };
}
