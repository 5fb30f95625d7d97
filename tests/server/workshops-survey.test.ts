import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { eq } from 'drizzle-orm';
import { participantLinks } from '../../db/schema/workshops';
import { hashToken } from '../../server/auth/tokens';
import { db } from '../../server/db';
import { LINK_INVALID_MESSAGE } from '../../shared/api/workshops';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { latestMailTo, newWorkshop, sheetTokens, tokenOf } from './workshops-support';

const ROSTER = [
  { name: 'Ada Quillon', email: 'ada.quillon@example.test' },
  { name: 'Bram Osterfeld', email: 'bram.osterfeld@example.test' },
  { name: 'Cleo Marwick' },
  { name: 'Dov Tallis' },
  { name: 'Edda Prinn' },
];

describe('workshop survey links', () => {
  let server: TestServer;
  before(async () => (server = await startTestServer()));
  after(async () => server.stop());

  it('moves through the statuses only along the allowed moves, with clear 409s', async () => {
    const { client } = await signedInClient(server);
    const empty = await client.post('/api/workshops', { title: 'Empty', sessionDate: '2026-04-21', roomId: null });
    const tooFew = await client.post(`/api/workshops/${empty.body.id}/status`, { to: 'collecting' });
    assert.equal(tooFew.status, 409);
    assert.match(tooFew.body.error.message, /at least two participants/);
    const { id } = await newWorkshop(client, ROSTER);
    const skip = await client.post(`/api/workshops/${id}/status`, { to: 'debrief' });
    assert.equal(skip.status, 409);
    assert.match(skip.body.error.message, /“Draft” cannot move to “Debrief”; it can move to “Collecting answers” or “Closed”/);
    assert.equal((await client.post(`/api/workshops/${id}/status`, { to: 'collecting' })).body.status, 'collecting');
    assert.equal((await client.post(`/api/workshops/${id}/status`, { to: 'running' })).body.status, 'running');
    const noResults = await client.post(`/api/workshops/${id}/status`, { to: 'debrief' });
    assert.equal(noResults.status, 409);
    assert.match(noResults.body.error.message, /Release the results first/);
    assert.equal((await client.post(`/api/workshops/${id}/status`, { to: 'closed' })).body.status, 'closed');
    const reopen = await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    assert.equal(reopen.status, 409);
    assert.match(reopen.body.error.message, /cannot be reopened/);
    const bogus = await client.post(`/api/workshops/${id}/status`, { to: 'finished' });
    assert.equal(bogus.status, 400);
  });

  it('e-mails personal links in text and HTML and stores only the hash of each token', async () => {
    const { client } = await signedInClient(server);
    const { id } = await newWorkshop(client, ROSTER);
    const sent = await client.post(`/api/workshops/${id}/links/email`, {});
    assert.equal(sent.status, 200, sent.text);
    assert.deepEqual(sent.body.sent.sort(), ['Ada Quillon', 'Bram Osterfeld']);
    assert.equal(sent.body.withoutEmail.length, 3);
    const mail = await latestMailTo('ada.quillon@example.test');
    assert.ok(mail, 'the mail fake caught the message');
    const token = tokenOf(mail.textBody ?? '');
    assert.ok(token, 'the text part carries the link');
    assert.ok((mail.htmlBody ?? '').includes(token!), 'the HTML part carries the same link');
    // 43 base64url characters = 256 bits of randomness.
    assert.equal(token!.length, 43);
    const rows = await db.select().from(participantLinks);
    assert.ok(rows.some((r) => r.tokenHash === hashToken(token!)));
    assert.ok(rows.every((r) => !r.tokenHash.includes(token!) && r.tokenHash.length === 64));
    const anon = server.client();
    const state = await anon.get(`/api/p/${token}`);
    assert.equal(state.status, 200);
    assert.equal(state.body.me.name, 'Ada Quillon');
    assert.ok(!state.body.names.some((n: { name: string }) => n.name === 'Ada Quillon'), 'one cannot pick oneself from the list');
  });

  it('gives the same answer for made-up, revoked and expired links', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    const tokens = await sheetTokens(client, id);
    const anon = server.client();
    const bram = tokens.get('Bram Osterfeld')!;
    assert.equal((await anon.get(`/api/p/${bram}`)).status, 200);
    await client.post(`/api/workshops/${id}/links/revoke`, { participantIds: [byName.get('Bram Osterfeld')] });
    const revoked = await anon.get(`/api/p/${bram}`);
    const cleo = tokens.get('Cleo Marwick')!;
    await db
      .update(participantLinks)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(participantLinks.tokenHash, hashToken(cleo)));
    const expired = await anon.get(`/api/p/${cleo}`);
    const madeUp = await anon.get(`/api/p/${'A'.repeat(43)}`);
    const malformed = await anon.get('/api/p/not-a-token');
    for (const r of [revoked, expired, madeUp, malformed]) {
      assert.equal(r.status, 404);
      assert.deepEqual(r.body.error, { code: 'link_invalid', message: LINK_INVALID_MESSAGE });
    }
    // A second sheet shows the same live links; the revoked and expired ones get new links.
    const again = await sheetTokens(client, id);
    assert.equal(again.get('Dov Tallis'), tokens.get('Dov Tallis'));
    assert.notEqual(again.get('Bram Osterfeld'), bram);
    assert.equal((await anon.get(`/api/p/${again.get('Bram Osterfeld')}`)).status, 200);
  });

  it('validates answers: consent first, unknown people, too many, oneself, duplicates, after closing', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    const tokens = await sheetTokens(client, id);
    const anon = server.client();
    const ada = tokens.get('Ada Quillon')!;
    const me = byName.get('Ada Quillon')!;
    const [b, c, d, e] = ['Bram Osterfeld', 'Cleo Marwick', 'Dov Tallis', 'Edda Prinn'].map((n) => byName.get(n)!);
    const notOpen = await anon.post(`/api/p/${ada}/consent`);
    assert.equal(notOpen.status, 409);
    assert.match(notOpen.body.error.message, /has not opened yet/);
    await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    const noConsent = await anon.put(`/api/p/${ada}/answers`, { version: 0, nominations: [{ participantId: b, level: 'often' }] });
    assert.equal(noConsent.status, 409);
    assert.match(noConsent.body.error.message, /privacy notice/);
    assert.equal((await anon.post(`/api/p/${ada}/consent`)).body.consented, true);
    const put = (nominations: unknown[], version = 0) => anon.put(`/api/p/${ada}/answers`, { version, nominations });
    const self = await put([{ participantId: me, level: 'often' }]);
    assert.equal(self.body.error.code, 'self_nomination');
    const dup = await put([
      { participantId: b, level: 'often' },
      { participantId: b, level: 'weekly' },
    ]);
    assert.equal(dup.body.error.code, 'duplicate_nomination');
    const many = await put([b, c, d, e].map((p) => ({ participantId: p, level: 'sometimes' })));
    assert.equal(many.status, 400);
    assert.match(many.body.error.message, /picked 4 people; this survey asks for at most 3\. Remove 1/);
    const other = await newWorkshop(client, [{ name: 'Outsider One' }, { name: 'Outsider Two' }], 'Another session');
    const stranger = other.byName.get('Outsider One')!;
    const unknown = await put([
      { participantId: b, level: 'often' },
      { participantId: stranger, level: 'often' },
    ]);
    assert.equal(unknown.body.error.code, 'unknown_people');
    assert.deepEqual(unknown.body.error.details.unknown, [stranger]);
    const badLevel = await put([{ participantId: b, level: 'hourly' }]);
    assert.equal(badLevel.status, 400);
    assert.match(badLevel.body.error.message, /how often/);
    const empty = await put([]);
    assert.equal(empty.status, 400);
    assert.equal(empty.body.error.code, 'empty_answer');
    assert.match(empty.body.error.message, /I talk to nobody here regularly/);
    assert.equal((await anon.get(`/api/p/${ada}`)).body.savedAt, null, 'an empty answer is not saved');
    const both = await anon.put(`/api/p/${ada}/answers`, { version: 0, nominations: [{ participantId: b, level: 'often' }], nobody: true });
    assert.equal(both.body.error.code, 'nobody_with_names');
    const nobody = await anon.put(`/api/p/${ada}/answers`, { version: 0, nominations: [], nobody: true });
    assert.equal(nobody.status, 200, nobody.text);
    assert.equal(nobody.body.nobody, true);
    const ok = await put(
      [
        { participantId: b, level: 'often' },
        { participantId: c, level: 'weekly' },
      ],
      1,
    );
    assert.equal(ok.status, 200, ok.text);
    assert.equal(ok.body.version, 2);
    assert.equal(ok.body.nominations.length, 2);
    assert.equal(ok.body.nobody, false);
    // A revision from the same page (version 2) replaces the answers.
    const revised = await put([{ participantId: d, level: 'sometimes' }], 2);
    assert.equal(revised.body.version, 3);
    assert.deepEqual(revised.body.nominations, [{ participantId: d, level: 'sometimes' }]);
    await client.post(`/api/workshops/${id}/status`, { to: 'running' });
    const late = await put([{ participantId: b, level: 'often' }], 3);
    assert.equal(late.status, 409);
    assert.equal(late.body.error.code, 'survey_closed');
    const kept = await anon.get(`/api/p/${ada}`);
    assert.deepEqual(kept.body.nominations, [{ participantId: d, level: 'sometimes' }], 'nothing saved is lost');
    assert.equal(kept.body.open, false);
  });

  it('two browsers answering for one person: the second save from a stale page gets the saved answers back', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, ROSTER);
    const tokens = await sheetTokens(client, id);
    await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    const phone = server.client();
    const laptop = server.client();
    const edda = tokens.get('Edda Prinn')!;
    await phone.post(`/api/p/${edda}/consent`);
    const v = (await laptop.get(`/api/p/${edda}`)).body.version;
    const first = await phone.put(`/api/p/${edda}/answers`, {
      version: v,
      nominations: [{ participantId: byName.get('Ada Quillon'), level: 'often' }],
    });
    assert.equal(first.status, 200);
    const second = await laptop.put(`/api/p/${edda}/answers`, {
      version: v,
      nominations: [{ participantId: byName.get('Dov Tallis'), level: 'weekly' }],
    });
    assert.equal(second.status, 409);
    assert.equal(second.body.error.code, 'answers_changed');
    assert.match(second.body.error.message, /another browser/);
    assert.deepEqual(second.body.error.details.nominations, [{ participantId: byName.get('Ada Quillon'), level: 'often' }]);
    const retry = await laptop.put(`/api/p/${edda}/answers`, {
      version: second.body.error.details.version,
      nominations: [{ participantId: byName.get('Dov Tallis'), level: 'weekly' }],
    });
    assert.equal(retry.status, 200);
  });

  it('the join page: each name once, a clear message when taken or all taken, the facilitator can reset', async () => {
    const { client } = await signedInClient(server);
    const { id, byName } = await newWorkshop(client, [{ name: 'Fay Lindqvist' }, { name: 'Gus Harrow' }, { name: 'Hana Oort' }]);
    await client.post(`/api/workshops/${id}/status`, { to: 'collecting' });
    // Hana already has a printed link: the QR code must not let someone else answer as her.
    await client.post(`/api/workshops/${id}/links/sheet`, { participantIds: [byName.get('Hana Oort')] });
    const code = await client.post(`/api/workshops/${id}/join-code`);
    assert.match(code.body.qr, /^data:image\/svg\+xml;base64,/);
    const joinCode = code.body.url.split('/p/join/')[1];
    const a = server.client();
    const b = server.client();
    const state = await a.get(`/api/p/join/${joinCode}`);
    assert.deepEqual(
      state.body.names.map((n: { name: string; taken: boolean }) => [n.name, n.taken]),
      [
        ['Fay Lindqvist', false],
        ['Gus Harrow', false],
        ['Hana Oort', true],
      ],
    );
    const hana = await a.post(`/api/p/join/${joinCode}/claim`, { participantId: byName.get('Hana Oort') });
    assert.equal(hana.body.error.code, 'name_taken');
    assert.match(hana.body.error.message, /already taken/);
    const fay = byName.get('Fay Lindqvist')!;
    const claimed = await a.post(`/api/p/join/${joinCode}/claim`, { participantId: fay });
    assert.equal(claimed.status, 201);
    assert.equal((await a.get(`/api/p${claimed.body.path.slice(2)}`)).body.me.name, 'Fay Lindqvist');
    const again = await b.post(`/api/p/join/${joinCode}/claim`, { participantId: fay });
    assert.equal(again.body.error.code, 'name_taken');
    await b.post(`/api/p/join/${joinCode}/claim`, { participantId: byName.get('Gus Harrow') });
    const full = await server.client().post(`/api/p/join/${joinCode}/claim`, { participantId: fay });
    assert.equal(full.body.error.code, 'all_names_taken');
    assert.match(full.body.error.message, /Every name on the list has been picked/);
    await client.post(`/api/workshops/${id}/participants/${fay}/reset-claim`);
    assert.equal((await a.get(`/api/p${claimed.body.path.slice(2)}`)).status, 404, 'the reset revokes the earlier link');
    assert.equal((await b.post(`/api/p/join/${joinCode}/claim`, { participantId: fay })).status, 201);
    // Once the survey closes, the QR code says so and no name can be picked.
    await client.post(`/api/workshops/${id}/participants/${fay}/reset-claim`);
    await client.post(`/api/workshops/${id}/status`, { to: 'running' });
    const closed = await a.get(`/api/p/join/${joinCode}`);
    assert.equal(closed.body.open, false);
    assert.equal(closed.body.status, 'running');
    const late = await b.post(`/api/p/join/${joinCode}/claim`, { participantId: fay });
    assert.equal(late.status, 409);
    assert.equal(late.body.error.code, 'join_closed');
    assert.match(late.body.error.message, /survey is closed/);
    // A new QR code replaces the old one.
    await client.post(`/api/workshops/${id}/join-code`);
    assert.equal((await a.get(`/api/p/join/${joinCode}`)).status, 404);
  });

  it('reads a roster CSV and reports each bad line', async () => {
    const { client } = await signedInClient(server);
    const created = await client.post('/api/workshops', { title: 'Roster', sessionDate: '2026-04-21', roomId: null });
    const csv = 'name,e-mail\nIvo Brandt,ivo@example.test\n,nobody@example.test\nJun Okafor,not-an-address\nIvo Brandt,\nKai Rhee,\n';
    const r = await client.post(`/api/workshops/${created.body.id}/participants/roster`, { csv });
    assert.equal(r.status, 201, r.text);
    assert.equal(r.body.added, 2);
    assert.deepEqual(
      r.body.issues.map((i: { line: number }) => i.line),
      [3, 4, 5],
    );
    const bad = await client.post(`/api/workshops/${created.body.id}/participants/roster`, { csv: 'name\n\n' });
    assert.equal(bad.status, 400);
  });
});
