/** Every bad input gives exit status 2 and exactly one line on stderr saying what and where. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { cli, fixtures } from './cli-helpers';

const f = fixtures({
  'ok.json': JSON.stringify({
    nodes: [{ id: 'a' }, { id: 'b' }, { id: 'c' }],
    links: [
      { source: 'a', target: 'b' },
      { source: 'b', target: 'c' },
    ],
  }),
  'split.json': JSON.stringify({
    nodes: [{ id: 'a' }, { id: 'b' }, { id: 'c' }, { id: 'd' }],
    links: [
      { source: 'a', target: 'b' },
      { source: 'c', target: 'd' },
    ],
  }),
  'syntax.json': '{\n "nodes": [\n  {"id": "a"},,\n ]\n}',
  'dup.json': JSON.stringify({ nodes: [{ id: 'a' }, { id: 'a' }], links: [] }),
  'empty.json': JSON.stringify({ nodes: [], links: [] }),
  'strength.csv': 'source,target,strength\na,b,1\nb,c,heavy\n',
  'zero.csv': 'source,target,strength\na,b,0\n',
  'huge.csv': 'source,target,strength\na,b,1e300\n',
  'self.csv': 'source,target\na,b\nc,c\n',
  'header.csv': 'from_person,to_person\na,b\n',
  'latin1.csv': Uint8Array.from([...new TextEncoder().encode('source,target\na,'), 0xe9, 0x0a]),
  'ties.csv': 'source,target\na,b\nb,zed\n',
  'people.csv': 'id,name\na,Ann\nb,Ben\n',
  'doctype.graphml': '<?xml version="1.0"?>\n<!DOCTYPE g [<!ENTITY x "y">]>\n<graphml><graph><node id="&x;"/></graph></graphml>',
  'broken.graphml': '<graphml>\n<graph>\n<node id="a">\n</graph></graphml>',
  'room.xlsx': 'not a room',
});

const cases: [string, string[], RegExp][] = [
  ['no command', [], /no command given/],
  ['unknown command', ['spread'], /unknown command "spread"/],
  ['unknown flag', ['reach', '--graph', f['ok.json'], '--starters', 'a', '--speed', '3'], /unknown flag --speed/],
  ['flag given twice', ['reach', '--graph', f['ok.json'], '--starters', 'a', '--starters', 'b'], /--starters is given twice/],
  ['missing required flag', ['reach', '--graph', f['ok.json']], /--starters is required/],
  ['flag without value', ['reach', '--graph', f['ok.json'], '--starters'], /--starters needs a value/],
  ['stray argument', ['cover', f['ok.json']], /unexpected argument/],
  ['missing file', ['cover', '--graph', '/nonexistent/room.json'], /room\.json: cannot read the file \(no such file\)/],
  ['unknown extension', ['cover', '--graph', f['room.xlsx']], /unknown file type; use a \.json, \.csv or \.graphml file/],
  ['JSON syntax error names the line', ['cover', '--graph', f['syntax.json']], /syntax\.json: json line 3: not valid JSON/],
  ['duplicate person names the element', ['cover', '--graph', f['dup.json']], /json nodes\[1\], id: person "a" is listed twice/],
  ['empty room', ['cover', '--graph', f['empty.json']], /the room has no people/],
  [
    'room over the size limit',
    ['cover', '--graph', f['ok.json'], '--max-people', '2'],
    /json nodes\[2\], id: the room has more than 2 people, the most allowed/,
  ],
  ['non-numeric strength names line and column', ['cover', '--graph', f['strength.csv']], /ties line 3, strength: "heavy" is not a number/],
  ['zero strength', ['cover', '--graph', f['zero.csv']], /ties line 2, strength: 0 is not positive/],
  ['enormous strength', ['cover', '--graph', f['huge.csv']], /ties line 2, strength: 1e\+300 is too large/],
  ['self-tie', ['cover', '--graph', f['self.csv']], /ties line 3: "c" is tied to themself/],
  ['CSV header without source/target', ['cover', '--graph', f['header.csv']], /ties line 1: the header has no source or target column/],
  ['not UTF-8', ['cover', '--graph', f['latin1.csv']], /ties line 2: byte 17 is not valid UTF-8/],
  [
    'unknown id against the people file',
    ['cover', '--graph', f['ties.csv'], '--people', f['people.csv']],
    /ties line 3, target: "zed" is not a person of this room/,
  ],
  [
    '--people with a JSON room',
    ['cover', '--graph', f['ok.json'], '--people', f['people.csv']],
    /--people goes with a \.csv ties file only/,
  ],
  [
    'GraphML with a DOCTYPE',
    ['cover', '--graph', f['doctype.graphml']],
    /graphml line 2 <!DOCTYPE>: the file contains a <!DOCTYPE declaration/,
  ],
  ['malformed GraphML', ['cover', '--graph', f['broken.graphml']], /not well-formed XML/],
  ['starter not in the room', ['reach', '--graph', f['ok.json'], '--starters', 'a,zz'], /--starters: "zz" is not a person in/],
  ['starter given twice', ['reach', '--graph', f['ok.json'], '--starters', 'a,a'], /"a" is given twice/],
  ['empty starter entry', ['reach', '--graph', f['ok.json'], '--starters', 'a,,b'], /--starters has an empty entry/],
  [
    'laziness out of range',
    ['reach', '--graph', f['ok.json'], '--starters', 'a', '--laziness', '1'],
    /--laziness must be a number with 0 <= laziness < 1 \(got "1"\)/,
  ],
  ['mixing not a number', ['reach', '--graph', f['ok.json'], '--starters', 'a', '--mixing', 'lots'], /--mixing must be a number/],
  [
    'runs zero',
    ['simulate', '--graph', f['ok.json'], '--starters', 'a', '--runs', '0', '--seed', '1'],
    /--runs must be a whole number from 1/,
  ],
  [
    'runs fractional',
    ['simulate', '--graph', f['ok.json'], '--starters', 'a', '--runs', '2.5', '--seed', '1'],
    /--runs must be a whole number/,
  ],
  [
    'workers out of range',
    ['simulate', '--graph', f['ok.json'], '--starters', 'a', '--runs', '5', '--seed', '1', '--workers', '99'],
    /--workers must be a whole number from 1 to 16/,
  ],
  ['k zero', ['plan', '--graph', f['ok.json'], '--k', '0', '--method', 'greedy'], /--k must be a whole number from 1/],
  [
    'k too large for the room',
    ['plan', '--graph', f['ok.json'], '--k', '3', '--method', 'greedy'],
    /plan: k must be a whole number with 1 <= k <= 2/,
  ],
  [
    'unknown method',
    ['plan', '--graph', f['ok.json'], '--k', '1', '--method', 'magic'],
    /--method must be one of greedy, widened, swap, exhaustive, auto/,
  ],
  [
    'nu out of range',
    ['plan', '--graph', f['ok.json'], '--k', '1', '--method', 'widened', '--nu', '2'],
    /--nu must be a number with 0 <= nu <= 1/,
  ],
  [
    'negative time limit',
    ['plan', '--graph', f['ok.json'], '--k', '1', '--method', 'exhaustive', '--time-limit', '-1'],
    /--time-limit must be a number/,
  ],
  [
    'k below the closed groups of a split room',
    ['plan', '--graph', f['split.json'], '--k', '1', '--method', 'greedy'],
    /2 closed groups .* k must be at least 2/,
  ],
];

describe('command line: bad input', { concurrency: 2 }, () => {
  for (const [name, args, pattern] of cases) {
    it(name, async () => {
      const r = await cli(args);
      assert.equal(r.code, 2, `exit status for ${name}: ${r.code}, stderr ${r.stderr}`);
      assert.equal(r.stdout, '');
      assert.match(r.stderr, /^[^\n]+\n$/, `one line: ${JSON.stringify(r.stderr)}`);
      assert.doesNotMatch(r.stderr, /\n\s+at |Error:/);
      assert.match(r.stderr, pattern);
    });
  }
});
