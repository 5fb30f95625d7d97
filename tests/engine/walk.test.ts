/** Walk matrix (engine.md section 1): dense rows are stochastic and the sparse operator matches the dense one. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { denseWalk, prepareRoom, sparseWalk } from '../../shared/engine/index';
import { randomRoom, relClose, room } from './engine-fixtures';

describe('walk matrix', () => {
  it('rows sum to one with laziness and mixing; a person with no outgoing tie stays put', () => {
    const r = prepareRoom(
      room(
        4,
        [
          [0, 1, 2],
          [0, 2, 1],
          [1, 0],
          [2, 3],
        ],
        true,
      ),
      { laziness: 0.2, mixing: 0.1 },
    );
    const p = denseWalk(r, true);
    for (let i = 0; i < 4; i++)
      assert.ok(
        relClose(
          p.slice(i * 4, i * 4 + 4).reduce((a, b) => a + b, 0),
          1,
          1e-15,
        ),
      );
    // P = (1 - a)[(1 - b) P0 + b/n] + a I, checked entry by entry for person 0 (asks 1 with 2/3, 2 with 1/3).
    assert.ok(relClose(p[0 * 4 + 1], 0.8 * (0.9 * (2 / 3) + 0.1 / 4), 1e-15));
    assert.ok(relClose(p[0 * 4 + 0], 0.8 * (0.1 / 4) + 0.2, 1e-15));
    // Person 3 asks nobody: P0 keeps them in place.
    assert.ok(relClose(p[3 * 4 + 3], 0.8 * (0.9 + 0.1 / 4) + 0.2, 1e-15));
  });

  for (const directed of [false, true]) {
    it(`sparse operator with a rank-one mixing term equals the dense restriction (${directed ? 'directed' : 'undirected'})`, () => {
      const r = prepareRoom(randomRoom(30, 60, directed, 17), { mixing: 0.07 });
      const A = [2, 11];
      const p = denseWalk(r);
      const w = sparseWalk(r, A);
      const x = Float64Array.from({ length: 30 }, (_, i) => Math.sin(i + 1));
      const y = new Float64Array(30);
      const yt = new Float64Array(30);
      w.mulQ(x, y);
      w.mulQt(x, yt);
      for (let i = 0; i < 30; i++) {
        let e = 0;
        let et = 0;
        if (!A.includes(i)) {
          for (let j = 0; j < 30; j++)
            if (!A.includes(j)) {
              e += p[i * 30 + j] * x[j];
              et += p[j * 30 + i] * x[j];
            }
        }
        assert.ok(relClose(y[i], e, 1e-13));
        assert.ok(relClose(yt[i], et, 1e-13));
      }
    });
  }
});
