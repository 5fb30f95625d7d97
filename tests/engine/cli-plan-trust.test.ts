/**
 * `plan --no-show P` and the proven-gap fields of the command line, checked against an
 * independent evaluation: every attendance subset solved from scratch with exactReach, and a
 * brute-force optimum over all k-sets.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { exactReach } from '../../shared/engine/index';
import { cli, fixtures } from './cli-helpers';
import { kSets, randomRoom, relClose } from './engine-fixtures';

const g = randomRoom(9, 10, false, 404);
const csv = 'source,target,strength\n' + g.ties.map((t) => `${g.ids[t.source]},${g.ids[t.target]},${t.strength}`).join('\n') + '\n';

describe('plan --no-show and proven gaps on the command line', () => {
  it('prints noShow, expectedTotal, nobodyChance and worstAbsence that match all 2^k subsets', async () => {
    const f = fixtures({ 'room.csv': csv });
    const r = await cli(['plan', '--graph', f['room.csv'], '--k', '3', '--method', 'exhaustive', '--no-show', '0.25']);
    assert.equal(r.code, 0, r.stderr);
    const out = JSON.parse(r.stdout) as Record<string, unknown> & { starters: string[]; worstAbsence: { person: string; total: number } };
    const set = out.starters.map((id) => g.ids.indexOf(id));
    let sum = 0;
    for (let mask = 1; mask < 8; mask++) {
      const shows = set.filter((_, q) => mask & (1 << q));
      sum += 0.75 ** shows.length * 0.25 ** (3 - shows.length) * exactReach(g, shows).total;
    }
    assert.equal(out.noShow, 0.25);
    assert.ok(relClose(out.expectedTotal as number, sum / (1 - 0.25 ** 3), 1e-9));
    assert.ok(relClose(out.nobodyChance as number, 0.25 ** 3, 1e-12));
    const missing = set.map(
      (s) =>
        exactReach(
          g,
          set.filter((t) => t !== s),
        ).total,
    );
    assert.ok(relClose(out.worstAbsence.total, Math.max(...missing), 1e-9));
    assert.equal(out.worstAbsence.person, out.starters[missing.indexOf(Math.max(...missing))]);
  });

  it('a certified plan prints lowerBound = total, gap 0 and nothing left to search', async () => {
    const f = fixtures({ 'room.csv': csv });
    const r = await cli(['plan', '--graph', f['room.csv'], '--k', '3', '--method', 'auto']);
    assert.equal(r.code, 0, r.stderr);
    const out = JSON.parse(r.stdout) as Record<string, number | boolean>;
    let best = Infinity;
    for (const s of kSets(9, 3)) best = Math.min(best, exactReach(g, s).total);
    assert.equal(out.certified, true);
    assert.equal(out.lowerBound, out.total);
    assert.equal(out.gap, 0);
    assert.equal(out.searchLeft, 0);
    assert.ok(relClose(out.total as number, best, 1e-9));
  });

  it('refuses a no-show chance outside 0..0.5 with a clear message', async () => {
    const f = fixtures({ 'room.csv': csv });
    const r = await cli(['plan', '--graph', f['room.csv'], '--k', '3', '--no-show', '0.7']);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /--no-show must be a number with 0 <= no-show <= 0.5/);
  });
});
