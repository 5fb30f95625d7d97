/**
 * Walk kernel for any walk options: one walk at a time. Per hop: with probability `laziness` stay
 * put; else with probability `mixing` go to anyone in the room (uniformly, oneself included);
 * else a person with no outgoing tie stays put and everyone else takes a tie in proportion to
 * its strength (alias table). The xor128 step is inlined; each decision takes its own draw.
 */
import type { CascadeTally } from './cascade-tally';
import type { SimPlan } from './plan';
import type { Xor128State } from './stream';

/** 2^-32: turns a 32-bit draw into a uniform number in [0, 1). */
export const TO_UNIT = 2.3283064365386963e-10;

// eslint-disable-next-line max-lines-per-function -- the hot loop of every rehearsal; its state lives in locals so the JIT keeps it in registers, which calls per step would defeat.
export function runCascadeGeneral(plan: SimPlan, st: Xor128State, tally: CascadeTally): void {
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
  const sample = tally.sample;
  for (let q = 0; q < walkers.length; q++) {
    const start = walkers[q];
    let v = start;
    let h = 0;
    const path = sample ? sample.paths[q] : null;
    const pathCap = sample ? sample.pathCap : 0;
    if (path) path.push(v);
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
          if (path && path.length < pathCap) path.push(v);
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
          if (path && path.length < pathCap) path.push(v);
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
      if (path && path.length < pathCap) path.push(v);
    }
    tally.walk(q, start, h, isStarter[v] === 1);
  }
}
