/** Browser-safe rehearsal API. The Node-only worker pool is imported from './pool' directly. */
export { buildAliasRows, type AliasRows } from './alias';
export { runGenerator, runState, type Xor128State } from './stream';
export { emptyPartial, mergePartials, runsOf, type SampleCascade, type SimPartial } from './partial';
export { planSimulation, SIMULATE_DEFAULTS, type SimPlan, type SimulateOptions } from './plan';
export { simulateRange } from './simulate-range';
export { summarize, Z95, Z99, type SimulationSummary } from './summary';
export { chunkRanges, simulate, type RunRange } from './run-local';
