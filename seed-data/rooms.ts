/**
 * Demo rooms, generated deterministically (same rooms on every load). Invented scenarios and
 * invented names only: the all-hands of a fictional company and a fictional training workshop.
 */
import { and, eq } from 'drizzle-orm';
import { DEFAULT_ROOM_SETTINGS, type RoomSettings } from '../shared/api/rooms';
import { rooms } from '../db/schema/rooms';
import { db } from '../db/connection';
import { createWithContent } from '../server/rooms/service';
import type { RoomContent } from '../server/rooms/content';
import type { PersonRowInput, TieRowInput } from '../server/rooms/content';
import { itemAt } from '../shared/checked';

export const DEMO_ROOMS = {
  allHands: 'Quillmere Works all-hands',
  workshop: 'Harbourlight facilitation workshop',
} as const;

const FIRST = [
  'Ada',
  'Bram',
  'Cleo',
  'Dario',
  'Elin',
  'Farid',
  'Greta',
  'Hugo',
  'Ines',
  'Jonas',
  'Kaia',
  'Lior',
  'Mira',
  'Nils',
  'Oona',
  'Pavel',
  'Quinn',
  'Rosa',
  'Sami',
  'Tove',
  'Umar',
  'Vera',
  'Wim',
  'Xenia',
  'Yusuf',
  'Zora',
  'Arlo',
  'Bea',
  'Cato',
  'Dina',
];
const LAST = [
  'Ashgrove',
  'Brindle',
  'Calloway',
  'Dunmore',
  'Ellery',
  'Fenwick',
  'Galloway',
  'Hartwell',
  'Ivory',
  'Juniper',
  'Kestrel',
  'Larkin',
  'Merriweather',
  'Northcote',
  'Orchard',
  'Pembrook',
  'Quarry',
  'Rowan',
  'Sable',
  'Thistle',
  'Umber',
  'Vane',
];

/** A small deterministic generator (Park and Miller 1988, "minimal standard" LCG). */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

function names(count: number, offset: number): string[] {
  return Array.from({ length: count }, (_, i) => `${FIRST[(i * 7 + offset) % FIRST.length]} ${LAST[(i * 5 + offset * 3) % LAST.length]}`);
}

const round = (v: number) => Math.round(v * 10) / 10;

export function allHandsContent(): RoomContent {
  const teams = ['Sales', 'Support', 'Product', 'Engineering', 'Finance', 'Operations'];
  const rand = lcg(20260501);
  const who = names(60, 1);
  const people: PersonRowInput[] = who.map((name, i) => {
    const team = Math.floor(i / 10);
    const angle = (team / teams.length) * 2 * Math.PI;
    const a = ((i % 10) / 10) * 2 * Math.PI;
    return {
      key: `qw${String(i + 1).padStart(2, '0')}`,
      name,
      group: itemAt(teams, team, 'demo team'),
      email: null,
      x: round(400 + 260 * Math.cos(angle) + 70 * Math.cos(a)),
      y: round(400 + 260 * Math.sin(angle) + 70 * Math.sin(a)),
      pinned: false,
    };
  });
  const ties: TieRowInput[] = [];
  const seen = new Set<string>();
  const add = (s: number, t: number, strength: number) => {
    const k = s < t ? `${s}:${t}` : `${t}:${s}`;
    if (s === t || seen.has(k)) return;
    seen.add(k);
    ties.push({ source: s, target: t, strength: round(strength) });
  };
  for (let team = 0; team < teams.length; team++) {
    const base = team * 10;
    for (let i = 0; i < 10; i++) add(base + i, base + ((i + 1) % 10), 2 + rand() * 2); // daily neighbours
    for (let q = 0; q < 8; q++) add(base + Math.floor(rand() * 10), base + Math.floor(rand() * 10), 1 + rand());
  }
  // Team leads (first of each team) talk to each other; a few people have friends in other teams.
  for (let a = 0; a < teams.length; a++) for (let b = a + 1; b < teams.length; b++) add(a * 10, b * 10, 1.5);
  for (let q = 0; q < 14; q++) add(Math.floor(rand() * 60), Math.floor(rand() * 60), 0.5 + rand() * 0.5);
  return { people, ties };
}

export function workshopContent(): RoomContent {
  const tables = 4;
  const seats = 6;
  const who = names(tables * seats, 11);
  const people: PersonRowInput[] = who.map((name, i) => {
    const table = Math.floor(i / seats);
    const seat = i % seats;
    const cx = 220 + (table % 2) * 360;
    const cy = 220 + Math.floor(table / 2) * 360;
    const a = (seat / seats) * 2 * Math.PI;
    return {
      key: `hw${String(i + 1).padStart(2, '0')}`,
      name,
      group: `Table ${table + 1}`,
      email: null,
      x: round(cx + 90 * Math.cos(a)),
      y: round(cy + 90 * Math.sin(a)),
      pinned: true,
    };
  });
  const ties: TieRowInput[] = [];
  for (let t = 0; t < tables; t++) {
    const base = t * seats;
    for (let s = 0; s < seats; s++) ties.push({ source: base + s, target: base + ((s + 1) % seats), strength: 3 }); // neighbours
    for (let s = 0; s < seats / 2; s++) ties.push({ source: base + s, target: base + s + seats / 2, strength: 1 }); // across
  }
  // Coffee-break mingling: one tie from each table to the next.
  for (let t = 0; t < tables; t++) ties.push({ source: t * seats + 1, target: ((t + 1) % tables) * seats + 4, strength: 0.5 });
  return { people, ties };
}

async function ensureRoom(ownerId: number, name: string, description: string, settings: RoomSettings, content: RoomContent) {
  const [existing] = await db
    .select({ id: rooms.id })
    .from(rooms)
    .where(and(eq(rooms.ownerId, ownerId), eq(rooms.name, name)));
  if (existing) return existing.id;
  return db.transaction((tx) => createWithContent(ownerId, name, description, settings, content, tx));
}

/** Loads the demo rooms for the demo facilitator; a second run changes nothing. */
export async function seedRooms(ownerId: number): Promise<{ allHands: number; workshop: number }> {
  const allHands = await ensureRoom(
    ownerId,
    DEMO_ROOMS.allHands,
    'Invented company, 60 people in 6 teams: who asks whom before the quarterly all-hands.',
    { ...DEFAULT_ROOM_SETTINGS, minutesPerHop: 8 },
    allHandsContent(),
  );
  const workshop = await ensureRoom(
    ownerId,
    DEMO_ROOMS.workshop,
    'Invented training workshop: 24 people at 4 round tables of 6, with a little mingling at the break.',
    { ...DEFAULT_ROOM_SETTINGS, minutesPerHop: 2 },
    workshopContent(),
  );
  return { allHands, workshop };
}
