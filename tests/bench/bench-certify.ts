/**
 * Bench section for issue "plans you can trust": time to certify the optimum (branch and bound)
 * for k = 3..10 on 60-person six-group rooms, on one thread and on two (side by side), and the
 * proven gap of the automatic plan (default time limit, two threads) for k = 1..10 (with the gap a heuristic plan carries from the
 * cheap bounds alone, for contrast). Env: BENCH_CERTIFY=0 skips it, BENCH_CERTIFY=quick keeps
 * k <= 6, BENCH_ONLY=certify runs only this section. Wall-clock figures on a shared machine.
 */
import { loadavg } from 'node:os';
import { plan, type RoomGraph } from '../../shared/engine/index';
import { planWithWorkers } from '../../shared/engine/parallel/index';
import { allHandsRoom, groupRoom } from './team-rooms';

const log = (s: string) => process.stderr.write(s + '\n');
const secs = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
const pct = (x: number) => `${(100 * x).toFixed(1)} %`;

function table(title: string, head: string[], body: string[][]): void {
  const w = head.map((h, c) => Math.max(h.length, ...body.map((b) => b[c].length)));
  const line = (cells: string[]) => '| ' + cells.map((x, c) => x.padEnd(w[c])).join(' | ') + ' |';
  console.log(`\n${title}\n`);
  console.log(line(head));
  console.log('|' + w.map((x) => '-'.repeat(x + 2)).join('|') + '|');
  for (const b of body) console.log(line(b));
}

export async function certifyTables(): Promise<void> {
  const mode = process.env.BENCH_CERTIFY ?? 'full';
  if (mode === '0') return;
  const maxK = mode === 'quick' ? 6 : 10;
  const rooms: [string, RoomGraph][] = [
    ['demo all-hands (60 people, 113 ties)', allHandsRoom()],
    ['random six-group room (seed 7)', groupRoom(7)],
  ];
  log(`certification bench (load average ${loadavg()[0].toFixed(1)})`);
  const cert: string[][] = [];
  for (const [name, g] of rooms) {
    for (let k = 3; k <= maxK; k++) {
      let t = performance.now();
      const one = plan(g, { k, method: 'exhaustive', timeLimitMs: 60_000 });
      const oneMs = performance.now() - t;
      t = performance.now();
      const two = await planWithWorkers(g, { k, method: 'exhaustive', timeLimitMs: 60_000 }, 2);
      const twoMs = performance.now() - t;
      log(`  ${name} k=${k}: ${secs(oneMs)} / ${secs(twoMs)}`);
      cert.push([
        name,
        String(k),
        one.total.toFixed(3),
        one.certified && two.certified ? 'yes' : 'NO',
        secs(oneMs),
        secs(twoMs),
        `${(oneMs / twoMs).toFixed(2)}x`,
        String(one.nodes ?? 0),
        oneMs <= 60_000 ? 'yes' : 'NO',
      ]);
    }
  }
  table(
    'Certified optimum (target <= 60 s per k on this 2-core machine)',
    ['room', 'k', 'optimum', 'certified', '1 thread', '2 threads', 'ratio', 'nodes', '<= 60 s'],
    cert,
  );
  const gaps: string[][] = [];
  for (const [name, g] of rooms) {
    for (let k = 1; k <= maxK; k++) {
      // As the plan page and the command line run it: default time limit, two threads.
      const auto = await planWithWorkers(g, { k, method: 'auto' }, 2);
      const quick = plan(g, { k, method: 'swap' });
      gaps.push([
        name,
        String(k),
        auto.total.toFixed(3),
        pct(auto.relativeGap),
        auto.relativeGap <= 0.1 ? 'yes' : 'NO',
        pct(quick.relativeGap),
        secs(auto.elapsedMs),
      ]);
    }
  }
  table(
    'Proven gap of the automatic plan at its default time limit on two threads (target <= 10 %; "swap alone" = gap from the cheap bounds without a search)',
    ['room', 'k', 'auto total', 'proven gap', '<= 10 %', 'swap alone', 'auto time'],
    gaps,
  );
}
