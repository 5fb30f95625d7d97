/**
 * Simulated cascades (engine.md section 4): in run r every person who is not briefed walks the
 * room (the walk of walk.ts: a tie chosen in proportion to its strength, with probability
 * `mixing` anyone in the room, a person without ties stays put, and with probability `laziness`
 * the hop is spent staying put) until the walk reaches a starter; the number of hops is when
 * that person hears. Each hop costs O(1) (alias tables). A walk that reaches `hopCap` is stopped,
 * counted in `capped`, and enters the statistics at the cap (so the mean is then a lower bound).
 */
import { EngineError } from '../errors';
import type { RoomInput } from '../room';
import { runCascadeGeneral } from './cascade-general';
import { runCascadePaired } from './cascade-paired';
import { CascadeTally, type SampleBuilder } from './cascade-tally';
import { emptyPartial, type SampleCascade, type SimPartial } from './partial';
import { planSimulation, type SimPlan, type SimulateOptions } from './plan';
import { runState } from './stream';

/** Runs runFrom .. runTo-1 of the rehearsal with this seed; the result merges with mergePartials. */
export function simulateRange(
  graph: RoomInput,
  starters: readonly number[],
  options: SimulateOptions,
  seed: string | number,
  runFrom: number,
  runTo: number,
): SimPartial {
  if (!Number.isInteger(runFrom) || !Number.isInteger(runTo) || runFrom < 0 || runTo < runFrom) {
    throw new EngineError('INVALID_OPTION', `run range ${runFrom}..${runTo} is not a range of whole numbers from 0 upwards`);
  }
  const plan = planSimulation(graph, starters, options);
  const part = emptyPartial(plan.room.n, runFrom, runTo);
  for (let r = runFrom; r < runTo; r++) {
    const sample = r < plan.samples ? startSample(plan, r) : null;
    const k = r - runFrom + 1;
    const tally = new CascadeTally(part, k, sample);
    // Without laziness and mixing every hop is one draw: two walks advance side by side (faster).
    if (plan.room.laziness === 0 && plan.room.mixing === 0) runCascadePaired(plan, runState(seed, r), tally);
    else runCascadeGeneral(plan, runState(seed, r), tally);
    const total = tally.finish();
    const d = total - part.totalMean;
    part.totalMean += d / k;
    part.totalM2 += d * (total - part.totalMean);
    if (sample) part.samples.push(finishSample(sample));
  }
  return part;
}

function startSample(plan: SimPlan, run: number): SampleBuilder {
  const w = plan.walkers.length;
  return {
    run,
    people: plan.walkers.slice(),
    hops: new Int32Array(w),
    capped: new Uint8Array(w),
    truncated: new Uint8Array(w),
    paths: Array.from({ length: w }, () => []),
    pathCap: plan.samplePathCap,
  };
}

function finishSample(s: SampleBuilder): SampleCascade {
  const pathStart = new Int32Array(s.people.length + 1);
  for (let q = 0; q < s.people.length; q++) pathStart[q + 1] = pathStart[q] + s.paths[q].length;
  const path = new Int32Array(pathStart[s.people.length]);
  for (let q = 0; q < s.people.length; q++) path.set(s.paths[q], pathStart[q]);
  return { run: s.run, people: s.people, hops: s.hops, capped: s.capped, truncated: s.truncated, pathStart, path };
}
