// A worker thread of `parley sweep` (./sweep.ts). Plain JavaScript so that it starts the same under
// tsx, vitest or plain Node: it loads the TypeScript engine through tsx's loader, plans the same
// campaign as the main thread (the plan is deterministic) and runs the slice of it it is given.
import { parentPort, workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const sweep = await tsImport('../../shared/sweep/index.ts', import.meta.url);
const { scenario, options, start, end } = workerData;
const planned = sweep.planSweep(scenario, options);
if (!planned.ok) parentPort.postMessage({ error: planned.error.message });
else parentPort.postMessage({ runs: sweep.runSlice(planned.plan, { start, end }).runs });
