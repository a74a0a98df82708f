// A worker thread of bench/sweep.bench.ts: runs the given sweep plan's placements in a loop for
// `seconds` and reports how many runs it finished. Plain JavaScript, loading the engine through tsx.
import { parentPort, workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const sweep = await tsImport('../shared/sweep/index.ts', import.meta.url);
const { scenario, options, seconds, warmSeconds } = workerData;
const planned = sweep.planSweep(scenario, options);
if (!planned.ok) throw new Error(planned.error.message);
const loop = (ms) => {
  let runs = 0;
  const start = performance.now();
  while (performance.now() - start < ms) runs += sweep.runSlice(planned.plan).runs.length;
  return { runs, ms: performance.now() - start };
};
loop(warmSeconds * 1_000);
parentPort.postMessage(loop(seconds * 1_000));
