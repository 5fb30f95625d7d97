import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { and, desc, eq } from 'drizzle-orm';
import { auditLog } from '../../db/schema/accounts';
import { db } from '../../server/db';
import { createAccount, signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { createPathRoom } from './rooms-helpers';
import { newWorkshop } from './workshops-support';

/** Room access that a workshop gives follows the workshop role, and every change is audited. */
describe('co-facilitators and the workshop room', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  async function setUp() {
    const { client: owner } = await signedInClient(server);
    const co = await createAccount('facilitator');
    const coClient = server.client();
    await coClient.signIn(co.email, co.password);
    const room = await createPathRoom(owner, 3);
    const made = await owner.post('/api/workshops', {
      title: 'Room access day',
      sessionDate: '2026-05-04',
      roomId: room.id,
      nominationLimit: 3,
    });
    assert.equal(made.status, 201, made.text);
    return { owner, co, coClient, roomId: room.id, workshopId: made.body.id as number };
  }

  const lastAudit = async (action: string, workshopId: number) => {
    const [row] = await db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, action), eq(auditLog.targetId, String(workshopId))))
      .orderBy(desc(auditLog.id))
      .limit(1);
    return row;
  };

  it('removing a co-facilitator ends their editor access and export of the room', async () => {
    const { owner, co, coClient, roomId, workshopId } = await setUp();
    assert.equal((await owner.post(`/api/workshops/${workshopId}/facilitators`, { email: co.email })).status, 201);
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).body.access, 'editor');
    assert.equal((await coClient.get(`/api/rooms/${roomId}/export?format=people-csv`)).status, 200);
    assert.equal((await owner.delete(`/api/workshops/${workshopId}/facilitators/${co.id}`)).status, 204);
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).status, 404, 'no access left');
    assert.equal((await coClient.get(`/api/rooms/${roomId}/export?format=people-csv`)).status, 404, 'no export of the people');
    const rooms = await coClient.get('/api/rooms?scope=all');
    assert.ok(!rooms.body.items.some((r: { id: number }) => r.id === roomId), 'the room left their list');
    const removed = await lastAudit('workshop.facilitator_removed', workshopId);
    assert.ok(removed, 'the removal is audited');
    assert.deepEqual({ ...(removed.detail as object) }, { userId: co.id, roomId, directShare: null, roomAccess: 'none' });
    assert.equal((await owner.delete(`/api/workshops/${workshopId}/facilitators/${co.id}`)).status, 404, 'removing twice');
  });

  it('deleting the workshop ends the access it gave, and says so in the audit log', async () => {
    const { owner, co, coClient, roomId, workshopId } = await setUp();
    await owner.post(`/api/workshops/${workshopId}/facilitators`, { email: co.email });
    assert.equal((await coClient.patch(`/api/rooms/${roomId}`, { version: 1, name: 'Renamed by co' })).status, 200);
    assert.equal((await owner.delete(`/api/workshops/${workshopId}`)).status, 204);
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).status, 404);
    const deleted = await lastAudit('workshop.deleted', workshopId);
    assert.ok(deleted, 'the deletion is audited');
    assert.deepEqual((deleted.detail as { roomAccessEnded: number[] }).roomAccessEnded, [co.id]);
  });

  it('a direct viewer share is neither upgraded for good nor lost', async () => {
    const { owner, co, coClient, roomId, workshopId } = await setUp();
    assert.equal((await owner.post(`/api/rooms/${roomId}/shares`, { email: co.email, role: 'viewer' })).status, 201);
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).body.access, 'viewer');
    await owner.post(`/api/workshops/${workshopId}/facilitators`, { email: co.email });
    const shares = await owner.get(`/api/rooms/${roomId}/shares`);
    assert.equal(shares.body.find((s: { userId: number }) => s.userId === co.id).role, 'viewer', 'the share itself stays viewer');
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).body.access, 'editor', 'editor while co-facilitating');
    const added = await lastAudit('workshop.facilitator_added', workshopId);
    assert.ok(added, 'the addition is audited');
    assert.equal((added.detail as { directShare: string }).directShare, 'viewer');
    await owner.delete(`/api/workshops/${workshopId}/facilitators/${co.id}`);
    assert.equal((await coClient.get(`/api/rooms/${roomId}`)).body.access, 'viewer', 'back to the share the owner gave');
    assert.equal((await coClient.patch(`/api/rooms/${roomId}`, { name: 'Not allowed' })).status, 403);
  });

  it('deleting a participant or co-facilitator by a malformed or unknown id answers 404', async () => {
    const { client: owner } = await signedInClient(server);
    const { id, byName } = await newWorkshop(owner, [{ name: 'Ada Example' }, { name: 'Bo Example' }]);
    for (const bad of ['garbage', '0x1', '1e3', '99999999']) {
      assert.equal((await owner.delete(`/api/workshops/${id}/participants/${bad}`)).status, 404, bad);
      assert.equal((await owner.delete(`/api/workshops/${id}/facilitators/${bad}`)).status, 404, bad);
    }
    assert.equal((await owner.delete(`/api/workshops/${id}/participants/${byName.get('Ada Example')}`)).status, 204);
  });
});
