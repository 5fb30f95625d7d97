/** Piscina worker of the rehearsal pool: runs one chunk of runs and returns its partial. */
import type { SimPartial } from './partial';
import type { SimTask } from './pool';
import { simulateRange } from './simulate-range';

export default function runChunk(task: SimTask): SimPartial {
  return simulateRange(task.room, task.starters, task.options, task.seed, task.runFrom, task.runTo);
}
