/**
 * Room readers on probe files: ids kept as written in every format, strengths the solvers can
 * carry, nesting and unclosed markup refused with one short line naming the place, empty and
 * null strengths under one rule, and reading that stops at the first errors.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import {
  MAX_MESSAGE_CHARS,
  parseGraphml,
  parseNodeLink,
  parseRoomCsv,
  readJson,
  refusalLine,
  writeGraphml,
  writeNodeLink,
  writeRoomCsv,
  JsonObject,
  type ParseResult,
  type RoomFormat,
} from '../../shared/engine/io/index';
import type { RoomGraph } from '../../shared/engine/graph';

/** A path room a - b - c ... with the given ids (as text) and strengths. */
function probe(format: RoomFormat, ids: string[], strengths: string[]): string {
  const ties = strengths.map((s, i) => [ids[i], ids[i + 1], s] as const);
  if (format === 'csv') return 'source,target,strength\n' + ties.map((t) => t.join(',')).join('\n') + '\n';
  if (format === 'graphml') {
    return (
      '<graphml><key id="w" for="edge" attr.name="weight"/><graph edgedefault="undirected">' +
      ids.map((id) => `<node id="${id}"/>`).join('') +
      ties.map(([s, t, w]) => `<edge source="${s}" target="${t}"><data key="w">${w}</data></edge>`).join('') +
      '</graph></graphml>'
    );
  }
  // JSON: ids and strengths are written as raw JSON tokens (numbers stay numbers)
  const tok = (s: string) => (/^-?\d/.test(s) || s === 'null' ? s : JSON.stringify(s));
  return `{"nodes":[${ids.map((id) => `{"id":${tok(id)}}`).join(',')}],"links":[${ties
    .map(([s, t, w]) => `{"source":${tok(s)},"target":${tok(t)},"strength":${tok(w)}}`)
    .join(',')}]}`;
}

function parse(format: RoomFormat, text: string): ParseResult {
  if (format === 'csv') return parseRoomCsv(text);
  return format === 'json' ? parseNodeLink(text) : parseGraphml(text);
}

const FORMATS: RoomFormat[] = ['csv', 'json', 'graphml'];

/** The one-line refusal: short, and naming a place. */
function refusal(r: ParseResult, pattern: RegExp): string {
  assert.ok(r.errors.length > 0, 'expected the file to be refused');
  const line = refusalLine(r.errors);
  assert.ok(line.length <= MAX_MESSAGE_CHARS, `${line.length} characters: ${line}`);
  assert.ok(!line.includes('\n'));
  assert.match(line, pattern);
  return line;
}

describe('ids are kept as written', () => {
  it('JSON numbers keep their digits: 1.0, 1e3 and two ids beyond 2^53 stay distinct', () => {
    const ids = ['1.0', '1e3', '12345678901234567891', '12345678901234567892', '-0', '1E+3'];
    const r = parseNodeLink(probe('json', ids, ['1', '1', '1', '1', '1']));
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ids);
  });

  it('object keys such as __proto__, constructor and toString are ordinary ids in every format', () => {
    const ids = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'valueOf'];
    for (const format of FORMATS) {
      const r = parse(format, probe(format, ids, ['1', '2', '3', '4']));
      assert.deepEqual(r.errors, [], format);
      assert.deepEqual(r.graph.ids, ids, format);
      assert.deepEqual(
        r.graph.ties.map((t) => t.strength),
        [1, 2, 3, 4],
        format,
      );
    }
  });

  it('round-trips odd ids exactly through every writer and reader', () => {
    const ids = ['12345678901234567891', '12345678901234567892', '1.0', '__proto__', ' lead', 'a,b', 'say "hi"', '=1+1', 'tail '];
    const g: RoomGraph = { ids, directed: false, ties: ids.slice(1).map((_, i) => ({ source: i, target: i + 1, strength: 1 + i })) };
    const csv = writeRoomCsv(g);
    for (const [format, back] of [
      ['json', parseNodeLink(writeNodeLink(g))],
      ['graphml', parseGraphml(writeGraphml(g))],
      ['csv', parseRoomCsv(csv.ties, csv.people, { directed: csv.directed })],
    ] as const) {
      assert.deepEqual(back.errors, [], format);
      assert.deepEqual(back.graph.ids, ids, format);
      assert.deepEqual(back.graph.ties, g.ties, format);
    }
  });

  it('CSV: unquoted cells are trimmed, quoted cells kept exactly', () => {
    const r = parseRoomCsv('source,target\n  a  ," b "\n"a,b",a\n');
    assert.deepEqual(r.errors, []);
    assert.deepEqual(r.graph.ids, ['a', ' b ', 'a,b']);
  });
});

describe('strengths the solvers can carry', () => {
  for (const format of FORMATS) {
    it(`${format}: a tie 1e-15 times the strongest is refused, 1e-12 times is read`, () => {
      const line = refusal(parse(format, probe(format, ['a', 'b', 'c'], ['1', '1e-15'])), /1e-15 is 1\.0e-15 times the strongest tie/);
      assert.match(line, /double precision/);
      const edge = parse(format, probe(format, ['a', 'b', 'c'], ['1', '1e-12']));
      assert.deepEqual(edge.errors, []);
      assert.deepEqual(
        edge.graph.ties.map((t) => t.strength),
        [1, 1e-12],
      );
      // a room of tiny ties only is fine: the ratio is what counts
      assert.deepEqual(parse(format, probe(format, ['a', 'b', 'c'], ['1e-90', '3e-90'])).errors, []);
    });

    it(`${format}: subnormal 1e-320 and underflowing 1e-400 are too small, not "not positive"`, () => {
      refusal(parse(format, probe(format, ['a', 'b'], ['1e-320'])), /1e-320 is too small to compute with/);
      refusal(parse(format, probe(format, ['a', 'b'], ['1e-400'])), /1e-400 is too small to compute with/);
    });
  }

  it('the refusal names the weak tie and the strongest one', () => {
    const r = parseRoomCsv('source,target,strength\na,b,2\nb,c,3e-13\nc,d,5\n');
    const e = r.errors.find((x) => x.code === 'strength-range')!;
    assert.equal(e.line, 3);
    assert.match(e.message, /strongest tie \(5, line 4\)/);
  });
});

describe('empty and null strengths: one rule', () => {
  it('CSV: an empty cell means 1, with one warning that counts them', () => {
    const r = parseRoomCsv('source,target,strength\na,b,\nb,c,2\nc,d,\n');
    assert.deepEqual(r.errors, []);
    assert.deepEqual(
      r.graph.ties.map((t) => t.strength),
      [1, 2, 1],
    );
    const w = r.warnings.filter((x) => x.code === 'empty-strength');
    assert.equal(w.length, 1);
    assert.equal(w[0].line, 2);
    assert.match(w[0].message, /2 ties have an empty strength, read as 1/);
  });

  it('GraphML: an empty <data> means 1 with the same warning; a missing one takes the default', () => {
    const r = parseGraphml(
      '<graphml><key id="w" for="edge" attr.name="weight"><default>3</default></key><graph>' +
        '<node id="a"/><node id="b"/><node id="c"/>' +
        '<edge source="a" target="b"><data key="w"></data></edge><edge source="b" target="c"/></graph></graphml>',
    );
    assert.deepEqual(r.errors, []);
    assert.deepEqual(
      r.graph.ties.map((t) => t.strength),
      [1, 3],
    );
    assert.match(r.warnings.find((x) => x.code === 'empty-strength')!.message, /this tie has an empty strength, read as 1/);
  });

  it('JSON: null and "" are refused, a missing strength means 1 without a warning', () => {
    refusal(parseNodeLink(probe('json', ['a', 'b'], ['null'])), /^json links\[0\], strength: the strength is null/);
    refusal(
      parseNodeLink('{"nodes":[{"id":"a"},{"id":"b"}],"links":[{"source":"a","target":"b","weight":""}]}'),
      /weight: the strength is empty/,
    );
    const missing = parseNodeLink('{"nodes":[{"id":"a"},{"id":"b"}],"links":[{"source":"a","target":"b"}]}');
    assert.deepEqual(missing.errors, []);
    assert.deepEqual(missing.warnings, []);
    assert.equal(missing.graph.ties[0].strength, 1);
  });
});

describe('nesting and unclosed markup: refused at once, with the place', () => {
  const nested = (depth: number) => '<graphml><graph>' + '<node id="a">'.repeat(depth) + '</node>'.repeat(depth) + '</graph></graphml>';

  it('GraphML nested 100 and 1,000,000 levels deep', () => {
    for (const depth of [100, 1_000_000]) {
      const r = parseGraphml(nested(depth), { maxChars: 64 * 1024 * 1024 });
      assert.equal(r.errors[0].code, 'too-deep');
      assert.equal(r.errors[0].line, 1);
      refusal(
        r,
        /^graphml line 1: not accepted: elements nested more than 64 levels deep; GraphML needs only a few \(column 823, byte 823\)$/,
      );
    }
  });

  it('GraphML with an unclosed tag, a mismatched end tag and a huge unclosed attribute', () => {
    refusal(
      parseGraphml('<graphml>\n<graph>\n<node id="a">\n<node id="b"/>\n'),
      /^graphml line 5: not well-formed XML: the file ends while <node> \(opened at line 3, column 1\) is still open; add <\/node>/,
    );
    refusal(
      parseGraphml('<graphml><graph><node id="a"></graph></graphml>'),
      /line 1: not well-formed XML: <\/graph> does not match <node> opened at line 1, column 17 \(column 30, byte 30\)/,
    );
    const line = refusal(
      parseGraphml(`<graphml><graph><node id="${'x'.repeat(100_000)}></graph></graphml>`),
      /the value of attribute id of <node> opened here has no closing "/,
    );
    assert.ok(!line.includes('xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx'));
    refusal(parseGraphml(`<graphml><${'g'.repeat(100_000)}`), /the tag <g{40}\.\.\.> opened here is not closed/);
  });

  it('JSON opened a million levels deep and never closed', () => {
    const r = parseNodeLink('['.repeat(1_000_000));
    assert.equal(r.errors[0].code, 'too-deep');
    refusal(
      r,
      /^json line 1: not accepted: the JSON is nested more than 64 levels deep; a room file needs only a few levels \(column 65, byte 65\)$/,
    );
    refusal(
      parseNodeLink('{"nodes": [\n {"id": "a"},\n {"id": "b"}'),
      /^json line 3: not valid JSON: the text ends inside the list opened at line 1, column 11 \(a "]" is missing\)/,
    );
    refusal(parseNodeLink('{"nodes": [{"id": "a'), /a string starts here but is not closed/);
  });

  it('JSON: deep objects inside a node are refused without recursing; shallow unknown fields are ignored', () => {
    const deep = '{"nodes":[{"id":"a","meta":' + '{"k":'.repeat(1_000_000) + '1' + '}'.repeat(1_000_000) + '}],"links":[]}';
    refusal(parseNodeLink(deep), /nested more than 64 levels deep/);
    const shallow = parseNodeLink(
      '{"nodes":[{"id":"a","meta":{"k":[{"x":{"y":[1,2]}}]}},{"id":"b"}],"links":[{"source":"a","target":"b","extra":[[[]]]}]}',
    );
    assert.deepEqual(shallow.errors, []);
    assert.deepEqual(shallow.graph.ids, ['a', 'b']);
  });
});

describe('reading stops early', () => {
  /** Chunks of a long CSV whose second line is bad; counts how many were asked for. */
  function* chunks(counter: { pulled: number }, badLine = 'a,b,heavy\n'): Generator<string> {
    counter.pulled++;
    yield 'source,target,strength\n' + badLine;
    for (let k = 0; k < 1000; k++) {
      counter.pulled++;
      yield Array.from({ length: 1000 }, (_, i) => `p${k * 1000 + i},q${i},1\n`).join('');
    }
  }

  it('at the first error when asked (the command line): the rest of the file is never read', () => {
    const counter = { pulled: 0 };
    const r = parseRoomCsv(chunks(counter), undefined, { maxErrors: 1 });
    assert.equal(counter.pulled, 1); // line 2 is complete in the first chunk
    assert.deepEqual(
      r.errors.map((e) => [e.line, e.code]),
      [[2, 'bad-strength']],
    );
    assert.equal(refusalLine(r.errors), 'ties line 2, strength: "heavy" is not a number; write a positive number such as 1 or 2.5');
  });

  it('an unclosed quote on line 2 stops reading once the row passes 1 MiB', () => {
    const counter = { pulled: 0 };
    const r = parseRoomCsv(chunks(counter, 'a,"b,1\n'), undefined, { maxErrors: 1 });
    assert.ok(counter.pulled < 200, `read ${counter.pulled} chunks`);
    refusal(r, /^ties line 2: this row is longer than 1 MiB; a closing quote \(".*\) is probably missing$/);
  });

  it('after the first 50 row errors otherwise, saying so', () => {
    const text = 'source,target,strength\n' + Array.from({ length: 5000 }, (_, i) => `a${i},b${i},x\n`).join('');
    const r = parseRoomCsv(text);
    assert.equal(r.errors.length, 51);
    assert.equal(r.errors[49].line, 51);
    assert.match(r.errors[50].message, /reading stopped after 50 errors/);
    assert.match(refusalLine(r.errors), /^ties line 2, strength: "x" is not a number.* \(and at least 49 more problems\)$/);
  });
});

describe('the JSON reader', () => {
  it('keeps number text, treats __proto__ as a key, and takes the last of repeated keys', () => {
    const r = readJson('{"__proto__": 1.50, "a": 1, "a": 2e0}');
    assert.ok(!r.error && r.value instanceof JsonObject);
    const o = r.value;
    assert.deepEqual(o.keys, ['__proto__', 'a', 'a']);
    assert.equal((o.get('__proto__') as { text: string }).text, '1.50');
    assert.equal((o.get('a') as { text: string }).text, '2e0');
  });

  it('agrees with JSON.parse on which texts are valid JSON (RFC 8259 grammar)', () => {
    const texts = [
      '{}',
      '[1,-0.5e+3,"\\u00e9\\n",true,false,null]',
      '{"a":{"b":[]}}',
      ' "x" ',
      '[01]',
      '[1.]',
      '[.5]',
      '{"a":1,}',
      '[1,]',
      "{'a':1}",
      '"\t"',
      '[-]',
      'nul',
      '{"a" 1}',
      '[1]x',
      '"\\x"',
      '"\\u12"',
    ];
    for (const t of texts) {
      let valid = true;
      try {
        JSON.parse(t);
      } catch {
        valid = false;
      }
      assert.equal(readJson(t).error === undefined, valid, t);
    }
  });
});
