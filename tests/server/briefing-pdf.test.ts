/**
 * The briefing sheet's PDF carries what the screen sheet has: the starters with a "Briefed at"
 * column, the expectations and the clock-time section for the chosen start time, in 24-hour
 * time. Text read back with pdf-parse (pdf.js), not by our own code.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { closePools } from '../../server/jobs/pools';
import type { BriefingSheet, PlanDetail } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';
import { pdfText } from '../support/pdf-text';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import { karateClub, makeRoom } from './plans-support';

describe('briefing sheet PDF', () => {
  let server: TestServer;
  let client: TestClient;
  let plan: PlanDetail;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
    const room = await makeRoom(client, karateClub(), 'Karate sheet', { minutesPerHop: 7 });
    const r = await client.post<PlanDetail>(`/api/rooms/${room.id}/plans`, { k: 3, method: 'greedy' });
    assert.equal(r.status, 201, r.text);
    plan = r.body;
  });
  after(async () => {
    await closePools();
    await server.stop();
  });

  const pdf = (query: string) =>
    fetch(`${server.url}/api/plans/${plan.id}/briefing.pdf${query}`, { headers: { cookie: client.cookieHeader() } });

  it('has the starters, the Briefed at column and the clock times for the chosen start, 24-hour', async () => {
    const sheet = (await client.get<BriefingSheet>(`/api/plans/${plan.id}/briefing`)).body;
    const res = await pdf('?start=22:50');
    assert.equal(res.status, 200);
    const text = await pdfText(await res.arrayBuffer());
    assert.match(text, /Briefed at/);
    for (const s of sheet.starters) assert.ok(text.includes(s.name), `starter ${s.name} on the PDF`);
    assert.match(text, /Clock times if the message goes out at 22:50/);
    const timed = sheet.expectations.filter((e) => e.minutes !== null);
    assert.ok(timed.length > 0, 'the sheet has timed expectations');
    for (const e of timed) {
      // Worked by hand: 22:50 is minute 1370 of the day; add the expected minutes, wrap past midnight.
      const t = Math.round(1370 + e.minutes!);
      const hhmm = `${String(Math.floor(t / 60) % 24).padStart(2, '0')}:${String(t % 60).padStart(2, '0')}`;
      assert.ok(text.includes(`${Math.round(e.share * 100)}% will have heard by about ${hhmm}`), `${e.share} at ${hhmm}:\n${text}`);
    }
    assert.doesNotMatch(text, /\b(AM|PM)\b/);
  });

  it('defaults to 09:00 and refuses a 12-hour or malformed start time', async () => {
    const text = await pdfText(await (await pdf('')).arrayBuffer());
    assert.match(text, /goes out at 09:00/);
    for (const bad of ['9am', '25:00', '09:00 PM']) {
      const r = await pdf(`?start=${encodeURIComponent(bad)}`);
      assert.equal(r.status, 400, bad);
      assert.match(((await r.json()) as { error: { message: string } }).error.message, /24-hour time/);
    }
  });
});
