/**
 * Fault run (scripts/faults.sh sets up its own MariaDB, Redis and database): two web processes
 * (WEB_ONLY) and two worker processes share one 100,000-cascade rehearsal while we kill -9 one
 * worker, then one web process, then Redis (restarted), then MariaDB (restarted). Checks: no
 * surviving process dies, the rehearsal completes with exactly the numbers the engine gives for
 * that seed in one thread, events reach a web process other than the one that started it, and
 * every room whose creation was answered 201 during the faults is still there. Every wait is a
 * poll with a deadline.
 */
import assert from 'node:assert/strict';
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { after, before, describe, it } from 'node:test';
import { eq, inArray } from 'drizzle-orm';
import { jobs } from '../../db/schema/plans';
import { rooms } from '../../db/schema/rooms';
import { db } from '../../server/db';
import { simulate } from '../../shared/engine/index';
import type { JobEvent, RehearsalDetail } from '../../shared/api/plans';
import { TestClient } from '../support/http-client';
import { closeFaultTest } from './close';
import { createAccount } from '../support/test-server';
import { makeRoom, readEvents, ringRoom } from '../server/plans-support';

function webPorts(): [number, number] {
  const text = process.env['FAULTS_WEB_PORTS'] ?? '4491,4492';
  const [a, b] = text.split(',').map(Number);
  if (a === undefined || b === undefined || !Number.isInteger(a) || !Number.isInteger(b))
    throw new Error(`FAULTS_WEB_PORTS must be two ports like 4491,4492, not "${text}".`);
  return [a, b];
}
const [PORT_A, PORT_B] = webPorts();
const RUNS = 100_000;
const SIZE = Number(process.env['FAULTS_ROOM_SIZE'] ?? 32);
const SEED = 'fault-run';
// Deadlines: starting four processes, then the rehearsal with its faults.
const BOOT_MS = 90_000;
const DEADLINE_MS = 150_000;
let started = Date.now();

interface Proc {
  name: string;
  proc: ChildProcess;
  log(): string;
  alive(): boolean;
}

function spawnProc(name: string, file: string, env: Record<string, string>): Proc {
  // The servers are no test processes: they must not inherit the test runner's context.
  const { NODE_TEST_CONTEXT: _context, ...inherited } = process.env;
  const proc = spawn(process.execPath, ['--import', 'tsx', file], { env: { ...inherited, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let log = '';
  proc.stderr!.on('data', (d: Buffer) => (log += d.toString()));
  proc.stdout!.on('data', (d: Buffer) => (log += d.toString()));
  return { name, proc, log: () => log, alive: () => proc.exitCode === null && proc.signalCode === null };
}

async function until<T>(what: string, probe: () => Promise<T | undefined | false>, ms = DEADLINE_MS - (Date.now() - started)): Promise<T> {
  const end = Date.now() + Math.max(1000, ms);
  for (;;) {
    try {
      const v = await probe();
      if (v) return v;
    } catch {
      // the service being probed may be down right now
    }
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const healthy = (port: number) => until(`web on ${port}`, async () => (await fetch(`http://127.0.0.1:${port}/api/health`)).ok, BOOT_MS);

function killPidFile(file: string): void {
  process.kill(Number(readFileSync(file, 'utf8').trim()), 'SIGKILL');
}

async function progressOf(jobId: number): Promise<{ status: string; progress: number }> {
  const [row] = await db.select({ status: jobs.status, progress: jobs.progress }).from(jobs).where(eq(jobs.id, jobId));
  assert.ok(row, `job ${jobId} has no row`);
  return row;
}

describe('faults during a shared rehearsal', () => {
  const procs: Proc[] = [];
  const named = (name: string): Proc => {
    const p = procs.find((x) => x.name === name);
    assert.ok(p, `no process named ${name}`);
    return p;
  };
  after(async () => {
    for (const p of procs) if (p.alive()) p.proc.kill('SIGKILL');
    await closeFaultTest();
  });

  const web = (port: number) => ({ PORT: String(port), HOST: '127.0.0.1', WEB_ONLY: 'true' });
  const worker = { WORKERS: '1', JOB_LOCK_SECONDS: '3' };
  let a: TestClient;
  let b: TestClient;

  before(async () => {
    procs.push(spawnProc('web A', 'server/main.ts', web(PORT_A)));
    procs.push(spawnProc('web B', 'server/main.ts', web(PORT_B)));
    procs.push(spawnProc('worker 1', 'server/worker.ts', worker));
    procs.push(spawnProc('worker 2', 'server/worker.ts', worker));
    try {
      await Promise.all([healthy(PORT_A), healthy(PORT_B)]);
    } catch (err) {
      for (const p of procs) console.error(`--- ${p.name} (exit ${p.proc.exitCode}, signal ${p.proc.signalCode}) ---\n${p.log()}`);
      throw err;
    }
    const account = await createAccount('facilitator');
    a = new TestClient(`http://127.0.0.1:${PORT_A}`);
    await a.signIn(account.email, account.password);
    // Sessions live in MariaDB: the same cookie works on the other web process.
    b = new TestClient(`http://127.0.0.1:${PORT_B}`);
    for (const [k, v] of a.cookies) b.cookies.set(k, v);
  });

  it('kill -9 of a worker, a web process, Redis and MariaDB: the rehearsal ends with the undisturbed numbers', async () => {
    started = Date.now();
    const room = await makeRoom(a, ringRoom(SIZE, 0), 'Fault ring');
    const plan = (await a.post(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0]] })).body;
    const start = await a.post(`/api/plans/${plan.id}/rehearsals`, { runs: RUNS, seed: SEED });
    assert.equal(start.status, 202, start.text);
    const jobId: number = start.body.job.id;
    const rehearsalId: number = start.body.rehearsal.id;
    // Web B streams a job started on web A and run by the workers.
    const stream = readEvents(b, `/api/rehearsals/${rehearsalId}/events`, DEADLINE_MS).catch((err: unknown) => ({
      events: [] as JobEvent[],
      err,
    }));

    // Rooms created all along; each one answered 201 must survive every fault.
    const committed: number[] = [];
    let writing = true;
    const writer = (async () => {
      for (let i = 0; writing; i++) {
        try {
          const r = await b.post('/api/rooms', {
            name: `Kept ${i}`,
            settings: { directed: false },
            people: [
              { key: 'a', name: 'Ann' },
              { key: 'b', name: 'Ben' },
            ],
            ties: [{ source: 'a', target: 'b', strength: 1 }],
          });
          if (r.status === 201) committed.push(r.body.id);
        } catch {
          // a refused request is fine; a lost committed one is not
        }
        await new Promise((r) => setTimeout(r, 150));
      }
    })();

    const reached = (f: number) => until(`progress ${f}`, async () => (await progressOf(jobId)).progress >= f);
    await reached(0.05);
    named('worker 1').proc.kill('SIGKILL');
    await reached(0.15);
    named('web A').proc.kill('SIGKILL');
    await reached(0.25);
    killPidFile(`${process.env['REDIS_DATA_DIR']}/redis.pid`);
    execFileSync('bash', ['scripts/redis.sh', 'start'], { stdio: 'inherit' });
    await reached(0.35);
    killPidFile(`${process.env['DB_RUN_DIR']}/mysqld.pid`);
    execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
    await reached(0.45);

    const final = await until('the end of the rehearsal', async () => {
      const p = await progressOf(jobId);
      return p.status !== 'queued' && p.status !== 'running' ? p : undefined;
    });
    writing = false;
    await writer;
    assert.equal(final.status, 'done', `the rehearsal ended ${final.status}`);

    const survivors = [named('web B'), named('worker 2')];
    for (const p of survivors) assert.ok(p.alive(), `${p.name} died:\n${p.log()}`);

    const detail = (await b.get<RehearsalDetail>(`/api/rehearsals/${rehearsalId}`)).body;
    assert.equal(detail.status, 'done');
    assert.equal(detail.runs, RUNS);
    const reference = simulate(ringRoom(SIZE, 0), [0], RUNS, SEED);
    assert.deepEqual(
      detail.people.map((p) => p.mean),
      Array.from(reference.mean),
    );
    assert.deepEqual(
      detail.people.map((p) => p.stderr),
      Array.from(reference.stderr),
    );

    const { events } = await stream;
    const types = events.map((e: JobEvent) => e.type);
    assert.ok(types.includes('progress'), types.join(','));
    assert.equal(types.at(-1), 'done', types.join(','));

    assert.ok(committed.length > 0, 'some rooms were created during the faults');
    const kept = await db.select({ id: rooms.id }).from(rooms).where(inArray(rooms.id, committed));
    assert.equal(kept.length, committed.length, 'every room answered 201 is still stored');
  });
});
