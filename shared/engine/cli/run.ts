/**
 * Command line of the engine (main.ts runs it): `npm run -s cli -- reach|plan|cover|simulate ...`.
 * Each command prints one JSON object on stdout. Bad input: exit status 2 and one line on
 * stderr saying what is wrong and where; an unexpected failure: exit status 1 and one line.
 * Never a stack trace.
 */
import { isEngineError } from '../errors';
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
    return { code: 2, stdout: '', stderr: `unknown command "${oneLine(name)}"; use one of reach, plan, cover, simulate (see --help)\n` };
  if (rest.includes('--help') || rest.includes('-h')) return { code: 0, stdout: command.help + '\n', stderr: '' };
  try {
    const flags = parseFlags(rest, command.flags, command.name);
    const out = await command.run(flags);
    const notes = out.notes.map((n) => oneLine(n) + '\n').join('');
    return { code: 0, stdout: JSON.stringify(out.result) + '\n', stderr: notes };
  } catch (e) {
    if (e instanceof CliError) return { code: 2, stdout: '', stderr: `${command.name}: ${oneLine(e.message)}\n` };
    if (isEngineError(e)) {
      const code = e.code === 'SOLVER_FAILED' ? 1 : 2;
      return { code, stdout: '', stderr: `${command.name}: ${oneLine(e.message)}\n` };
    }
    const message = e instanceof Error ? e.message : String(e);
    return { code: 1, stdout: '', stderr: `${command.name}: internal error: ${oneLine(message)}\n` };
  }
}

function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, ' ').trim();
}
