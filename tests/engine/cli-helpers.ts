/** Runs the command line in a child process, as `npm run -s cli` does (tsx + main.ts). */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '../..');
const MAIN = join(ROOT, 'shared/engine/cli/main.ts');

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export function cli(args: readonly string[]): Promise<CliRun> {
  return new Promise((done) => {
    execFile(process.execPath, ['--import', 'tsx', MAIN, ...args], { cwd: ROOT, maxBuffer: 64 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error ? ((error as { code?: number }).code ?? 1) : 0;
      done({ code: typeof code === 'number' ? code : 1, stdout, stderr });
    });
  });
}

/** Writes files into a fresh temporary folder and returns their paths. */
export function fixtures(files: Record<string, string | Uint8Array>): Record<string, string> {
  const dir = mkdtempSync(join(tmpdir(), 'rh-cli-'));
  const out: Record<string, string> = {};
  for (const [name, body] of Object.entries(files)) {
    out[name] = join(dir, name);
    writeFileSync(out[name], body);
  }
  return out;
}
