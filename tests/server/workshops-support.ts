import { desc, like } from 'drizzle-orm';
import { mailMessages } from '../../db/schema/mail';
import { db } from '../../server/db';
import type { TestClient } from '../support/http-client';
import { signedInClient, type TestServer } from '../support/test-server';

/** Helpers shared by the workshops server tests. */
export async function newWorkshop(c: TestClient, names: { name: string; email?: string }[], title = 'Spring onboarding day') {
  const created = await c.post('/api/workshops', { title, sessionDate: '2026-04-21', roomId: null, nominationLimit: 3 });
  if (created.status !== 201) throw new Error(`create failed: ${created.status} ${created.text}`);
  const id = created.body.id as number;
  const added = await c.post(`/api/workshops/${id}/participants`, { people: names.map((n) => ({ name: n.name, email: n.email ?? null })) });
  if (added.status !== 201) throw new Error(`participants failed: ${added.text}`);
  const detail = await c.get(`/api/workshops/${id}`);
  const byName = new Map<string, number>(detail.body.participants.map((p: { name: string; id: number }) => [p.name, p.id]));
  return { id, byName };
}

/** Everyone's own link, as on a printed sheet: name -> token. */
export async function sheetTokens(c: TestClient, workshopId: number): Promise<Map<string, string>> {
  const sheet = await c.post(`/api/workshops/${workshopId}/links/sheet`, {});
  if (sheet.status !== 200) throw new Error(`sheet failed: ${sheet.text}`);
  return new Map(sheet.body.map((l: { name: string; url: string }) => [l.name, l.url.split('/p/')[1]]));
}

export async function latestMailTo(address: string) {
  const [row] = await db
    .select()
    .from(mailMessages)
    .where(like(mailMessages.envelopeTo, `%${address}%`))
    .orderBy(desc(mailMessages.id))
    .limit(1);
  return row;
}

export const tokenOf = (text: string) => /\/p\/([A-Za-z0-9_-]{43})/.exec(text)?.[1];

/** A workshop collecting answers from Mira Tollan and Oskar Bruhn, titled `title`: Mira's link token. */
export async function collectingLinkFor(server: TestServer, title: string): Promise<string> {
  const { client: c } = await signedInClient(server);
  const { id } = await newWorkshop(c, [{ name: 'Mira Tollan' }, { name: 'Oskar Bruhn' }], title);
  await c.post(`/api/workshops/${id}/status`, { to: 'collecting' });
  return (await sheetTokens(c, id)).get('Mira Tollan')!;
}
