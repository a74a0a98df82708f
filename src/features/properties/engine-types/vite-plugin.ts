/**
 * `virtual:parley/engine-types`: the Properties editor's type declarations (./build-engine-types.ts)
 * as a module exporting `TypeDeclaration[]`. Built once per Vite process, when the page's lazy
 * chunk first asks for it, so builds that never reach the page pay nothing.
 */
import type { Plugin } from 'vite';
import { buildEngineTypes } from './build-engine-types.ts';

export const engineTypesModuleId = 'virtual:parley/engine-types';
const resolvedId = `\0${engineTypesModuleId}`;

export function engineTypesPlugin(): Plugin {
  let built: Promise<string> | null = null;
  let root = process.cwd();
  return {
    name: 'parley-engine-types',
    configResolved(config) {
      root = config.root;
    },
    resolveId(id) {
      return id === engineTypesModuleId ? resolvedId : undefined;
    },
    load(id) {
      if (id !== resolvedId) return undefined;
      built ??= buildEngineTypes(root).then((declarations) => `export default ${JSON.stringify(declarations)};\n`);
      return built;
    },
  };
}
