// Worker thread of a server fault sweep (./sweep-job.ts): one per running sweep, so the campaign
// never blocks the request thread. Registers tsx's ESM hooks (worker threads do not inherit a
// TypeScript loader under vitest; harmless under tsx), as server/runner/worker.mjs does, and runs
// at a lower priority so requests go first on busy cores.
import { setPriority } from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

try {
  setPriority(5);
} catch {
  // Not permitted here: the thread keeps the process's priority.
}
register();
const { runSweepTask } = await import('./sweep-task.ts');
try {
  runSweepTask(workerData, (message) => parentPort.postMessage(message));
} catch (cause) {
  parentPort.postMessage({ type: 'error', message: cause instanceof Error ? cause.message : String(cause) });
}
