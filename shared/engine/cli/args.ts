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

/** Splits `a,b,c` into ids; empty entries are an error. */
export function idList(flags: Flags, name: string): string[] {
  const raw = flags.get(name);
  if (raw === undefined) return [];
  const ids = raw.split(',').map((s) => s.trim());
  if (ids.some((s) => s === '')) throw new CliError(`--${name} has an empty entry in "${raw}"; give ids separated by commas`);
  return ids;
}
