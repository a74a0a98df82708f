// Piscina worker entry of the vector run pool. Worker threads do not inherit a TypeScript loader
// under vitest, so the entry registers tsx's ESM hooks itself (harmless under tsx) and then loads
// the TypeScript task module (the same pattern as server/analysis/worker.mjs).
import { setPriority } from 'node:os';
import { register } from 'tsx/esm/api';

// On Linux this lowers only this thread (nice 5, not more: a busy machine must not starve a run):
// when the cores are busy, the request thread goes first.
try {
  setPriority(5);
} catch {
  // Not permitted here: the thread keeps the process's priority.
}
register();
const { runVectorTask, runVectorBatch } = await import('./run-task.ts');

export default runVectorTask;
export { runVectorBatch };
