import { buildSeating, DEFAULT_SEATING, namesFromList, namesFromRosterCsv, type SeatingOptions, seatingProblems } from './seating';
import { itemAt } from '../checked';

/**
 * Tie counts per layout. The counts follow from elementary counting on simple graphs
 * (a cycle C_s has s edges, the complete graph K_s has s(s-1)/2 edges, a path P_n has n-1
 * edges, an R x C grid has R(C-1) + (R-1)C edges); see e.g. R. Diestel, "Graph Theory",
 * 5th ed., 2017, ch. 1. Each expectation below states the reasoning for its number.
 */
function roster(n: number) {
  return Array.from({ length: n }, (_, i) => ({ name: `Guest ${i + 1}`, email: null }));
}

function opts(over: Partial<SeatingOptions>): SeatingOptions {
  return { ...DEFAULT_SEATING, ...over };
}

describe('seating builder', () => {
  it('round tables: a cycle of neighbours plus the rest of K_s across each table', () => {
    // 24 people, 8 per table -> 3 full tables. Per table: the cycle C_8 has 8 ties; the
    // other pairs at the table are C(8,2) - 8 = 28 - 8 = 20 "across" ties.
    const r = buildSeating(roster(24), opts({ kind: 'round', seatsPer: 8 }));
    expect(r.groups).toBe(3);
    expect(r.counts.neighbour).toBe(3 * 8);
    expect(r.counts.across).toBe(3 * 20);
    expect(r.counts.mingle).toBe(0);
    expect(r.ties.length).toBe(3 * 28);
  });

  it('round tables: a partly filled last table and tiny tables', () => {
    // 10 people, 4 per table -> tables of 4, 4, 2. Table of 4: C_4 = 4 neighbour ties and
    // C(4,2) - 4 = 2 across (the two diagonals). Table of 2: the cycle collapses to one tie.
    const r = buildSeating(roster(10), opts({ kind: 'round', seatsPer: 4 }));
    expect(r.groups).toBe(3);
    expect(r.counts.neighbour).toBe(4 + 4 + 1);
    expect(r.counts.across).toBe(2 + 2 + 0);
    // Table of 3: everybody is a neighbour of everybody (C_3 = K_3), so nothing is "across".
    const three = buildSeating(roster(3), opts({ kind: 'round', seatsPer: 3 }));
    expect(three.counts.neighbour).toBe(3);
    expect(three.counts.across).toBe(0);
  });

  it('round tables: mingling links seat j of each table to seat j of the next, tables in a ring', () => {
    // 4 tables of 6 in a ring -> 4 table-to-table links, 2 minglers each -> 8 mingling ties.
    const r = buildSeating(roster(24), opts({ kind: 'round', seatsPer: 6, minglers: 2 }));
    expect(r.counts.mingle).toBe(4 * 2);
    // Two tables: the ring 0 -> 1 -> 0 is a single link, so 3 minglers give 3 ties, not 6.
    const two = buildSeating(roster(12), opts({ kind: 'round', seatsPer: 6, minglers: 3 }));
    expect(two.counts.mingle).toBe(3);
    // One table: nobody to mingle with.
    const one = buildSeating(roster(6), opts({ kind: 'round', seatsPer: 6, minglers: 3 }));
    expect(one.counts.mingle).toBe(0);
    // Mingling ties join different tables and are weaker than neighbour ties.
    for (const t of r.ties.filter((x) => x.kind === 'mingle')) {
      expect(itemAt(r.people, t.source, 'people').group).not.toBe(itemAt(r.people, t.target, 'people').group);
      expect(t.strength).toBe(DEFAULT_SEATING.mingleStrength);
    }
  });

  it('classroom rows: left/right and front/back neighbours of a grid', () => {
    // 5 rows of 6: R(C-1) = 5 * 5 = 25 side ties, (R-1)C = 4 * 6 = 24 front/back ties.
    const r = buildSeating(roster(30), opts({ kind: 'rows', seatsPer: 6 }));
    expect(r.groups).toBe(5);
    expect(r.counts.neighbour).toBe(25);
    expect(r.counts.across).toBe(24);
    // 14 people, rows of 6 -> rows of 6, 6, 2: side ties 5 + 5 + 1 = 11;
    // front/back: row 1 -> row 2 six ties, row 2 -> row 3 only the 2 seats filled behind = 8.
    const partial = buildSeating(roster(14), opts({ kind: 'rows', seatsPer: 6 }));
    expect(partial.counts.neighbour).toBe(11);
    expect(partial.counts.across).toBe(8);
  });

  it('U-shape: a path of n seats plus the facing seats of the two arms', () => {
    // 12 seats: arms of floor(12/3) = 4 seats each, a base of 4. Path P_12 has 11 ties;
    // each of the 4 seats on the left arm faces one on the right arm: 4 across ties.
    const r = buildSeating(roster(12), opts({ kind: 'u' }));
    expect(r.counts.neighbour).toBe(11);
    expect(r.counts.across).toBe(4);
    expect(new Set(r.people.map((p) => p.group))).toEqual(new Set(['Left side', 'Front', 'Right side']));
  });

  it('a weaker strength of 0 leaves the weaker ties out; strengths are as given', () => {
    const r = buildSeating(roster(16), opts({ kind: 'round', seatsPer: 8, acrossStrength: 0 }));
    expect(r.counts.across).toBe(0);
    expect(r.counts.neighbour).toBe(16);
    expect(r.ties.every((t) => t.strength === DEFAULT_SEATING.neighbourStrength)).toBeTrue();
  });

  it('never makes a self tie or two ties between the same pair', () => {
    for (const kind of ['round', 'rows', 'u'] as const) {
      for (const n of [2, 3, 5, 9, 17]) {
        const r = buildSeating(roster(n), opts({ kind, seatsPer: 4, minglers: 2 }));
        const pairs = new Set(r.ties.map((t) => [Math.min(t.source, t.target), Math.max(t.source, t.target)].join(':')));
        expect(pairs.size).withContext(`${kind} n=${n}`).toBe(r.ties.length);
        expect(r.ties.some((t) => t.source === t.target)).toBeFalse();
        expect(r.people.length).toBe(n);
        expect(new Set(r.people.map((p) => p.key)).size).toBe(n);
      }
    }
  });

  it('explains what to fix instead of building a bad room', () => {
    expect(seatingProblems(opts({}), 1)).toContain('Add at least two names.');
    expect(seatingProblems(opts({ seatsPer: 1 }), 10).join(' ')).toMatch(/Seats per table/);
    expect(seatingProblems(opts({ neighbourStrength: 0 }), 10).join(' ')).toMatch(/Neighbour strength/);
    expect(() => buildSeating(roster(1), opts({}))).toThrowError(/at least two names/);
  });

  it('reads names from a pasted list and from a roster CSV', () => {
    expect(namesFromList('\uFEFFAda\n\n  Bo \r\nCy;Di').map((e) => e.name)).toEqual(['Ada', 'Bo', 'Cy', 'Di']);
    const csv = namesFromRosterCsv('Name;E-mail\n"Lee, Ada";ada@example.test\n;\nBo;\n');
    expect(csv.entries).toEqual([
      { name: 'Lee, Ada', email: 'ada@example.test' },
      { name: 'Bo', email: null },
    ]);
    expect(csv.errors).toEqual(['Line 3: the name is empty.']);
    expect(namesFromRosterCsv('id,team\n1,a').errors[0]).toMatch(/no name column/);
  });
});
