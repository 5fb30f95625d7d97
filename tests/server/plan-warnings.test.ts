/**
 * Plan warnings have codes: plans saved before then hold their warnings as bare texts, and read
 * back through the API they answer { code, text } with the code their words name ('note' for
 * words that name none). The old texts below are the engine's words of that time, verbatim.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import { pool } from '../../server/db';
import { codeOfOldText, storedWarnings } from '../../server/plans/warnings';
import type { PlanDetail, PlanStarted, PlanSummary, PlanWarning } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom, waitForJob, type MadeRoom } from './plans-support';

/** Each kind of warning as the engine worded it before warnings had codes. */
const OLD: readonly PlanWarning[] = [
  {
    code: 'search-stopped',
    text: 'The search was stopped after 5120 steps with 37 % of the search space still open: the best plan found is returned with its proven gap.',
  },
  {
    code: 'search-time-limit',
    text: 'Time limit reached after 59666 search steps with 0.90 % of the search space still open: the best plan found is returned with its proven gap.',
  },
  { code: 'widening-time-limit', text: 'Time limit reached after 0 of 43 seeds.' },
  { code: 'widening-time-limit', text: 'Time limit reached while widening.' },
  { code: 'swap-time-limit', text: 'Swap polish stopped at the time limit after 1 passes.' },
  {
    code: 'over-dense-limit',
    text: 'The room has 900 people, above the dense limit of 800: exact greedy was used instead of exhaustive.',
  },
  { code: 'over-dense-limit', text: 'The room has 3000 people, above the dense limit of 800: lazy greedy was used instead of swap.' },
  {
    code: 'no-show-not-exhaustive',
    text: 'Too many plans of this size to score each on the expected total: greedy and swap polish were used.',
  },
  { code: 'note', text: 'Something an older server said that no code names.' },
];

describe('plan warnings stored as texts alone (plans saved before warning codes)', () => {
  it('each old text gets the code of its kind; other words, or a near miss, get note', () => {
    for (const w of OLD) assert.equal(codeOfOldText(w.text), w.code, w.text);
    assert.equal(codeOfOldText('Time limit reached.'), 'note');
    assert.equal(codeOfOldText('time limit reached after 3 of 10 seeds.'), 'note');
    assert.equal(codeOfOldText(''), 'note');
  });

  it('a stored list may mix both shapes; an unknown code (from a newer server) reads as note with its text', () => {
    const read = storedWarnings([
      OLD[2]!.text,
      { code: 'swap-time-limit', text: 'Swap polish stopped at the time limit after 2 passes.' },
      { code: 'some-later-kind', text: 'A kind this server does not know.' } as unknown as PlanWarning,
    ]);
    assert.deepEqual(read, [
      { code: 'widening-time-limit', text: OLD[2]!.text },
      { code: 'swap-time-limit', text: 'Swap polish stopped at the time limit after 2 passes.' },
      { code: 'note', text: 'A kind this server does not know.' },
    ]);
    assert.deepEqual(storedWarnings([]), []);
  });
});

describe('an old plan row read back through the API', () => {
  let server: TestServer;
  let client: TestClient;
  let room: MadeRoom;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    room = await makeRoom(client, karateClub(), 'Karate old warnings');
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  async function savedPlan(): Promise<number> {
    const made = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k: 2, method: 'greedy' });
    assert.equal(made.status, 201, made.text);
    return made.body.id;
  }

  async function rawWarnings(planId: number): Promise<unknown> {
    const [rows] = (await pool.query('SELECT warnings FROM plans WHERE id = ?', [planId])) as unknown as [{ warnings: unknown }[]];
    const column = rows[0]!.warnings;
    return typeof column === 'string' ? JSON.parse(column) : column;
  }

  /** The column as the server before warning codes wrote it: a JSON array of strings. */
  async function storeOldWarnings(planId: number, texts: readonly string[]): Promise<void> {
    await pool.query('UPDATE plans SET warnings = ? WHERE id = ?', [JSON.stringify(texts), planId]);
    assert.deepEqual(await rawWarnings(planId), texts, 'the row holds bare texts');
  }

  it('answers { code, text } for every old warning, in the detail and in the room list', async () => {
    const id = await savedPlan();
    await storeOldWarnings(
      id,
      OLD.map((w) => w.text),
    );
    const detail = await client.get<PlanDetail>(`/api/plans/${id}`);
    assert.equal(detail.status, 200, detail.text);
    assert.deepEqual(detail.body.warnings, OLD);
    const list = await client.get<PlanSummary[]>(`/api/rooms/${room.id}/plans`);
    assert.equal(list.status, 200, list.text);
    assert.deepEqual(list.body.find((p) => p.id === id)?.warnings, OLD);
  });

  it('a new plan stores its warnings with their codes and answers them so', async () => {
    // 34 choose 4 = 46 376 plans: too many for the no-show exhaustive to score one by one.
    const r = await client.post<PlanStarted>(`/api/rooms/${room.id}/plans`, { k: 4, method: 'exhaustive', noShow: 0.1 });
    assert.equal(r.status, 202, r.text);
    const job = await waitForJob(client, r.body.job.id);
    assert.equal(job.status, 'done', job.message ?? '');
    const expected = [
      {
        code: 'no-show-not-exhaustive',
        text: 'Too many plans of this size to score each on the expected total: greedy and swap polish were used.',
      },
    ];
    assert.deepEqual(await rawWarnings(r.body.plan.id), expected);
    assert.deepEqual((await client.get<PlanDetail>(`/api/plans/${r.body.plan.id}`)).body.warnings, expected);
  });
});
