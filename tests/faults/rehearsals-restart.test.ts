/**
 * Real processes, real kill -9: a rehearsal survives the death of the process running it (the
 * queue's stalled-job check hands its chunks to the next process, which finishes it with the
 * numbers an undisturbed run gives), a graceful stop hands running work back, and a second server
 * started on a taken port leaves the first one's jobs alone. The last test kills MariaDB (the fault
 * run's own, scripts/faults.sh) under a process that serves and runs jobs: it must not die.
 */
import assert from 'node:assert/strict';
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { after, before, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { jobs } from '../../db/schema/plans';
import { db } from '../../server/db';
import { simulate } from '../../shared/engine/index';
import type { RehearsalDetail } from '../../shared/api/plans';
import { TestClient } from '../support/http-client';
import { closeFaultTest } from './close';
import { createAccount } from '../support/test-server';
import { makeRoom, ringRoom, type MadeRoom } from '../server/plans-support';
import { firstOf } from '../../shared/checked';

const PORT = Number(process.env['PLANS_TEST_PORT'] ?? 4440);
const url = `http://127.0.0.1:${PORT}`;
// Short locks, so a dead worker's chunks are handed on within seconds.
const CHILD_ENV = { PORT: String(PORT), HOST: '127.0.0.1', LOG_LEVEL: 'warn', JOB_LOCK_SECONDS: '3' };
// Sixteen chunks of 1000 runs: long enough that a poll sees the job running with part of it
// stored (with four, two threads could finish it between two polls on a loaded machine).
const RUNS = 16_000;

interface Child {
  proc: ChildProcess;
  stderr(): string;
  exited: Promise<number | null>;
}

function spawnChild(): Child {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, ...CHILD_ENV },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let err = '';
  proc.stderr!.on('data', (d: Buffer) => (err += d.toString()));
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  return { proc, stderr: () => err, exited };
}

async function startChild(): Promise<Child> {
  const child = spawnChild();
  for (let i = 0; i < 600; i++) {
    if (child.proc.exitCode !== null) throw new Error(`server exited: ${child.stderr()}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return child;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`server did not start: ${child.stderr()}`);
}

async function stopChild(child: Child, signal: NodeJS.Signals): Promise<void> {
  if (child.proc.exitCode === null && child.proc.signalCode === null) child.proc.kill(signal);
  await child.exited;
}

async function jobStatus(id: number): Promise<string> {
  const [row] = await db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, id));
  assert.ok(row, `job ${id} has no row`);
  return row.status;
}

/** Polls the job row (not the HTTP server, which may be down) until it is done, with a deadline. */
async function waitForStatus(id: number, wanted: (s: string, progress: number) => boolean, timeoutMs = 90_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const row = await db
      .select({ status: jobs.status, progress: jobs.progress })
      .from(jobs)
      .where(eq(jobs.id, id))
      .then(([r]) => r)
      .catch(() => undefined); // the database may be restarting
    if (!row) {
      if (Date.now() > until) throw new Error(`job ${id}: the database did not answer within ${timeoutMs} ms`);
      await new Promise((r) => setTimeout(r, 200));
      continue;
    }
    if (wanted(row.status, row.progress)) return;
    if (row.status !== 'queued' && row.status !== 'running')
      throw new Error(`job ${id} ended ${row.status} before the test could act on it`);
    if (Date.now() > until) throw new Error(`job ${id} is ${row.status} at ${row.progress} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('rehearsals across process deaths', () => {
  const children: Child[] = [];
  let client: TestClient;
  let room: MadeRoom;
  let planId: number;
  // Each test rehearses its own seed (the same plan, runs and seed again would be the stored rehearsal).
  const SEEDS = ['taken-port', 'kill-9', 'sigterm', 'db-kill'] as const;
  const undisturbed = new Map<string, number[]>();

  before(async () => {
    // What the engine gives in one thread for this seed (the same chunks and fold as the workers').
    // Computed first: an HTTP connection left idle meanwhile would be closed under the client.
    for (const seed of SEEDS) undisturbed.set(seed, Array.from(simulate(ringRoom(60, 0), [0], RUNS, seed).mean));
    children.push(await startChild());
    const account = await createAccount('facilitator');
    client = new TestClient(url);
    await client.signIn(account.email, account.password);
    room = await makeRoom(client, ringRoom(60, 0), 'Ring for restarts');
    planId = (await client.post(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0]] })).body.id;
  });
  after(async () => {
    for (const c of children) await stopChild(c, 'SIGKILL');
    await closeFaultTest();
  });

  async function start(seed: string): Promise<{ rehearsalId: number; jobId: number }> {
    const live = children.at(-1)!;
    if (live.proc.exitCode !== null) throw new Error(`the server died: ${live.stderr()}`);
    const r = await client.post(`/api/plans/${planId}/rehearsals`, { runs: RUNS, seed });
    assert.equal(r.status, 202, r.text);
    return { rehearsalId: r.body.rehearsal.id, jobId: r.body.job.id };
  }

  async function means(rehearsalId: number): Promise<number[]> {
    const d = (await client.get<RehearsalDetail>(`/api/rehearsals/${rehearsalId}`)).body;
    assert.equal(d.status, 'done');
    assert.equal(d.people.length, 60);
    return d.people.map((p) => p.mean);
  }

  it('a second server started on a taken port exits without touching the first one’s jobs', async () => {
    const { rehearsalId, jobId } = await start('taken-port');
    await waitForStatus(jobId, (s) => s === 'running');
    const second = spawnChild();
    assert.equal(await second.exited, 1);
    assert.match(second.stderr(), new RegExp(`Port ${PORT} is already in use`));
    await waitForStatus(jobId, (s) => s !== 'queued' && s !== 'running');
    assert.equal(await jobStatus(jobId), 'done');
    assert.deepEqual(await means(rehearsalId), undisturbed.get('taken-port'));
  });

  it('kill -9 mid-rehearsal: the next process resumes it and stores the undisturbed numbers', async () => {
    const { rehearsalId, jobId } = await start('kill-9');
    await waitForStatus(jobId, (s, progress) => s === 'running' && progress > 0);
    await stopChild(firstOf(children, 'started servers'), 'SIGKILL');
    assert.equal(await jobStatus(jobId), 'running', 'the killed process could not end its job');
    children.push(await startChild());
    await waitForStatus(jobId, (s) => s !== 'queued' && s !== 'running');
    assert.equal(await jobStatus(jobId), 'done');
    assert.deepEqual(await means(rehearsalId), undisturbed.get('kill-9'));
  });

  it('a graceful stop hands the running rehearsal back; the next process finishes it', async () => {
    const { rehearsalId, jobId } = await start('sigterm');
    await waitForStatus(jobId, (s) => s === 'running');
    await stopChild(children.at(-1)!, 'SIGTERM');
    assert.equal(await jobStatus(jobId), 'running', 'a stop is not the end of the job');
    children.push(await startChild());
    await waitForStatus(jobId, (s) => s !== 'queued' && s !== 'running');
    assert.deepEqual(await means(rehearsalId), undisturbed.get('sigterm'));
  });

  it('kill -9 of MariaDB mid-rehearsal: the server process lives on and the rehearsal ends with the undisturbed numbers', async () => {
    const { rehearsalId, jobId } = await start('db-kill');
    await waitForStatus(jobId, (s, progress) => s === 'running' && progress > 0);
    const live = children.at(-1)!;
    process.kill(Number(readFileSync(`${process.env['DB_RUN_DIR']}/mysqld.pid`, 'utf8').trim()), 'SIGKILL');
    await new Promise((r) => setTimeout(r, 1500));
    execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
    await waitForStatus(jobId, (s) => s !== 'queued' && s !== 'running');
    assert.ok(live.proc.exitCode === null && live.proc.signalCode === null, `the server died:\n${live.stderr()}`);
    assert.equal(await jobStatus(jobId), 'done');
    assert.deepEqual(await means(rehearsalId), undisturbed.get('db-kill'));
    assert.equal((await fetch(`${url}/api/health`)).status, 200);
  });
});
