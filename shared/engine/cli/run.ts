/**
 * Command line of the engine (main.ts runs it): `npm run -s cli -- reach|plan|cover|simulate ...`.
 * Each command prints one JSON object on stdout. Bad input: exit status 2 and one line on
 * stderr saying what is wrong and where; an unexpected failure: exit status 1 and one line.
 * Never a stack trace.
 */
import { isEngineError } from '../errors';
import { MAX_MESSAGE_CHARS } from '../io/index';
import { CliError, parseFlags } from './args';
import type { Command } from './command';
import { coverCommand } from './cover';
import { planCommand } from './plan';
import { reachCommand } from './reach';
import { simulateCommand } from './simulate';

const COMMANDS: Command[] = [reachCommand, planCommand, coverCommand, simulateCommand];

const USAGE = `Usage: npm run -s cli -- COMMAND [flags]

Commands:
${COMMANDS.map((c) => `  ${c.name.padEnd(10)}${c.summary}`).join('\n')}

Run "npm run -s cli -- COMMAND --help" for the flags of a command.
Rooms are read by file extension: .json (node-link), .csv (ties, optional --people file), .graphml.
Person ids are printed as strings, exactly as in the file.`;

export async function runCli(argv: readonly string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    return {
      code: name === undefined ? 2 : 0,
      stdout: name === undefined ? '' : USAGE + '\n',
      stderr: name === undefined ? 'no command given; use one of reach, plan, cover, simulate (see --help)\n' : '',
    };
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command)
    return {
      code: 2,
      stdout: '',
      stderr: `unknown command "${oneLine(name).slice(0, 40)}"; use one of reach, plan, cover, simulate (see --help)\n`,
    };
  if (rest.includes('--help') || rest.includes('-h')) return { code: 0, stdout: command.help + '\n', stderr: '' };
  try {
    const flags = parseFlags(rest, command.flags, command.name);
    const out = await command.run(flags);
    const notes = out.notes.map((n) => oneLine(n) + '\n').join('');
    return { code: 0, stdout: JSON.stringify(out.result, mapsAsObjects) + '\n', stderr: notes };
  } catch (e) {
    if (e instanceof CliError) return { code: 2, stdout: '', stderr: oneLine(`${command.name}: ${e.message}`) + '\n' };
    if (isEngineError(e)) {
      const code = e.code === 'SOLVER_FAILED' ? 1 : 2;
      return { code, stdout: '', stderr: oneLine(`${command.name}: ${e.message}`) + '\n' };
    }
    const message = e instanceof Error ? e.message : String(e);
    return { code: 1, stdout: '', stderr: oneLine(`${command.name}: internal error: ${message}`) + '\n' };
  }
}

/** One line of at most MAX_MESSAGE_CHARS characters. */
function oneLine(s: string): string {
  const line = s.replace(/\s*[\r\n]+\s*/g, ' ').trim();
  return line.length > MAX_MESSAGE_CHARS ? `${line.slice(0, MAX_MESSAGE_CHARS - 3)}...` : line;
}

/**
 * Results keyed by person id are Maps, so no id (not even "__proto__") can clash with an
 * object's own machinery; Object.fromEntries defines each key as a plain property for printing.
 */
function mapsAsObjects(_key: string, value: unknown): unknown {
  return value instanceof Map ? Object.fromEntries(value) : value;
}
