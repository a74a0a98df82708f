// The worker thread of `parley run`'s property pool (./run.ts). Plain JavaScript so that it starts
// the same under tsx, vitest or plain Node: from the source tree it loads the TypeScript engine
// through tsx's loader; in the bundle (cli/build.mjs) the engine is a chunk beside it. It checks
// one property vector per message with the same facade the browser's worker uses.
import { parentPort } from 'node:worker_threads';

const loadEngine =
  process.env.PARLEY_BUNDLED === '1' ? () => import('../../shared/vectors/index.ts') : async () => (await import('tsx/esm/api')).tsImport('../../shared/vectors/index.ts', import.meta.url);

const ready = loadEngine();
ready.then(
  () => parentPort.postMessage({ ready: true }),
  (error) => parentPort.postMessage({ fatal: String(error?.stack || error) }),
);
parentPort.on('message', async (job) => {
  const engine = await ready;
  const outcome = await engine.checkProperty(job.code, job.options, engine.engine);
  parentPort.postMessage({ id: job.id, outcome });
});
