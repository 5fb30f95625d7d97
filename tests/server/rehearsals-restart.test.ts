/**
 * A real restart in the middle of a rehearsal: a child server process is killed (SIGKILL, no
 * chance to clean up) while its job runs; the next process marks the job interrupted on start,
 * shows no results for it, and lets it be re-run from its seed.
 */
import assert from 'node:assert/strict';
import { spawn, type ChildProcess } from 'node:child_process';
import { after, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { jobs } from '../../db/schema/plans';
import { db, pool } from '../../server/db';
import { TestClient } from '../support/http-client';
import { createAccount } from '../support/test-server';
import { makeRoom, ringRoom } from './plans-support';

const PORT = Number(process.env['PLANS_TEST_PORT'] ?? 4440);
const url = `http://127.0.0.1:${PORT}`;

async function startChild(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, PORT: String(PORT), HOST: '127.0.0.1', LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let err = '';
  child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
  for (let i = 0; i < 300; i++) {
    if (child.exitCode !== null) throw new Error(`server exited: ${err}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return child;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`server did not start: ${err}`);
}

function stopChild(child: ChildProcess, signal: NodeJS.Signals): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

describe('restart in the middle of a rehearsal', () => {
  const children: ChildProcess[] = [];
  after(async () => {
    for (const c of children) await stopChild(c, 'SIGKILL');
    await pool.end();
  });

  it('marks the job interrupted, never shows partial results, and re-runs it', async () => {
    children.push(await startChild());
    const account = await createAccount('facilitator');
    const client = new TestClient(url);
    await client.signIn(account.email, account.password);
    const room = await makeRoom(client, ringRoom(300, 0), 'Slow ring for restart');
    const plan = (await client.post(`/api/rooms/${room.id}/plans`, { starters: [room.personIds[0]] })).body;
    const start = (await client.post(`/api/plans/${plan.id}/rehearsals`, { runs: 5000, seed: 'kill-9' })).body;
    let job = (await client.get(`/api/jobs/${start.job.id}`)).body;
    for (let i = 0; i < 300 && !(job.status === 'running' && job.progress > 0); i++) {
      await new Promise((r) => setTimeout(r, 50));
      job = (await client.get(`/api/jobs/${start.job.id}`)).body;
    }
    assert.equal(job.status, 'running');
    await stopChild(children[0], 'SIGKILL');
    const [left] = await db.select().from(jobs).where(eq(jobs.id, start.job.id));
    assert.equal(left.status, 'running', 'the killed process could not end its job');

    children.push(await startChild());
    const d = (await client.get(`/api/rehearsals/${start.rehearsal.id}`)).body;
    assert.equal(d.status, 'interrupted');
    assert.match(d.message, /nothing partial was kept/);
    assert.equal(d.average, null);
    assert.equal(d.verdict, null);
    assert.deepEqual(d.people, []);
    const rerun = await client.post(`/api/rehearsals/${start.rehearsal.id}/rerun`, {});
    assert.equal(rerun.status, 202, rerun.text);
    assert.equal(rerun.body.rehearsal.seed, 'kill-9');
    assert.equal(rerun.body.rehearsal.runs, 5000);
    // A graceful stop (SIGTERM) also ends open jobs as interrupted instead of leaving them running.
    for (let i = 0; i < 100 && (await client.get(`/api/jobs/${rerun.body.job.id}`)).body.status !== 'running'; i++)
      await new Promise((r) => setTimeout(r, 50));
    await stopChild(children[1], 'SIGTERM');
    const [stopped] = await db.select().from(jobs).where(eq(jobs.id, rerun.body.job.id));
    assert.equal(stopped.status, 'interrupted');
  });
});
