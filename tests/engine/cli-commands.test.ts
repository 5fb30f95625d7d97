/** The command-line contract of issue 3 item 7, run in child processes. */
import assert from 'node:assert/strict';
import { execFile } from 'node:child_process';
import { describe, it } from 'node:test';
import { writeGraphml, writeNodeLink, writeRoomCsv } from '../../shared/engine/io/index';
import { PLAN_WARNING_CODES } from '../../shared/engine/plan-types';
import { cli, fixtures, ROOT } from './cli-helpers';
import { lesMiserables, path } from './simulate-fixtures';

const n = 8;
const line = path(n);
const room = { ...line, ids: line.ids.map((_, i) => String(100 + i)) };
const csv = writeRoomCsv(room);
const f = fixtures({
  'path.json': writeNodeLink(room),
  'path.graphml': writeGraphml(room),
  'path.csv': csv.ties,
  'people.csv': csv.people,
  'mis.json': writeNodeLink(lesMiserables()),
  'split.csv': 'source,target\na,b\nc,d\n',
  'dups.csv': 'source,target,strength\na,b,1\nb,a,2\nb,c,1\n',
});

function json(stdout: string): Record<string, unknown> {
  assert.match(stdout, /^\{.*\}\n$/s);
  assert.equal(stdout.trim().split('\n').length, 1);
  return JSON.parse(stdout) as Record<string, unknown>;
}

describe('command line: results', { concurrency: 2 }, () => {
  it('npm run -s cli works and prints the general help', async () => {
    const r = await new Promise<{ code: number; out: string }>((done) =>
      execFile('npm', ['run', '-s', 'cli', '--', '--help'], { cwd: ROOT }, (e, out) => done({ code: e ? 1 : 0, out })),
    );
    assert.equal(r.code, 0);
    assert.match(r.out, /reach .*\n.*plan .*\n.*cover .*\n.*simulate /);
  });

  for (const command of ['reach', 'plan', 'cover', 'simulate']) {
    it(`${command} --help`, async () => {
      const r = await cli([command, '--help']);
      assert.equal(r.code, 0);
      assert.match(r.stdout, new RegExp(`^Usage: npm run -s cli -- ${command} --graph FILE`));
    });
  }

  it("reach on a path with both ends briefed gives h_i = i (n - i) (gambler's ruin; Levin, Peres, Wilmer 2009), ids as strings", async () => {
    for (const file of [f['path.json'], f['path.graphml'], f['path.csv']]) {
      const r = await cli(['reach', '--graph', file, '--starters', `100,${100 + n}`]);
      assert.equal(r.code, 0, r.stderr);
      assert.equal(r.stderr, '');
      const out = json(r.stdout);
      assert.equal(out['n'], n + 1);
      assert.deepEqual(out['starters'], ['100', String(100 + n)]);
      const reach = out['reach'] as Record<string, number>;
      for (let i = 0; i <= n; i++) assert.ok(Math.abs(reach[String(100 + i)] - i * (n - i)) < 1e-9);
      const total = Array.from({ length: n - 1 }, (_, k) => (k + 1) * (n - k - 1)).reduce((a, b) => a + b);
      assert.ok(Math.abs((out['total'] as number) - total) < 1e-9);
      assert.ok(Math.abs((out['average'] as number) - total / (n - 1)) < 1e-9);
      assert.deepEqual(out['unreachable'], []);
    }
  });

  it('reach with laziness scales by 1 / (1 - a); the people file is accepted', async () => {
    const r = await cli(['reach', '--graph', f['path.csv'], '--people', f['people.csv'], '--starters', '100', '--laziness', '0.5']);
    const reach = json(r.stdout)['reach'] as Record<string, number>;
    // path to one end: H(i -> 0) = 2 n i - i^2 on the path 0..n (Lovász 1993), doubled by laziness 0.5
    for (let i = 1; i <= n; i++) assert.ok(Math.abs(reach[String(100 + i)] - 2 * (2 * n * i - i * i)) < 1e-8);
  });

  it('unreachable people are listed; total and average are null, with a note on stderr', async () => {
    const r = await cli(['reach', '--graph', f['split.csv'], '--starters', 'a']);
    assert.equal(r.code, 0);
    const out = json(r.stdout);
    assert.equal(out['total'], null);
    assert.equal(out['average'], null);
    assert.deepEqual(out['unreachable'], ['c', 'd']);
    assert.deepEqual(out['reach'], { a: 0, b: 1 });
    assert.equal(out['reachableTotal'], 1);
    assert.doesNotMatch(r.stdout, /NaN|Infinity/);
    assert.match(r.stderr, /^note: 2 of 4 people cannot reach any starter/);
  });

  it('merged duplicate ties are mentioned on stderr', async () => {
    const r = await cli(['cover', '--graph', f['dups.csv']]);
    assert.equal(r.code, 0);
    assert.match(r.stderr, /note: .*1 warning; first: ties line 3: tie "b" - "a" repeats/);
  });

  it('cover prints size and members', async () => {
    const out = json((await cli(['cover', '--graph', f['path.json']])).stdout);
    assert.equal(out['size'], 4);
    assert.equal((out['cover'] as string[]).length, 4);
  });

  it('plan prints the contract fields', async () => {
    const out = json((await cli(['plan', '--graph', f['path.json'], '--k', '2', '--method', 'exhaustive'])).stdout);
    for (const key of ['method', 'k', 'starters', 'total', 'average', 'rank', 'lowerBound', 'certified', 'elapsedMs'])
      assert.ok(key in out, key);
    assert.equal(out['method'], 'exhaustive');
    assert.equal(out['certified'], true);
    assert.ok((out['starters'] as string[]).every((s) => typeof s === 'string'));
  });

  it('plan prints its warnings as {code, text}, and its help names every code', async () => {
    // A time limit (1 ms) that has passed before the first seed is extended: the warnings say so.
    const r = await cli(['plan', '--graph', f['mis.json'], '--k', '6', '--method', 'exhaustive', '--time-limit', '0.001']);
    assert.equal(r.code, 0, r.stderr);
    const warnings = json(r.stdout)['warnings'] as { code: string; text: string }[];
    assert.ok(
      warnings.some((w) => w.code === 'search-time-limit'),
      JSON.stringify(warnings),
    );
    for (const w of warnings) {
      assert.deepEqual(Object.keys(w), ['code', 'text']);
      assert.ok((PLAN_WARNING_CODES as readonly string[]).includes(w.code), w.code);
      assert.match(w.text, /^[A-Z].*\.$/);
    }
    const help = (await cli(['plan', '--help'])).stdout;
    for (const code of PLAN_WARNING_CODES) assert.ok(help.includes(code), code);
  });

  it('simulate: contract fields, same seed same numbers, 1 or 2 workers identical', async () => {
    const args = ['simulate', '--graph', f['mis.json'], '--starters', 'p11,p48', '--runs', '12000', '--seed', '77'];
    const [a, b, c] = await Promise.all([cli(args), cli(args), cli([...args, '--workers', '2'])]);
    const [x, y, z] = [a, b, c].map((r) => {
      assert.equal(r.code, 0, r.stderr);
      const o = json(r.stdout);
      delete o['elapsedMs'];
      delete o['workers'];
      return o;
    });
    for (const key of ['runs', 'seed', 'total', 'average', 'reach', 'stderr', 'capped']) assert.ok(key in x, key);
    assert.equal(x['seed'], 77);
    assert.equal(x['runs'], 12000);
    assert.deepEqual(x, y);
    assert.deepEqual(x, z);
  });

  it('simulate agrees with reach within 3 standard errors on the room average', async () => {
    const [sim, exact] = await Promise.all([
      cli(['simulate', '--graph', f['path.json'], '--starters', '100', '--runs', '4000', '--seed', 'check']),
      cli(['reach', '--graph', f['path.json'], '--starters', '100']),
    ]);
    const s = json(sim.stdout);
    const e = json(exact.stdout);
    assert.ok(Math.abs((s['average'] as number) - (e['average'] as number)) <= 3 * (s['averageStderr'] as number));
  });
});
