import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { createAccount, startTestServer, signedInClient, type TestServer } from '../support/test-server';
import type { TestClient } from '../support/http-client';
import { pool } from '../../server/db';
import { createPathRoom, tieOf } from './rooms-helpers';

async function mailTo(email: string): Promise<{ subject: string; text_body: string }[]> {
  const [rows] = (await pool.query('SELECT subject, text_body FROM mail_messages WHERE envelope_to LIKE ? ORDER BY id', [
    `%${email}%`,
  ])) as unknown as [{ subject: string; text_body: string }[]];
  return rows;
}

describe('rooms: sharing', () => {
  let server: TestServer;
  let owner: TestClient;
  before(async () => {
    server = await startTestServer();
    ({ client: owner } = await signedInClient(server));
  });
  after(async () => server.stop());

  it('shares by e-mail, sends a notification over SMTP, lists, changes role and revokes', async () => {
    const room = await createPathRoom(owner, 3, 'Shared planning room');
    const colleague = await signedInClient(server);
    const share = await owner.post(`/api/rooms/${room.id}/shares`, { email: colleague.account.email.toUpperCase(), role: 'viewer' });
    assert.equal(share.status, 201, share.text);
    assert.equal(share.body.role, 'viewer');
    assert.equal(share.body.notified, true);
    const mails = await mailTo(colleague.account.email);
    const [mail] = mails;
    assert.ok(mail && mails.length === 1, `one mail, got ${mails.length}`);
    assert.match(mail.subject, /shared the room "Shared planning room"/);
    assert.match(mail.text_body, new RegExp(`/rooms/${room.id}`));
    assert.match(mail.text_body, /personal data/);

    const list = await owner.get(`/api/rooms/${room.id}/shares`);
    assert.deepEqual(
      list.body.map((s: { email: string; role: string }) => [s.email, s.role]),
      [[colleague.account.email, 'viewer']],
    );
    assert.equal(
      (await colleague.client.post(`/api/rooms/${room.id}/edits`, { version: 1, ops: [{ op: 'deleteTie', id: tieOf(room, 0).id }] }))
        .status,
      403,
    );

    const promoted = await owner.patch(`/api/rooms/${room.id}/shares/${colleague.account.id}`, { role: 'editor' });
    assert.equal(promoted.status, 200);
    assert.equal(promoted.body.role, 'editor');
    assert.equal(
      (await colleague.client.post(`/api/rooms/${room.id}/edits`, { version: 1, ops: [{ op: 'deleteTie', id: tieOf(room, 0).id }] }))
        .status,
      200,
    );

    assert.equal((await owner.delete(`/api/rooms/${room.id}/shares/${colleague.account.id}`)).status, 204);
    assert.equal((await colleague.client.get(`/api/rooms/${room.id}`)).status, 404);
    assert.equal((await owner.delete(`/api/rooms/${room.id}/shares/${colleague.account.id}`)).status, 404);
  });

  it('says what to fix for unknown accounts, the owner, repeats and bad roles', async () => {
    const room = await createPathRoom(owner, 2, 'Share errors');
    const unknown = await owner.post(`/api/rooms/${room.id}/shares`, { email: 'nobody@test.ripplehall.local', role: 'editor' });
    assert.equal(unknown.status, 400);
    assert.match(unknown.body.error.message, /No active facilitator account/);
    assert.equal(unknown.body.error.details.fields[0].field, 'email');
    const invited = await createAccount('facilitator', 'invited');
    assert.equal((await owner.post(`/api/rooms/${room.id}/shares`, { email: invited.email, role: 'editor' })).status, 400);
    const me = (await owner.get('/api/auth/me')).body.user.email;
    const self = await owner.post(`/api/rooms/${room.id}/shares`, { email: me, role: 'editor' });
    assert.equal(self.status, 400);
    assert.match(self.body.error.message, /owner/);
    const other = await createAccount();
    assert.equal((await owner.post(`/api/rooms/${room.id}/shares`, { email: other.email, role: 'viewer' })).status, 201);
    const again = await owner.post(`/api/rooms/${room.id}/shares`, { email: other.email, role: 'editor' });
    assert.equal(again.status, 409);
    assert.match(again.body.error.message, /already shared/);
    const badRole = await owner.post(`/api/rooms/${room.id}/shares`, { email: other.email, role: 'owner' });
    assert.equal(badRole.status, 400);
    assert.match(badRole.body.error.message, /editor or viewer/);
    const badEmail = await owner.post(`/api/rooms/${room.id}/shares`, { email: 'not-an-email', role: 'viewer' });
    assert.equal(badEmail.status, 400);
  });

  it('an editor cannot share further; a stranger cannot see the shares', async () => {
    const room = await createPathRoom(owner, 2, 'No resharing');
    const editor = await signedInClient(server);
    await owner.post(`/api/rooms/${room.id}/shares`, { email: editor.account.email, role: 'editor' });
    const third = await createAccount();
    const reshare = await editor.client.post(`/api/rooms/${room.id}/shares`, { email: third.email, role: 'editor' });
    assert.equal(reshare.status, 403);
    const stranger = await signedInClient(server);
    assert.equal((await stranger.client.get(`/api/rooms/${room.id}/shares`)).status, 404);
  });
});
