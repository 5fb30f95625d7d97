import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { newWorkshop } from './workshops-support';

/** Concurrent link changes on one workshop queue on its row instead of deadlocking (and retry if they do). */
describe('concurrent link sheets, reset-claim and revoke', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('90 concurrent requests: no 5xx, and every participant ends with exactly one working sheet link or none', async () => {
    const { client } = await signedInClient(server);
    const names = Array.from({ length: 8 }, (_, i) => ({ name: `Guest ${String(i).padStart(2, '0')}` }));
    const { id, byName } = await newWorkshop(client, names);
    const ids = [...byName.values()];
    const requests = Array.from({ length: 90 }, (_, i) => {
      const pick = ids[i % ids.length];
      const other = ids[(i + 5) % ids.length];
      if (i % 4 === 0) return client.post(`/api/workshops/${id}/links/sheet`, {});
      if (i % 4 === 1) return client.post(`/api/workshops/${id}/links/reissue`, { participantIds: [pick, other], confirm: true });
      if (i % 4 === 2) return client.post(`/api/workshops/${id}/participants/${pick}/reset-claim`);
      return client.post(`/api/workshops/${id}/links/revoke`, { participantIds: [pick, other] });
    });
    const statuses = (await Promise.all(requests)).map((r) => r.status);
    const failures = statuses.filter((s) => s >= 500);
    assert.deepEqual(failures, [], `server errors: ${failures.length} of ${statuses.length}`);
    assert.ok(
      statuses.every((s) => s === 200 || s === 204),
      `all answered: ${[...new Set(statuses)].join(', ')}`,
    );
    const sheet = await client.post(`/api/workshops/${id}/links/sheet`, {});
    assert.equal(sheet.status, 200);
    const detail = await client.get(`/api/workshops/${id}`);
    for (const p of detail.body.participants as { name: string; activeLinks?: number }[]) {
      if (p.activeLinks !== undefined) assert.equal(p.activeLinks, 1, p.name);
    }
  });
});
