// A worker thread of `parley sweep` (./sweep.ts). Plain JavaScript so that it starts the same under
// tsx, vitest or plain Node: from the source tree it loads the TypeScript engine through tsx's
// loader; in the bundle (cli/build.mjs) the engine is a chunk beside it. It plans the same campaign
// as the main thread (the plan is deterministic) and runs the slice of it it is given.
import { parentPort, workerData } from 'node:worker_threads';

const sweep = process.env.PARLEY_BUNDLED === '1' ? await import('../../shared/sweep/index.ts') : await (await import('tsx/esm/api')).tsImport('../../shared/sweep/index.ts', import.meta.url);
const { scenario, options, start, end } = workerData;
const planned = sweep.planSweep(scenario, options);
if (!planned.ok) parentPort.postMessage({ error: planned.error.message });
else parentPort.postMessage({ runs: sweep.runSlice(planned.plan, { start, end }).runs });
