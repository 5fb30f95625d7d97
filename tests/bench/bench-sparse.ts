/**
 * Large-room benchmarks (part of `npm run bench`; alone: `npx tsx tests/bench/bench-sparse.ts`):
 * the sparse exact greedy side by side with the NumPy peers of tests/bench/peers/ in the same
 * run, on the same rooms, with equal picks and totals checked (1e-9 relative), and a scaling
 * table with time, peak memory, fill and the growth exponent. The big sizes (3e4 and 1e5
 * people) run only with RH_BENCH_LARGE=1. Each case runs in its own process (peak memory).
 * The NumPy peers run with OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE unset (they slow a current
 * OpenBLAS; see DEVELOPERS.md).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

interface CaseOut {
  evaluated?: string | null;
  ms: number;
  cpuMs: number;
  maxRssMb: number;
  path: string;
  order?: string | null;
  fill: number | null;
  total: number;
  starters: number[];
  m: number;
}
interface PeerOut {
  picks: number[];
  total: number;
  ms: number;
  blas: string;
}

const here = import.meta.dirname;
const log = (s: string) => process.stderr.write(s + '\n');

export function ensurePython(): boolean {
  const ok = () => spawnSync('python3', ['-c', 'import numpy, scipy'], { stdio: 'ignore' }).status === 0;
  if (ok()) return true;
  log('Installing python3-numpy and python3-scipy (Debian) for the peers...');
  spawnSync('apt-get', ['install', '-y', '-q', 'python3-numpy', 'python3-scipy'], { stdio: 'inherit' });
  return ok();
}

function runCase(kind: string, n: number, k: number, edgeFile?: string): CaseOut {
  const args = ['--import', 'tsx', join(here, 'bench-sparse-case.ts'), kind, String(n), String(k), ...(edgeFile ? [edgeFile] : [])];
  // stderr passes through: a long case prints its progress there.
  const r = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 26, stdio: ['ignore', 'pipe', 'inherit'] });
  if (r.status !== 0) throw new Error(`case ${kind} ${n} failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as CaseOut;
}

function runPeer(file: string, k: number, mode: string, repeats: number): PeerOut {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  const r = spawnSync('python3', [join(here, 'peers', 'greedy_numpy.py'), file, String(k), mode, String(repeats)], {
    encoding: 'utf8',
    env,
  });
  if (r.status !== 0) throw new Error(`peer failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim()) as PeerOut;
}

const fmt = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);

function table(title: string, head: string[], body: string[][]): void {
  const w = head.map((h, c) => Math.max(h.length, ...body.map((b) => b[c].length)));
  const line = (cells: string[]) => '| ' + cells.map((x, c) => x.padEnd(w[c])).join(' | ') + ' |';
  console.log(`\n${title}\n`);
  console.log(line(head));
  console.log('|' + w.map((x) => '-'.repeat(x + 2)).join('|') + '|');
  for (const b of body) console.log(line(b));
}

export function sparseBench(): void {
  const dir = mkdtempSync(join(tmpdir(), 'rh-bench-'));
  try {
    const python = ensurePython();
    if (!python) log('NumPy/SciPy missing and could not be installed: the peer columns stay empty.');
    const body: string[][] = [];
    const cases: [string, number, number, string][] = [
      ['small-world', 218, 41, 'plain'],
      ['small-world', 1000, 50, 'optimised'],
      ['grid', 1024, 50, 'optimised'],
      ['small-world', 3000, 50, 'optimised'],
      ['grid', 3025, 50, 'optimised'],
    ];
    for (const [kind, n, k, mode] of cases) {
      log(`  ${kind} ${n}, k = ${k} ...`);
      const file = join(dir, `${kind}-${n}.txt`);
      const ours = runCase(kind, n, k, file);
      const peer = python ? runPeer(file, k, mode, n <= 1100 ? 3 : 1) : null;
      const same = peer ? peer.picks.join(',') === ours.starters.join(',') : null;
      const rel = peer ? Math.abs(peer.total - ours.total) / ours.total : null;
      body.push([
        `${kind}`,
        String(n),
        String(k),
        fmt(ours.ms),
        fmt(ours.cpuMs),
        ours.path,
        peer ? `${fmt(peer.ms)} (NumPy ${mode}, ${peer.blas})` : '',
        peer ? `${(peer.ms / ours.ms).toFixed(1)}x` : '',
        same === null ? '' : same ? 'yes' : 'NO',
        rel === null ? '' : rel.toExponential(1),
      ]);
    }
    table(
      'Greedy side by side with NumPy (compute time, file reading excluded; target >= 5x)',
      ['room', 'n', 'k', 'ours', 'cpu', 'path', 'peer', 'ratio', 'same picks', 'total rel. diff'],
      body,
    );
    scaling();
    screenBench();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function scaling(): void {
  const sizes = process.env.RH_BENCH_LARGE === '1' ? [1000, 3000, 10_000, 30_000, 100_000] : [1000, 3000, 10_000];
  const body: string[][] = [];
  for (const kind of ['grid', 'small-world']) {
    let prev: { n: number; ms: number } | null = null;
    for (const n of sizes) {
      log(`  scaling ${kind} ${n} ...`);
      const r = runCase(kind, n, 50);
      const exp = prev ? (Math.log(r.ms / prev.ms) / Math.log(n / prev.n)).toFixed(2) : '';
      body.push([
        kind,
        String(n),
        String(r.m),
        fmt(r.ms),
        fmt(r.cpuMs),
        `${r.maxRssMb.toFixed(0)} MB`,
        r.path,
        r.order ?? '',
        r.fill === null ? '' : String(r.fill),
        exp,
      ]);
      prev = { n, ms: r.ms };
    }
  }
  table(
    `Exact greedy, k = 50: scaling (${process.env.RH_BENCH_LARGE === '1' ? 'with' : 'without'} the large sizes; RH_BENCH_LARGE=1 adds 3e4 and 1e5)`,
    ['room', 'n', 'ties', 'time', 'cpu', 'peak memory', 'path', 'order', 'fill (nonzeros)', 'growth exponent'],
    body,
  );
}

/**
 * The bottleneck screen (method screen) against the exact greedy on the same rooms, k = 20: time
 * and how far the screen's total is above the greedy's. RH_BENCH_LARGE=1 adds a 1,000,000-person
 * small-world room (goal: a plan within 10 minutes; the screen's own time budget is 8 minutes).
 */
export function screenBench(): void {
  const body: string[][] = [];
  const cases: [string, number][] = [
    ['small-world', 1000],
    ['grid', 1024],
    ['small-world', 3000],
    ['grid', 3025],
  ];
  for (const [kind, n] of cases) {
    log(`  screen ${kind} ${n} ...`);
    const s = runCase(`screen-${kind}`, n, 20);
    const g = runCase(kind, n, 20);
    body.push([kind, String(n), fmt(s.ms), fmt(g.ms), `${(100 * (s.total / g.total - 1)).toFixed(1)} %`, s.evaluated ?? '']);
  }
  if (process.env.RH_BENCH_LARGE === '1') {
    log('  screen small-world 1000000 (up to 10 minutes) ...');
    const s = runCase('screen-small-world', 1_000_000, 20);
    body.push(['small-world', '1000000', fmt(s.ms), '', `peak ${s.maxRssMb.toFixed(0)} MB`, s.evaluated ?? '']);
  }
  table(
    `Bottleneck screen against exact greedy, k = 20 (${process.env.RH_BENCH_LARGE === '1' ? 'with' : 'without'} the 1,000,000-person room; RH_BENCH_LARGE=1 adds it)`,
    ['room', 'n', 'screen', 'exact greedy', 'screen total above greedy', 'sets evaluated'],
    body,
  );
}

if (process.argv[1] && import.meta.filename === process.argv[1]) sparseBench();
