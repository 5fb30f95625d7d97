/**
 * Command-line flags: `--name value` or `--name=value`, each at most once, only the ones a
 * command declares. Every problem is a CliError: exit status 2 and one line on stderr.
 */

export class CliError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CliError';
  }
}

export interface FlagSpec {
  /** true: the flag takes no value. */
  readonly boolean?: boolean;
  readonly required?: boolean;
}

export type Flags = Map<string, string>;

export function parseFlags(argv: readonly string[], spec: Record<string, FlagSpec>, command: string): Flags {
  const flags: Flags = new Map();
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (!arg.startsWith('--')) throw new CliError(`${command}: unexpected argument "${arg}" (flags start with --; see ${command} --help)`);
    const eq = arg.indexOf('=');
    const name = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
    const s = spec[name];
    if (!s) throw new CliError(`${command}: unknown flag --${name} (see ${command} --help)`);
    if (flags.has(name)) throw new CliError(`${command}: --${name} is given twice`);
    let value: string;
    if (s.boolean) {
      if (eq > 0) throw new CliError(`${command}: --${name} takes no value`);
      value = 'true';
    } else if (eq > 0) {
      value = arg.slice(eq + 1);
    } else {
      if (i + 1 >= argv.length || argv[i + 1].startsWith('--')) throw new CliError(`${command}: --${name} needs a value`);
      value = argv[++i];
    }
    flags.set(name, value);
  }
  for (const [name, s] of Object.entries(spec)) {
    if (s.required && !flags.has(name)) throw new CliError(`${command}: --${name} is required (see ${command} --help)`);
  }
  return flags;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A number in [min, max) (or [min, max] when `inclusiveMax`). */
export function numberFlag(flags: Flags, name: string, min: number, max: number, inclusiveMax = false): number | undefined {
  const raw = flags.get(name);
  if (raw === undefined) return undefined;
  const v = Number(raw);
  const ok = NUMBER.test(raw.trim()) && Number.isFinite(v) && v >= min && (inclusiveMax ? v <= max : v < max);
  if (!ok) throw new CliError(`--${name} must be a number with ${min} <= ${name} ${inclusiveMax ? '<=' : '<'} ${max} (got "${raw}")`);
  return v;
}

export function integerFlag(flags: Flags, name: string, min: number, max: number): number | undefined {
  const raw = flags.get(name);
  if (raw === undefined) return undefined;
  if (!/^\+?\d+$/.test(raw.trim()) || Number(raw) < min || Number(raw) > max) {
    throw new CliError(`--${name} must be a whole number from ${min} to ${max} (got "${raw}")`);
  }
  return Number(raw);
}

/**
 * Splits an id list: ids separated by commas, CSV-style. An unquoted id is trimmed; an id in
 * double quotes is kept exactly (spaces and commas included), a quote inside written twice:
 * `a,"Lee, A."," b","say ""hi"""` gives a / Lee, A. / " b" / say "hi".
 */
export function splitIds(raw: string, name: string): string[] {
  const ids: string[] = [];
  let i = 0;
  for (;;) {
    while (raw[i] === ' ' || raw[i] === '\t') i++;
    let id: string;
    if (raw[i] === '"') {
      id = '';
      let k = i + 1;
      for (;;) {
        const q = raw.indexOf('"', k);
        if (q < 0) throw new CliError(`--${name}: the quoted id starting at character ${i + 1} has no closing quote (")`);
        id += raw.slice(k, q);
        if (raw[q + 1] === '"') {
          id += '"';
          k = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      while (raw[i] === ' ' || raw[i] === '\t') i++;
      if (i < raw.length && raw[i] !== ',') {
        throw new CliError(`--${name}: expected a comma after the quoted id ending at character ${i} (write a quote inside as "")`);
      }
    } else {
      const comma = raw.indexOf(',', i);
      id = raw.slice(i, comma < 0 ? raw.length : comma).trim();
      i = comma < 0 ? raw.length : comma;
    }
    if (id === '') throw new CliError(`--${name} has an empty entry in "${clipText(raw)}"; give ids separated by commas`);
    ids.push(id);
    if (i >= raw.length) return ids;
    i++; // the comma
  }
}

/** Splits `a,b,c` into ids (see splitIds); empty entries are an error. */
export function idList(flags: Flags, name: string): string[] {
  const raw = flags.get(name);
  if (raw === undefined) return [];
  return splitIds(raw, name);
}

export function clipText(s: string, max = 60): string {
  return s.length > max ? `${s.slice(0, max)}...` : s;
}
