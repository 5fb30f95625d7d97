/**
 * The command line on probe files: ids printed exactly as written (through every command and
 * format), id files and quoted id lists, seeds that reproduce, and every refusal as exit status
 * 2 with one line of at most 300 characters naming what is wrong and where.
 */
import assert from 'node:assert/strict';
import { execFile, execFileSync } from 'node:child_process';
import { symlinkSync, writeFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, it } from 'node:test';
import { REHEARSAL_LIMITS } from '../../shared/api/plans';
import { CLI_SEED_PATTERN } from '../../shared/engine/cli/simulate';
import { cli, fixtures, ROOT, type CliRun } from './cli-helpers';

const IDS = ['12345678901234567891', '12345678901234567892', '1.0', '1e3', '__proto__', 'constructor', ' lead', 'a,b'];

/** The same path room (ids in order, strengths 1) in the three formats. */
function pathRoom(ids: string[]): Record<'json' | 'csv' | 'graphml', string> {
  const jsonId = (id: string) => (/^\d/.test(id) ? id : JSON.stringify(id));
  const xml = (id: string) => id.replace(/&/g, '&amp;').replace(/"/g, '&quot;');
  const csv = (id: string) => (/[," ]/.test(id) ? `"${id}"` : id);
  const ties = ids.slice(1).map((t, i) => [ids[i], t]);
  return {
    json: `{"nodes":[${ids.map((id) => `{"id":${jsonId(id)}}`).join(',')}],"links":[${ties
      .map(([s, t]) => `{"source":${jsonId(s)},"target":${jsonId(t)}}`)
      .join(',')}]}`,
    csv: 'source,target\n' + ties.map(([s, t]) => `${csv(s)},${csv(t)}`).join('\n') + '\n',
    graphml:
      '<graphml><graph>' +
      ids.map((id) => `<node id="${xml(id)}"/>`).join('') +
      ties.map(([s, t]) => `<edge source="${xml(s)}" target="${xml(t)}"/>`).join('') +
      '</graph></graphml>',
  };
}

const room = pathRoom(IDS);
const f = fixtures({
  'ids.json': room.json,
  'ids.csv': room.csv,
  'ids.graphml': room.graphml,
  'starters.txt': '\uFEFF12345678901234567891\r\n\r\n lead\n',
  'exclude.txt': 'a,b\n__proto__\n',
  'tiny.csv': 'source,target,strength\na,b,1\nb,c,1e-15\n',
  'tiny.json':
    '{"nodes":[{"id":"a"},{"id":"b"},{"id":"c"}],"links":[{"source":"a","target":"b"},{"source":"b","target":"c","strength":1e-16}]}',
  'subnormal.graphml':
    '<graphml><key id="w" for="edge" attr.name="weight"/><graph><node id="a"/><node id="b"/><edge source="a" target="b"><data key="w">1e-320</data></edge></graph></graphml>',
  'deep100.graphml': '<graphml><graph>' + '<node id="a">'.repeat(100) + '</node>'.repeat(100) + '</graph></graphml>',
  'deep1m.graphml': '<graphml><graph>' + '<g>'.repeat(1_000_000) + '</g>'.repeat(1_000_000) + '</graph></graphml>',
  'unclosed.graphml': `<graphml>\n<graph>\n<node id="a"><data key="${'k'.repeat(20_000)}">\n</graph>\n`,
  'deep.json': '['.repeat(1_000_000),
  'deep-node.json': '{"nodes":[{"id":"a","extra":' + '{"k":'.repeat(1_000_000) + '0' + '}'.repeat(1_000_000) + '}],"links":[]}',
  'null.json': '{"nodes":[{"id":"a"},{"id":"b"}],"links":[{"source":"a","target":"b","strength":null}]}',
  'empty.csv': 'source,target,strength\na,b,\nb,c,2\n',
});
const dir = dirname(f['ids.json']);

/** Runs several command lines at a time (each is a process). */
function all(runs: string[][]): Promise<CliRun[]> {
  return Promise.all(runs.map((args) => cli(args)));
}

function json(run: CliRun): Record<string, unknown> {
  assert.equal(run.code, 0, run.stderr);
  return JSON.parse(run.stdout) as Record<string, unknown>;
}

/** Exit status 2 and exactly one line, at most 300 characters, matching `pattern`. */
function refused(run: CliRun, pattern: RegExp): void {
  assert.equal(run.code, 2, run.stderr);
  assert.equal(run.stdout, '');
  const lines = run.stderr.split('\n');
  assert.equal(lines.length, 2, run.stderr.slice(0, 500));
  assert.equal(lines[1], '');
  assert.ok(lines[0].length <= 300, `${lines[0].length} characters`);
  assert.doesNotMatch(lines[0], /internal error|stack|Maximum/);
  assert.match(lines[0], pattern);
}

describe('ids as written, through every command and format', () => {
  it('reach, plan, cover and simulate print ids beyond 2^53, 1.0, __proto__ and ids with spaces or commas exactly', async () => {
    const starters = ['--starters-file', f['starters.txt']];
    const runs = await all([
      ...(['json', 'csv', 'graphml'] as const).map((ext) => ['reach', '--graph', f[`ids.${ext}`], ...starters]),
      ['plan', '--graph', f['ids.json'], '--k', '2', '--method', 'greedy', '--exclude-file', f['exclude.txt']],
      ['simulate', '--graph', f['ids.graphml'], '--starters', '"a,b"," lead",1.0', '--runs', '50', '--seed', 'x'],
      ['cover', '--graph', f['ids.csv']],
    ]);
    for (const run of runs.slice(0, 3)) {
      const out = json(run);
      assert.deepEqual(out['starters'], ['12345678901234567891', ' lead']);
      assert.deepEqual(Object.keys(out['reach'] as object), IDS);
      // Second person of the path, between starters at positions 0 and 6: the simple walk's
      // expected absorption time from k on a path absorbed at 0 and N is k (N - k) = 1 * 5
      // (gambler's ruin; Levin, Peres & Wilmer, Markov Chains and Mixing Times, 2nd ed., 2017, 2.1).
      assert.equal((out['reach'] as Record<string, number>)['12345678901234567892'], 5);
    }
    const plan = json(runs[3]);
    for (const id of plan['starters'] as string[]) assert.ok(IDS.includes(id) && id !== 'a,b' && id !== '__proto__', id);
    const sim = json(runs[4]);
    assert.deepEqual(sim['starters'], ['a,b', ' lead', '1.0']);
    assert.deepEqual(Object.keys(sim['reach'] as object), IDS);
    assert.deepEqual(Object.keys(sim['stderr'] as object), IDS);
    const cover = json(runs[5]);
    for (const id of cover['cover'] as string[]) assert.ok(IDS.includes(id), id);
  });

  it('refuses id lists it cannot read, saying how to write them', async () => {
    const [open, after, both, none] = await all([
      ['reach', '--graph', f['ids.json'], '--starters', '"a,b'],
      ['reach', '--graph', f['ids.json'], '--starters', '"a"b'],
      ['reach', '--graph', f['ids.json'], '--starters', '1.0', '--starters-file', f['starters.txt']],
      ['reach', '--graph', f['ids.json'], '--starters', '1'],
    ]);
    refused(open, /--starters: the quoted id starting at character 1 has no closing quote/);
    refused(after, /--starters: expected a comma after the quoted id/);
    refused(both, /give --starters or --starters-file, not both/);
    refused(none, /--starters: "1" is not a person in .* \(ids are matched exactly, as written in the file\)/);
  });

  it('documents the quoting rule, the id files and the size cap in --help', async () => {
    const [reach, plan] = await all([
      ['reach', '--help'],
      ['plan', '--help'],
    ]);
    for (const run of [reach, plan]) {
      assert.match(run.stdout, /an id in double quotes\s+is kept exactly, with a quote inside written twice/);
      assert.match(run.stdout, /256 MiB/);
      assert.match(run.stdout, /an empty one .* also means 1, with a warning; JSON null or "" is refused/s);
    }
    assert.match(reach.stdout, /--starters-file F/);
    assert.match(plan.stdout, /--include-file F/);
  });
});

describe('seeds reproduce', () => {
  it('--seed 07 prints "07", runs as 07 again, and is not the run of --seed 7', async () => {
    const base = ['simulate', '--graph', f['ids.json'], '--starters', '1.0', '--runs', '400'];
    const [a, b, c] = (
      await all([
        [...base, '--seed', '07'],
        [...base, '--seed', '7'],
        [...base, '--seed', '07'],
      ])
    ).map(json);
    assert.equal(a['seed'], '07');
    assert.equal(b['seed'], 7);
    assert.deepEqual({ ...a, elapsedMs: 0 }, { ...c, elapsedMs: 0 });
    assert.notEqual(a['total'], b['total']);
    const again = json(await cli([...base, '--seed', String(b['seed'])]));
    assert.equal(again['total'], b['total']);
  });

  it('accepts exactly the seeds the web accepts', () => {
    assert.equal(CLI_SEED_PATTERN, REHEARSAL_LIMITS.seedPattern);
  });

  it('refuses seeds the web would refuse, with the rule', async () => {
    const [space, long] = await all([
      ['simulate', '--graph', f['ids.json'], '--starters', '1.0', '--runs', '5', '--seed', 'two words'],
      ['simulate', '--graph', f['ids.json'], '--starters', '1.0', '--runs', '5', '--seed', 'x'.repeat(65)],
    ]);
    refused(space, /--seed must be 1 to 64 letters, digits, "-" or "_", as on the web \(got "two words"\)/);
    refused(long, /--seed must be 1 to 64 letters/);
  });
});

describe('refusals: exit status 2, one short line saying what and where', () => {
  it('strengths beyond double precision, and subnormal ones', async () => {
    const [csv, json16, sub] = await all([
      ['cover', '--graph', f['tiny.csv']],
      ['reach', '--graph', f['tiny.json'], '--starters', 'a'],
      ['cover', '--graph', f['subnormal.graphml']],
    ]);
    refused(
      csv,
      /tiny\.csv: ties line 3, strength: 1e-15 is 1\.0e-15 times the strongest tie \(1, line 2\); below 1e-12 times, double precision cannot carry it/,
    );
    refused(json16, /tiny\.json: json links\[1\], strength: 1e-16 is 1\.0e-16 times the strongest tie/);
    refused(sub, /graphml <edge> #1, weight: 1e-320 is too small to compute with \(the least strength accepted is 1e-100\)/);
  });

  it('deep nesting and unclosed markup in GraphML and JSON', async () => {
    const runs = await all(
      ['deep100.graphml', 'deep1m.graphml', 'unclosed.graphml', 'deep.json', 'deep-node.json'].map((n) => ['cover', '--graph', f[n]]),
    );
    refused(
      runs[0],
      /graphml line 1: not accepted: elements nested more than 64 levels deep; GraphML needs only a few \(column 823, byte 823\)$/,
    );
    refused(runs[1], /graphml line 1: not accepted: elements nested more than 64 levels deep.*\(column 203, byte 203\)$/);
    refused(runs[2], /graphml line 4: not well-formed XML: <\/graph> does not match <data> opened at line 3, column 14/);
    refused(runs[3], /json line 1: not accepted: the JSON is nested more than 64 levels deep.*\(column 65, byte 65\)$/);
    refused(runs[4], /json line 1: not accepted: the JSON is nested more than 64 levels deep.*\(column 334, byte 334\)$/);
  });

  it('null strengths refused in JSON; an empty CSV strength reads as 1 with one warning line', async () => {
    const [nul, empty] = await all([
      ['cover', '--graph', f['null.json']],
      ['reach', '--graph', f['empty.csv'], '--starters', 'c'],
    ]);
    refused(nul, /json links\[0\], strength: the strength is null; write a positive number, or leave the field out/);
    const out = json(empty);
    // a -(1)- b -(2)- c, starter c: h_b = 1 + h_a / 3 and h_a = 1 + h_b give h_b = 2, h_a = 3 (worked by hand).
    assert.deepEqual(out['reach'], { a: 3, b: 2, c: 0 });
    assert.match(
      empty.stderr,
      /^note: .*empty\.csv: 1 warning; first: ties line 2, strength: this tie has an empty strength, read as 1.*\n$/,
    );
  });

  it('paths that are not regular files: a FIFO, /dev/zero, a folder', async () => {
    const fifo = join(dir, 'pipe.csv');
    execFileSync('mkfifo', [fifo]);
    const zero = join(dir, 'zero.json');
    symlinkSync('/dev/zero', zero);
    const folder = join(dir, 'folder.graphml');
    mkdirSync(folder);
    const [a, b, c, d] = await all([
      ['cover', '--graph', fifo],
      ['cover', '--graph', zero],
      ['cover', '--graph', folder],
      ['reach', '--graph', f['ids.json'], '--starters-file', '/dev/zero'],
    ]);
    refused(a, /pipe\.csv: cannot read the file \(not a regular file: a pipe, device or socket\)/);
    refused(b, /zero\.json: cannot read the file \(not a regular file/);
    refused(c, /folder\.graphml: cannot read the file \(is a folder, not a file\)/);
    refused(d, /\/dev\/zero: cannot read the file \(not a regular file/);
  });

  it('a long CSV whose second line is bad is refused without holding the file (32 MB heap for a 40 MB file)', async () => {
    const big = join(dir, 'long.csv');
    const block = Array.from({ length: 50_000 }, (_, i) => `p${i},q${i},1\n`).join('');
    writeFileSync(big, 'source,target,strength\na,b,-1\n' + block.repeat(Math.ceil(40e6 / block.length)));
    const run = await new Promise<CliRun>((done) => {
      execFile(
        process.execPath,
        ['--max-old-space-size=32', '--import', 'tsx', join(ROOT, 'shared/engine/cli/main.ts'), 'cover', '--graph', big],
        { cwd: ROOT },
        (error, stdout, stderr) => done({ code: error ? Number((error as { code?: number }).code ?? 1) : 0, stdout, stderr }),
      );
    });
    refused(run, /long\.csv: ties line 2, strength: -1 is not positive/);
  });
});
