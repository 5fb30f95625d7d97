/** The Node-only parallel kernel gives the same numbers as the single-thread kernels. */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { ergodicData, plan, prepareRoom } from '../../shared/engine/index';
import { ergodicDataParallel, planWithWorkers } from '../../shared/engine/parallel/index';
import { randomRoom, relClose } from './engine-fixtures';

describe('parallel ergodic kernel (worker threads)', () => {
  for (const directed of [false, true]) {
    it(`${directed ? 'directed' : 'undirected'} room: same Z and same plan as one thread`, async () => {
      const room = prepareRoom(randomRoom(120, 300, directed, 31));
      const one = ergodicData(room);
      const two = await ergodicDataParallel(room, {}, 2);
      assert.ok(two);
      for (let q = 0; q < one.g.length; q += 7) assert.ok(relClose(one.g[q], two.g[q], 1e-12));
      for (let j = 0; j < room.n; j++) assert.ok(relClose(one.singleTotals[j], two.singleTotals[j], 1e-12));
      const p1 = plan(room, { k: 6, method: 'greedy' });
      const p2 = plan(room, { k: 6, method: 'greedy', ergodic: two });
      assert.deepEqual(p2.starters, p1.starters);
      const p3 = await planWithWorkers(prepareRoom(randomRoom(320, 700, directed, 32)), { k: 5, method: 'greedy' }, 2);
      const p4 = plan(prepareRoom(randomRoom(320, 700, directed, 32)), { k: 5, method: 'greedy' });
      assert.deepEqual(p3.starters, p4.starters);
      assert.ok(relClose(p3.total, p4.total, 1e-10));
    });
  }
});
