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
import { emptyPartial, growTo, type SampleCascade, type SimPartial } from './partial';
import { planSimulation, type SimPlan, type SimulateOptions } from './plan';
import { runState, type Xor128State } from './stream';

/** 2^-32: turns a 32-bit draw into a uniform number in [0, 1). */
const TO_UNIT = 2.3283064365386963e-10;

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
    const total = runCascade(plan, runState(seed, r), part, r - runFrom + 1, sample);
    const k = r - runFrom + 1;
    const d = total - part.totalMean;
    part.totalMean += d / k;
    part.totalM2 += d * (total - part.totalMean);
    if (sample) part.samples.push(finishSample(sample));
  }
  return part;
}

interface SampleBuilder {
  run: number;
  people: Int32Array;
  hops: Int32Array;
  capped: Uint8Array;
  truncated: Uint8Array;
  pathStart: Int32Array;
  path: number[];
}

function startSample(plan: SimPlan, run: number): SampleBuilder {
  const w = plan.walkers.length;
  return {
    run,
    people: plan.walkers.slice(),
    hops: new Int32Array(w),
    capped: new Uint8Array(w),
    truncated: new Uint8Array(w),
    pathStart: new Int32Array(w + 1),
    path: [],
  };
}

function finishSample(s: SampleBuilder): SampleCascade {
  return {
    run: s.run,
    people: s.people,
    hops: s.hops,
    capped: s.capped,
    truncated: s.truncated,
    pathStart: s.pathStart,
    path: Int32Array.from(s.path),
  };
}

/** One cascade: every walker walks once. Updates the partial; returns the run's total hops. */
function runCascade(plan: SimPlan, st: Xor128State, part: SimPartial, k: number, sample: SampleBuilder | null): number {
  let x = st.x | 0;
  let y = st.y | 0;
  let z = st.z | 0;
  let w = st.w | 0;
  let t = 0;
  const { rowStart, keep, col, alias } = plan.alias;
  const { isStarter, stay, walkers, hopCap } = plan;
  const n = plan.room.n;
  const a = plan.room.laziness;
  const b = plan.room.mixing;
  const mean = part.mean;
  const m2 = part.m2;
  const capped = part.capped;
  let hist = part.histogram;
  const pathCap = plan.samplePathCap;
  let runTotal = 0;
  let hopsAll = 0;
  let cappedWalks = 0;
  for (let q = 0; q < walkers.length; q++) {
    const start = walkers[q];
    let v = start;
    let h = 0;
    let stored = 0;
    if (sample) {
      sample.path.push(v);
      stored = 1;
    }
    while (isStarter[v] === 0) {
      if (h === hopCap) break;
      h++;
      if (a > 0) {
        t = x ^ (x << 11);
        x = y;
        y = z;
        z = w;
        w = w ^ (w >>> 19) ^ t ^ (t >>> 8);
        if ((w >>> 0) * TO_UNIT < a) {
          if (sample && stored < pathCap) {
            sample.path.push(v);
            stored++;
          }
          continue;
        }
      }
      if (b > 0) {
        t = x ^ (x << 11);
        x = y;
        y = z;
        z = w;
        w = w ^ (w >>> 19) ^ t ^ (t >>> 8);
        if ((w >>> 0) * TO_UNIT < b) {
          t = x ^ (x << 11);
          x = y;
          y = z;
          z = w;
          w = w ^ (w >>> 19) ^ t ^ (t >>> 8);
          v = ((w >>> 0) * TO_UNIT * n) | 0;
          if (sample && stored < pathCap) {
            sample.path.push(v);
            stored++;
          }
          continue;
        }
      }
      if (stay[v] === 0) {
        t = x ^ (x << 11);
        x = y;
        y = z;
        z = w;
        w = w ^ (w >>> 19) ^ t ^ (t >>> 8);
        const s = rowStart[v];
        const pick = (w >>> 0) * TO_UNIT * (rowStart[v + 1] - s);
        const e = s + (pick | 0);
        v = pick - (pick | 0) < keep[e] ? col[e] : alias[e];
      }
      if (sample && stored < pathCap) {
        sample.path.push(v);
        stored++;
      }
    }
    const reached = isStarter[v] === 1;
    if (reached) {
      if (h >= hist.length) hist = growTo(hist, h + 1);
      hist[h]++;
    } else {
      capped[start]++;
      cappedWalks++;
    }
    const d = h - mean[start];
    mean[start] += d / k;
    m2[start] += d * (h - mean[start]);
    runTotal += h;
    hopsAll += h;
    if (sample) {
      sample.hops[q] = h;
      sample.capped[q] = reached ? 0 : 1;
      sample.truncated[q] = h + 1 > pathCap ? 1 : 0;
      sample.pathStart[q + 1] = sample.path.length;
    }
  }
  part.histogram = hist;
  part.hops += hopsAll;
  part.cappedWalks += cappedWalks;
  return runTotal;
}
