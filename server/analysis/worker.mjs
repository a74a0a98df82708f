// Piscina worker entry. Worker threads do not inherit a TypeScript loader under vitest, so the
// entry registers tsx's ESM hooks itself (harmless when the process already runs under tsx)
// and then loads the TypeScript task module.
import { register } from 'tsx/esm/api';

register();
const { analyseFile, analyseAndStore, readRecords } = await import('./analyse-file.ts');

export default analyseFile;
export { analyseAndStore, readRecords };
