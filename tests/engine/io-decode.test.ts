import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { decodeUtf8, formatOf } from '../../shared/engine/io/index';

describe('decoding uploaded bytes', () => {
  it('accepts UTF-8 (with or without a byte-order mark)', () => {
    assert.equal(decodeUtf8(new TextEncoder().encode('source,target\nZoë,Łukasz\n')).text, 'source,target\nZoë,Łukasz\n');
    assert.ok(decodeUtf8(Uint8Array.from([0xef, 0xbb, 0xbf, 0x61])).text?.endsWith('a'));
  });

  it('rejects Latin-1 with the line of the first bad byte', () => {
    // "Zoë" in ISO-8859-1: ë is the single byte 0xEB
    const bytes = Uint8Array.from([...new TextEncoder().encode('source,target\na,b\n'), 0x5a, 0x6f, 0xeb, 0x2c, 0x61, 0x0a]);
    const r = decodeUtf8(bytes, 'ties');
    assert.equal(r.error?.code, 'encoding');
    assert.equal(r.error?.line, 3);
    assert.match(r.error!.message, /byte 21 is not valid UTF-8.*save it as UTF-8/);
  });

  it('rejects UTF-16 with a hint', () => {
    const r = decodeUtf8(Uint8Array.from([0xff, 0xfe, 0x61, 0x00]));
    assert.match(r.error!.message, /UTF-16/);
  });

  it('chooses the format by extension', () => {
    assert.equal(formatOf('room.JSON'), 'json');
    assert.equal(formatOf('a/b.csv'), 'csv');
    assert.equal(formatOf('x.graphml'), 'graphml');
    assert.equal(formatOf('x.xlsx'), undefined);
    assert.equal(formatOf('noext'), undefined);
  });
});
