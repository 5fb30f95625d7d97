import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { parseRoomCsv, protectCell, unprotectCell, writeRoomCsv, type Issue } from '../../shared/engine/io/index';

function only(issues: Issue[], code: string): Issue {
  const found = issues.filter((i) => i.code === code);
  assert.equal(found.length, 1, `expected one ${code}, got ${JSON.stringify(issues)}`);
  return found[0];
}

describe('CSV ties', () => {
  it('reads a header, strengths, and people in order of first appearance', () => {
    const r = parseRoomCsv('source,target,strength\na,b,2\nb,c,0.5\nc,a,\n');
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['a', 'b', 'c']);
    assert.equal(r.graph.directed, false);
    assert.deepEqual(r.graph.ties, [
      { source: 0, target: 1, strength: 2 },
      { source: 1, target: 2, strength: 0.5 },
      { source: 2, target: 0, strength: 1 },
    ]);
    assert.equal(r.meta.delimiter, ',');
  });

  it('without a strength column every tie has strength 1; "weight" is accepted as the column name', () => {
    assert.deepEqual(parseRoomCsv('source,target\nx,y\n').graph.ties, [{ source: 0, target: 1, strength: 1 }]);
    assert.deepEqual(parseRoomCsv('Source,Target,Weight\nx,y,3\n').graph.ties, [{ source: 0, target: 1, strength: 3 }]);
  });

  it('detects semicolons, says so, and reads decimal commas', () => {
    const r = parseRoomCsv('source;target;strength\na;b;2,5\n');
    assert.deepEqual(r.errors, []);
    assert.equal(r.meta.delimiter, ';');
    assert.match(only(r.warnings, 'delimiter').message, /semicolons/);
    assert.equal(r.graph.ties[0].strength, 2.5);
  });

  it('strips a byte-order mark and handles CRLF and quoted cells with commas, quotes and line breaks', () => {
    const r = parseRoomCsv('\uFEFFsource,target,strength\r\n"Lee, A.","say ""hi""\nthere",1\r\nb,c,1\r\n');
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['Lee, A.', 'say "hi"\nthere', 'b', 'c']);
    // the record after a quoted line break is on line 4
    const bad = parseRoomCsv('source,target,strength\n"a\nb",c,1\nd,e,x\n');
    assert.equal(only(bad.errors, 'bad-strength').line, 4);
  });

  it('reads directed ties when asked', () => {
    const r = parseRoomCsv('source,target\na,b\nb,a\n', undefined, { directed: true });
    assert.equal(r.graph.directed, true);
    assert.equal(r.graph.ties.length, 2);
    assert.deepEqual(r.warnings, []);
  });

  it('names line and field for bad strengths: zero, negative, text, non-finite, enormous', () => {
    const r = parseRoomCsv('source,target,strength\na,b,0\na,c,-2\na,d,strong\na,e,Infinity\na,f,1e400\na,g,5e12\na,h,0x10\n');
    const bad = r.errors.filter((e) => e.code === 'bad-strength');
    assert.deepEqual(
      bad.map((e) => e.line),
      [2, 3, 4, 5, 6, 7, 8],
    );
    assert.ok(bad.every((e) => e.field === 'strength' && e.file === 'ties'));
    assert.match(bad[0].message, /not positive/);
    assert.match(bad[1].message, /not positive/);
    assert.match(bad[2].message, /"strong" is not a number/);
    assert.match(bad[3].message, /not a number/);
    assert.match(bad[4].message, /not a finite number/);
    assert.match(bad[5].message, /too large/);
    assert.match(bad[6].message, /not a number/);
    assert.equal(parseRoomCsv('source,target,strength\na,b,50\n', undefined, { maxStrength: 10 }).errors[0].code, 'bad-strength');
  });

  it('rejects self-ties with the line', () => {
    const e = only(parseRoomCsv('source,target\na,b\nb,b\n').errors, 'self-tie');
    assert.equal(e.line, 3);
    assert.match(e.message, /"b" is tied to themself/);
  });

  it('merges duplicate ties by summing, with a warning naming both lines (undirected: a-b equals b-a)', () => {
    const r = parseRoomCsv('source,target,strength\na,b,1\nb,a,2\na,b,0.5\n');
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ties, [{ source: 0, target: 1, strength: 3.5 }]);
    const w = r.warnings.filter((x) => x.code === 'duplicate-tie');
    assert.deepEqual(
      w.map((x) => x.line),
      [3, 4],
    );
    assert.match(w[0].message, /line 2/);
    // directed: a->b and b->a are two ties
    assert.equal(parseRoomCsv('source,target\na,b\nb,a\n', undefined, { directed: true }).graph.ties.length, 2);
  });

  it('reports missing header columns and short rows', () => {
    const e = only(parseRoomCsv('from_person,to_person\na,b\n').errors, 'missing-column');
    assert.equal(e.line, 1);
    assert.match(e.message, /no source or target column/);
    const short = only(parseRoomCsv('source,target\na\n').errors, 'missing-field');
    assert.equal(short.line, 2);
    assert.equal(short.field, 'target');
  });

  it('reports an unclosed quote with its line', () => {
    const e = only(parseRoomCsv('source,target\na,"b\nc,d\n').errors, 'syntax');
    assert.equal(e.line, 2);
  });

  it('an empty file and a header-only file are empty rooms', () => {
    assert.equal(parseRoomCsv('').errors[0].code, 'missing-column');
    assert.equal(only(parseRoomCsv('source,target\n').errors, 'empty-room').code, 'empty-room');
  });

  it('refuses rooms over the size limits', () => {
    const rows = ['source,target', ...Array.from({ length: 10 }, (_, i) => `p${i},p${i + 1}`)].join('\n');
    const e = only(parseRoomCsv(rows, undefined, { maxPeople: 5 }).errors, 'room-too-large');
    assert.match(e.message, /more than 5 people/);
    // p5 is the sixth person, first seen on line 6
    assert.equal(e.line, 6);
    assert.match(only(parseRoomCsv(rows, undefined, { maxTies: 3 }).errors, 'room-too-large').message, /more than 3 ties/);
    assert.equal(parseRoomCsv(rows, undefined, { maxChars: 20 }).errors[0].code, 'too-large');
  });
});

describe('CSV people file', () => {
  const people = 'id,name,group\nA1,Ann,North\nB2,Ben,\nC3,Cat,South\n';

  it('gives labels, groups and the input order; ties must use its ids', () => {
    const r = parseRoomCsv('source,target\nC3,A1\nB2,A1\n', people);
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['A1', 'B2', 'C3']);
    assert.deepEqual(r.graph.labels, ['Ann', 'Ben', 'Cat']);
    assert.deepEqual(r.graph.groups, ['North', null, 'South']);
  });

  it('names unknown ids in ties with line and field', () => {
    const e = only(parseRoomCsv('source,target\nA1,Z9\n', people).errors, 'unknown-id');
    assert.equal(e.line, 2);
    assert.equal(e.field, 'target');
    assert.match(e.message, /"Z9" is not a person/);
  });

  it('names duplicate people with both lines', () => {
    const e = only(parseRoomCsv('source,target\nA1,B2\n', 'id,name\nA1,Ann\nB2,Ben\nA1,Again\n').errors, 'duplicate-person');
    assert.equal(e.file, 'people');
    assert.equal(e.line, 4);
    assert.match(e.message, /first at line 2/);
  });

  it('warns about people without ties', () => {
    const w = only(parseRoomCsv('source,target\nA1,B2\n', people).warnings, 'isolated-person');
    assert.equal(w.file, 'people');
    assert.equal(w.line, 4);
  });
});

describe('CSV formula-injection protection', () => {
  // OWASP, "CSV Injection" (common practice): cells starting with = + - @ tab or CR get a leading quote.
  it('prefixes dangerous cells with a quote and removes exactly that quote on reading', () => {
    for (const s of ['=SUM(A1)', '+1', '-2', '@cmd', '\tx', '\rx', "'=x", "''-y"]) {
      assert.equal(protectCell(s)[0], "'");
      assert.equal(unprotectCell(protectCell(s)), s);
    }
    for (const s of ['plain', "it's", "'quoted", '1.5']) assert.equal(protectCell(s), s);
  });

  it('writes protected people and ties files', () => {
    const files = writeRoomCsv({
      ids: ['=HYPERLINK("x")', '-3', 'ok'],
      labels: ['@boss', 'Mo', 'ok'],
      directed: false,
      ties: [
        { source: 0, target: 1, strength: 2 },
        { source: 1, target: 2, strength: 1 },
      ],
    });
    assert.ok(files.people.includes(`"'=HYPERLINK(""x"")"`));
    assert.ok(files.people.includes("'@boss"));
    assert.ok(files.ties.startsWith('source,target,strength\r\n'));
    for (const line of files.ties.split('\r\n').slice(1)) assert.ok(!/^[=+\-@]/.test(line) && !/,[=+\-@]/.test(line), line);
  });
});
