import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { participantLinks } from '../../db/schema/workshops';
import { hashToken } from '../../server/auth/tokens';
import { db } from '../../server/db';
import { openToken, sealToken } from '../../server/participants/link-seal';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { latestMailTo, newWorkshop, sheetTokens, tokenOf } from './workshops-support';

/**
 * A participant keeps one link: printing a sheet and e-mailing again show the same link, and
 * only the facilitator's confirmed reissue (or revoke) ends it, for the chosen people only.
 */
const ROSTER = [
  { name: 'Ines Varga', email: 'ines.varga@example.test' },
  { name: 'Jory Pell', email: 'jory.pell@example.test' },
  { name: 'Kit Amsel' },
  // The mail fake refuses the reserved .invalid domain (RFC 2606): this message cannot be sent.
  { name: 'Lou Brecht', email: 'lou.brecht@mailbox.invalid' },
];

describe('stable participant links', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('an e-mailed link still opens after the facilitator prints a sheet and e-mails again', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    assert.equal((await client.post(`/api/workshops/${id}/links/email`, {})).status, 200);
    const first = tokenOf((await latestMailTo('ines.varga@example.test'))!.textBody ?? '')!;
    const anon = server.client();
    await anon.post(`/api/p/${first}/consent`);
    const answered = await anon.put(`/api/p/${first}/answers`, {
      version: 0,
      nominations: [{ participantId: byName.get('Jory Pell'), level: 'often' }],
    });
    assert.equal(answered.status, 200, answered.text);

    const sheet = await sheetTokens(client, id);
    assert.equal(sheet.get('Ines Varga'), first, 'the sheet shows the link already e-mailed');
    assert.equal((await client.post(`/api/workshops/${id}/links/email`, {})).status, 200);
    const second = tokenOf((await latestMailTo('ines.varga@example.test'))!.textBody ?? '')!;
    assert.equal(second, first, 'the second e-mail carries the same link');
    const state = await anon.get(`/api/p/${first}`);
    assert.equal(state.status, 200);
    assert.equal(state.body.me.name, 'Ines Varga');
    assert.equal(state.body.nominations.length, 1, 'her answers are still behind her link');
    const again = await sheetTokens(client, id);
    assert.deepEqual([...again], [...sheet], 'a reprinted sheet is the same sheet');
    const rows = await db
      .select()
      .from(participantLinks)
      .where(eq(participantLinks.participantId, byName.get('Ines Varga')!));
    assert.equal(rows.length, 1, 'one link, not one per print');
  });

  it('keeps what it needs to show a link again only sealed, and a copy that does not open gives a new link', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    const tokens = await sheetTokens(client, id);
    const kit = tokens.get('Kit Amsel')!;
    const [row] = await db
      .select()
      .from(participantLinks)
      .where(eq(participantLinks.tokenHash, hashToken(kit)));
    assert.ok(row?.tokenSealed && !row.tokenSealed.includes(kit), 'no clear token in the database');
    assert.equal(openToken(row.tokenSealed), kit);
    assert.notEqual(sealToken(kit), sealToken(kit), 'a fresh nonce each time');
    const flipped = row.tokenSealed.slice(0, -2) + (row.tokenSealed.endsWith('A') ? 'B' : 'A') + row.tokenSealed.slice(-1);
    assert.equal(openToken(flipped), undefined, 'GCM refuses an altered copy');
    await db.update(participantLinks).set({ tokenSealed: flipped }).where(eq(participantLinks.id, row.id));
    const next = await sheetTokens(client, id);
    assert.notEqual(next.get('Kit Amsel'), kit, 'a link that cannot be shown again is not shown wrong');
    const anon = server.client();
    assert.equal((await anon.get(`/api/p/${kit}`)).status, 200, 'and the link Kit holds still works');
    assert.equal(byName.size, 4);
  });

  it('reissue needs confirmation and ends only the chosen links', async () => {
    const { client, account } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    const tokens = await sheetTokens(client, id);
    const ines = byName.get('Ines Varga')!;
    const unconfirmed = await client.post(`/api/workshops/${id}/links/reissue`, { participantIds: [ines] });
    assert.equal(unconfirmed.status, 400);
    assert.match(unconfirmed.body.error.message, /confirm/);
    const nobody = await client.post(`/api/workshops/${id}/links/reissue`, { participantIds: [], confirm: true });
    assert.equal(nobody.status, 400);
    const anon = server.client();
    assert.equal((await anon.get(`/api/p/${tokens.get('Ines Varga')}`)).status, 200, 'nothing ended by a refused reissue');

    const done = await client.post(`/api/workshops/${id}/links/reissue`, { participantIds: [ines], confirm: true });
    assert.equal(done.status, 200, done.text);
    assert.equal(done.body.length, 1);
    const fresh = done.body[0].url.split('/p/')[1];
    assert.notEqual(fresh, tokens.get('Ines Varga'));
    assert.equal((await anon.get(`/api/p/${tokens.get('Ines Varga')}`)).status, 404, 'her old link ended');
    assert.equal((await anon.get(`/api/p/${fresh}`)).status, 200, 'her new link works');
    for (const name of ['Jory Pell', 'Kit Amsel', 'Lou Brecht']) {
      assert.equal((await anon.get(`/api/p/${tokens.get(name)}`)).status, 200, `${name} keeps the link`);
    }
    const sheet = await sheetTokens(client, id);
    assert.equal(sheet.get('Ines Varga'), fresh, 'the next sheet shows the reissued link');
    // The audit log names the workshop and the account it belongs to.
    const { client: admin } = await signedInClient(server, 'admin');
    const log = await admin.get('/api/admin/audit?q=links_reissued&pageSize=5');
    const entry = log.body.items.find((r: { targetId: string }) => r.targetId === String(id));
    assert.equal(entry.targetLabel, 'Spring onboarding day');
    assert.equal(entry.targetEmail, account.email);
    assert.equal(entry.actorEmail, account.email);
  });

  it('a failed e-mail leaves the links a person already holds working', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    const lou = byName.get('Lou Brecht')!;
    // First e-mail with no link yet: the unsent link is ended (nobody holds it), so the name stays free on the join page.
    const first = await client.post(`/api/workshops/${id}/links/email`, { participantIds: [lou] });
    assert.equal(first.status, 200, first.text);
    assert.deepEqual(first.body.failed, ['Lou Brecht']);
    const code = (await client.post(`/api/workshops/${id}/join-code`)).body.url.split('/p/join/')[1];
    const join = await server.client().get(`/api/p/join/${code}`);
    assert.equal(join.body.names.find((n: { name: string }) => n.name === 'Lou Brecht').taken, false);

    const printed = (await sheetTokens(client, id)).get('Lou Brecht')!;
    const failed = await client.post(`/api/workshops/${id}/links/email`, {});
    assert.deepEqual(failed.body.failed, ['Lou Brecht']);
    assert.deepEqual(failed.body.sent.sort(), ['Ines Varga', 'Jory Pell']);
    assert.equal((await server.client().get(`/api/p/${printed}`)).status, 200, 'the printed link still opens');
  });
});
