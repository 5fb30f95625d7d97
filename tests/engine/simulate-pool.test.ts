import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { EngineError } from '../../shared/engine/errors';
import { chunkRanges } from '../../shared/engine/simulate/index';
import { SimulationPool } from '../../shared/engine/simulate/pool';
import { complete, path } from './simulate-fixtures';

describe('rehearsal pool', () => {
  it('reports progress after each chunk, up to all runs, and can be reused', async () => {
    const pool = new SimulationPool(2);
    try {
      const seen: number[] = [];
      const s = await pool.simulate(
        complete(100),
        [0],
        7000,
        1,
        {},
        {
          onProgress: (done, runs) => {
            assert.equal(runs, 7000);
            seen.push(done);
          },
        },
      );
      assert.equal(s.runs, 7000);
      assert.equal(seen.length, chunkRanges(7000, 100).length);
      assert.ok(seen.length > 2);
      assert.deepEqual(
        [...seen].sort((a, b) => a - b),
        seen,
      );
      assert.equal(seen.at(-1), 7000);
      const again = await pool.simulate(complete(100), [0], 10, 2);
      assert.equal(again.runs, 10);
    } finally {
      await pool.close();
    }
  });

  it('stops on an AbortSignal with an AbortError', async () => {
    const pool = new SimulationPool(2);
    try {
      const controller = new AbortController();
      const started = performance.now();
      // a long rehearsal: about 4e9 hops
      const run = pool.simulate(path(400), [0], 1000, 1, {}, { signal: controller.signal, onProgress: () => {} });
      setTimeout(() => controller.abort(), 200);
      await assert.rejects(run, (e: Error) => e.name === 'AbortError');
      // a guard against hanging, not a speed test
      assert.ok(performance.now() - started < 30_000);
      const pre = new AbortController();
      pre.abort();
      await assert.rejects(pool.simulate(path(5), [0], 10, 1, {}, { signal: pre.signal }), (e: Error) => e.name === 'AbortError');
    } finally {
      await pool.close();
    }
  });

  it('bad input is an EngineError raised before any worker runs', async () => {
    const pool = new SimulationPool(1);
    try {
      await assert.rejects(pool.simulate(path(5), [], 10, 1), (e: unknown) => e instanceof EngineError && e.code === 'INVALID_STARTERS');
      await assert.rejects(pool.simulate(path(5), [9], 10, 1), (e: unknown) => e instanceof EngineError && e.code === 'UNKNOWN_PERSON');
      await assert.rejects(pool.simulate(path(5), [0], 0, 1), (e: unknown) => e instanceof EngineError && e.code === 'INVALID_OPTION');
      await assert.rejects(
        pool.simulate(path(5), [0], 10, 1, { laziness: 1 }),
        (e: unknown) => e instanceof EngineError && e.code === 'INVALID_OPTION',
      );
    } finally {
      await pool.close();
    }
  });
});
