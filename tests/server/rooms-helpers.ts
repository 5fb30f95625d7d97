/** Helpers shared by the rooms server tests. */
import { itemAt } from '../../shared/checked';
import type { TestClient } from '../support/http-client';

export interface SmallRoom {
  id: number;
  version: number;
  people: { id: number; key: string; name: string }[];
  ties: { id: number; sourceId: number; targetId: number; strength: number }[];
}

/** The room's person `i` (in creation order); a missing one fails the test with a clear message. */
export const personOf = (room: SmallRoom, i: number) => itemAt(room.people, i, `person ${i} of room ${room.id}`);

/** The room's tie `i` (in creation order). */
export const tieOf = (room: SmallRoom, i: number) => itemAt(room.ties, i, `tie ${i} of room ${room.id}`);

/** A room of `n` people in a path a - b - c ... with strength 1. */
export async function createPathRoom(client: TestClient, n = 4, name = 'Path room'): Promise<SmallRoom> {
  const people = Array.from({ length: n }, (_, i) => ({ key: `k${i}`, name: `Person ${i}` }));
  const ties = people.slice(1).map((p, i) => ({ source: `k${i}`, target: p.key, strength: 1 }));
  const reply = await client.post('/api/rooms', { name, people, ties });
  if (reply.status !== 201) throw new Error(`create failed: ${reply.status} ${reply.text}`);
  return reply.body as SmallRoom;
}

/** Sends files as multipart form data, the way the browser's FormData does. */
export function upload(
  client: TestClient,
  path: string,
  files: Record<string, { name: string; content: string | Uint8Array }>,
  fields: Record<string, string> = {},
) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  for (const [field, f] of Object.entries(files)) form.set(field, new Blob([f.content as BlobPart]), f.name);
  return client.request('POST', path, undefined, { raw: form });
}
