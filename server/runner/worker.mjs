// Piscina worker entry of the vector run pool. Worker threads do not inherit a TypeScript loader
// under vitest, so the entry registers tsx's ESM hooks itself (harmless under tsx) and then loads
// the TypeScript task module (the same pattern as server/analysis/worker.mjs).
import { register } from 'tsx/esm/api';

register();
const { runVectorTask, runVectorBatch } = await import('./run-task.ts');

export default runVectorTask;
export { runVectorBatch };
