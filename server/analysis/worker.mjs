// Piscina worker entry. Worker threads do not inherit a TypeScript loader under vitest, so the
// entry registers tsx's ESM hooks itself (harmless when the process already runs under tsx)
// and then loads the TypeScript task module.
import { setPriority } from 'node:os';
import { register } from 'tsx/esm/api';

// On Linux this lowers only this thread: when the cores are busy, the request thread goes first.
try {
  setPriority(10);
} catch {
  // Not permitted here: the thread keeps the process's priority.
}
register();
const { analyzeFile, readRecords } = await import('./analyze-file.ts');

export default analyzeFile;
export { readRecords };
