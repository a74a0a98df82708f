// The entry bench/sweep.bench.ts bundles (as the CLI's build does: no transpiler in the measured
// loop): the sweep engine and the bare simulator it is compared with.
export { planSweep, runSlice, scenarioFor } from '../shared/sweep/index.ts';
export { simulate } from '../shared/sim/simulate.ts';
export { parseScenario } from '../shared/sim/index.ts';
