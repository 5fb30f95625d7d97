/**
 * A stored plan's numbers equal the command line's for the same room and options: the room is
 * exported through the rooms API to a file and `npm run -s cli -- plan` runs as a child process.
 * The CLI is a separate entry (file parsing, its own process), so this checks the whole path
 * request -> snapshot -> worker -> database -> response against an independent run of the engine.
 */
import assert from 'node:assert/strict';
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { promisify } from 'node:util';
import { closePools } from '../../server/jobs/pools';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, ringRoom, waitForJob, type MadeRoom } from './plans-support';
import { itemAt } from '../../shared/checked';

const run = promisify(execFile);
const dir = mkdtempSync(join(tmpdir(), 'rh-plans-cli-'));

async function cli(args: string[]): Promise<Record<string, unknown>> {
  const { stdout } = await run('npx', ['tsx', 'shared/engine/cli/main.ts', ...args], { cwd: process.cwd(), maxBuffer: 1 << 24 });
  return JSON.parse(stdout) as Record<string, unknown>;
}

async function exportRoom(client: TestClient, room: MadeRoom, name: string): Promise<string> {
  const r = await client.get(`/api/rooms/${room.id}/export?format=json`);
  assert.equal(r.status, 200, r.text);
  const file = join(dir, `${name}.json`);
  writeFileSync(file, r.text);
  return file;
}

function close(a: number, b: number, what: string) {
  assert.ok(Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b)), `${what}: server ${a} vs CLI ${b}`);
}

describe('plans agree with the command line', () => {
  let server: TestServer;
  let client: TestClient;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  async function compare(room: MadeRoom, file: string, body: Record<string, unknown>, flags: string[]) {
    let r = await client.post(`/api/rooms/${room.id}/plans`, body);
    if (r.status === 202) {
      const job = await waitForJob(client, r.body.job.id);
      assert.equal(job.status, 'done', job.message ?? '');
      r = await client.get(`/api/plans/${r.body.plan.id}`);
    }
    assert.ok(r.status === 200 || r.status === 201, r.text);
    const plan = r.body;
    const out = await cli(['plan', '--graph', file, ...flags]);
    const keyOf = new Map(room.personIds.map((id, i) => [id, room.keys[i]]));
    assert.deepEqual(
      plan.starters.map((s: { personId: number }) => keyOf.get(s.personId)),
      out['starters'],
      'same starters in the same order',
    );
    assert.equal(plan.methodUsed, out['method']);
    close(plan.total, out['total'] as number, 'total');
    close(plan.average, out['average'] as number, 'room average');
    close(plan.qualityRank, out['rank'] as number, 'quality rank');
    close(plan.lowerBound, out['lowerBound'] as number, 'lower bound');
    close(plan.gap, out['gap'] as number, 'gap');
    assert.equal(plan.certified, out['certified']);
    assert.equal(plan.coverSize, out['coverSize']);
    // Per-person hops add up to the stored total (starters at 0).
    const sum = plan.perPerson.reduce((s: number, p: { expectedHops: number }) => s + p.expectedHops, 0);
    close(sum, plan.total, 'sum of per-person expected hops');
    return plan;
  }

  it('karate club (Zachary 1977): greedy, widened, swap, exhaustive and auto for k = 1..4', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate club');
    const file = await exportRoom(client, room, 'karate');
    for (const k of [1, 2, 3, 4]) {
      for (const method of ['greedy', 'widened', 'swap']) await compare(room, file, { k, method }, ['--k', String(k), '--method', method]);
    }
    await compare(room, file, { k: 3, method: 'exhaustive' }, ['--k', '3', '--method', 'exhaustive']);
    await compare(room, file, { k: 2, method: 'auto' }, ['--k', '2', '--method', 'auto']);
  });

  it('with must-brief and cannot-brief people, laziness and mixing', async () => {
    const graph = ringRoom(60, 90, 11);
    const room = await makeRoom(client, graph, 'Ring room', { laziness: 0.2, mixing: 0.05 });
    const file = await exportRoom(client, room, 'ring');
    const walk = ['--laziness', '0.2', '--mixing', '0.05'];
    const must = [room.personIds[5]];
    const cannot = [room.personIds[0], room.personIds[1]];
    const plan = await compare(room, file, { k: 4, method: 'swap', mustBrief: must, cannotBrief: cannot }, [
      '--k',
      '4',
      '--method',
      'swap',
      '--include',
      itemAt(room.keys, 5, 'room key'),
      '--exclude',
      `${itemAt(room.keys, 0, 'room key')},${itemAt(room.keys, 1, 'room key')}`,
      ...walk,
    ]);
    assert.ok(plan.starters.some((s: { personId: number }) => s.personId === must[0]));
    assert.ok(!plan.starters.some((s: { personId: number }) => cannot.includes(s.personId)));
    assert.deepEqual(plan.settings, { directed: false, minutesPerHop: 5, laziness: 0.2, mixing: 0.05 });
  });

  it('a hand-made plan gets the same total as the CLI reach of those starters', async () => {
    const room = await makeRoom(client, karateClub(), 'Karate hand-made');
    const file = await exportRoom(client, room, 'karate-hand');
    const picks = [3, 10, 20];
    const r = await client.post(`/api/rooms/${room.id}/plans`, { starters: picks.map((i) => room.personIds[i]) });
    assert.equal(r.status, 201, r.text);
    const out = await cli(['reach', '--graph', file, '--starters', picks.map((i) => room.keys[i]).join(',')]);
    close(r.body.total, out['total'] as number, 'total');
    close(r.body.average, out['average'] as number, 'room average');
    assert.equal(r.body.methodUsed, 'hand-made');
    assert.ok(r.body.gap >= 0 && r.body.lowerBound <= r.body.total);
  });
});
