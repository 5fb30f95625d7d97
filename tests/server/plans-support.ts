/** Helpers for the plans and rehearsals server tests: rooms through the real rooms API, jobs, SSE. */
import { createRequire } from 'node:module';
import type { RoomGraph } from '../../shared/engine/index';
import type { JobDto, JobEvent } from '../../shared/api/plans';
import type { TestClient } from '../support/http-client';

const require = createRequire(import.meta.url);

/** Zachary's karate club (Zachary 1977, "An information flow model for conflict and fission in small groups"), as shipped by graphology-generators. */
export function karateClub(): RoomGraph {
  type G = { nodes(): string[]; edges(): string[]; source(e: string): string; target(e: string): string };
  const Graph = require('graphology') as { UndirectedGraph: unknown };
  const karate = require('graphology-generators/social/karate-club.js') as (c: unknown) => G;
  const g = karate(Graph.UndirectedGraph);
  const nodes = g.nodes();
  const idx = new Map(nodes.map((x, i) => [x, i]));
  return {
    ids: nodes,
    directed: false,
    ties: g.edges().map((e) => ({ source: idx.get(g.source(e))!, target: idx.get(g.target(e))!, strength: 1 })),
  };
}

/** A connected random weighted room (a ring plus random ties, fixed sequence). */
export function ringRoom(n: number, extra: number, seed = 7): RoomGraph {
  let s = seed >>> 0;
  const next = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const seen = new Set<string>();
  const ties: { source: number; target: number; strength: number }[] = [];
  const add = (a: number, b: number) => {
    const key = a < b ? `${a},${b}` : `${b},${a}`;
    if (a === b || seen.has(key)) return;
    seen.add(key);
    ties.push({ source: a, target: b, strength: Math.round((0.5 + 3 * next()) * 100) / 100 });
  };
  for (let i = 0; i < n; i++) add(i, (i + 1) % n);
  while (ties.length < n + extra) add(Math.floor(next() * n), Math.floor(next() * n));
  return { ids: Array.from({ length: n }, (_, i) => `p${i}`), directed: false, ties };
}

export interface MadeRoom {
  id: number;
  version: number;
  /** Person ids in room order. */
  personIds: number[];
  keys: string[];
}

export async function makeRoom(
  client: TestClient,
  graph: RoomGraph,
  name = 'Test room',
  settings: Record<string, unknown> = {},
): Promise<MadeRoom> {
  const reply = await client.post('/api/rooms', {
    name,
    settings: { directed: graph.directed, ...settings },
    people: graph.ids.map((key, i) => ({ key, name: `Person ${key}`, group: i % 3 === 0 ? 'North' : 'South' })),
    ties: graph.ties.map((t) => ({ source: graph.ids[t.source], target: graph.ids[t.target], strength: t.strength })),
  });
  if (reply.status !== 201) throw new Error(`room create failed: ${reply.status} ${reply.text}`);
  const room = reply.body;
  return {
    id: room.id,
    version: room.version,
    personIds: room.people.map((p: { id: number }) => p.id),
    keys: room.people.map((p: { key: string }) => p.key),
  };
}

export async function share(owner: TestClient, roomId: number, email: string, role: 'editor' | 'viewer'): Promise<void> {
  const r = await owner.post(`/api/rooms/${roomId}/shares`, { email, role });
  if (r.status !== 201) throw new Error(`share failed: ${r.status} ${r.text}`);
}

const FINAL = ['done', 'failed', 'cancelled', 'interrupted'];

export async function waitForJob(client: TestClient, jobId: number, timeoutMs = 60_000): Promise<JobDto> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.get<JobDto>(`/api/jobs/${jobId}`);
    if (FINAL.includes(r.body.status)) return r.body;
    if (Date.now() > until) throw new Error(`job ${jobId} still ${r.body.status}`);
    await new Promise((res) => setTimeout(res, 50));
  }
}

/** Reads a server-sent event stream to its end; returns the events and the raw text. */
export async function readEvents(
  client: TestClient,
  path: string,
  timeoutMs = 60_000,
): Promise<{ events: JobEvent[]; raw: string; contentType: string }> {
  const res = await fetch(client.baseUrl + path, {
    headers: { cookie: client.cookieHeader(), accept: 'text/event-stream' },
    signal: AbortSignal.timeout(timeoutMs),
  });
  const raw = await res.text();
  const events: JobEvent[] = [];
  for (const block of raw.split('\n\n')) {
    const type = /^event: (.+)$/m.exec(block)?.[1];
    const data = /^data: (.+)$/m.exec(block)?.[1];
    if (type && data) {
      const e = JSON.parse(data) as JobEvent;
      if (e.type !== type) throw new Error(`event name ${type} differs from its data type ${e.type}`);
      events.push(e);
    }
  }
  return { events, raw, contentType: res.headers.get('content-type') ?? '' };
}
