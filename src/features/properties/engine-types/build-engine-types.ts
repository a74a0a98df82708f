/**
 * Type declarations for the Properties page's editor, built from the source so they never drift:
 * the engine facade's declarations (emitted by the project's own `tsc` into a temp folder), and the
 * shipped `.d.ts` files of fast-check, pure-rand (which fast-check's types import) and zod (which
 * the scenario and policy types are inferred from). Monaco sees them as files under
 * `file:///node_modules/…`, so `import('fast-check')` and `import('@parley/engine')` resolve as
 * they would in a project. Build-time only (Node): the Vite plugin in ./vite-plugin.ts serves the
 * result as a virtual module.
 */
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, posix, relative, sep } from 'node:path';

export type TypeDeclaration = { filePath: string; content: string };

/** The facade module the declarations start from (shared/vectors/engine-facade.ts). */
export const facadeEntry = 'shared/vectors/engine-facade.ts';
export const engineRoot = 'file:///node_modules/@parley/engine';

/** The global type a property's default function is annotated with for completion. */
export const contextDeclaration = `/** What a property's default function receives: \`export default ({ fc, engine }: PropertyContext) => fc.property(…)\`. */
type PropertyContext = {
  /** fast-check: arbitraries, fc.property, fc.pre, … */
  fc: typeof import('fast-check');
  /** Parley's engine: codec, rules, sim, trace and arbitraries. */
  engine: import('@parley/engine').Engine;
};
`;

const engineIndex = `export { engine } from './shared/vectors/engine-facade.js';
export type Engine = typeof import('./shared/vectors/engine-facade.js').engine;
`;

/** `'./x.ts'` imports (allowImportingTsExtensions) become `'./x.js'`, which Monaco resolves to x.d.ts. */
export function rewriteTsSpecifiers(text: string): string {
  return text.replace(/((?:from|import)\s*\(?\s*)(['"])(\.{1,2}\/[^'"]+)\.ts\2/g, '$1$2$3.js$2');
}

function run(command: string, args: string[], cwd: string): Promise<{ code: number; output: string }> {
  return new Promise((resolve) => {
    execFile(command, args, { cwd, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error && typeof (error as { code?: unknown }).code === 'number' ? (error as { code: number }).code : error ? 1 : 0;
      resolve({ code, output: `${stdout}${stderr}` });
    });
  });
}

async function listFiles(folder: string): Promise<string[]> {
  const entries = await readdir(folder, { withFileTypes: true, recursive: true });
  return entries.filter((entry) => entry.isFile()).map((entry) => join(entry.parentPath, entry.name));
}

/** Emits the facade's declarations with the repository's tsc; other people's type errors do not stop the emit. */
async function engineDeclarations(repoRoot: string): Promise<TypeDeclaration[]> {
  const work = await mkdtemp(join(tmpdir(), 'parley-engine-types-'));
  try {
    const outDir = join(work, 'out');
    const config = {
      extends: join(repoRoot, 'tsconfig.json'),
      compilerOptions: { declaration: true, emitDeclarationOnly: true, noEmit: false, outDir, rootDir: repoRoot, types: [] },
      files: [join(repoRoot, facadeEntry)],
      include: [],
    };
    await writeFile(join(work, 'tsconfig.json'), JSON.stringify(config));
    const tsc = join(repoRoot, 'node_modules', '.bin', 'tsc');
    const result = await run(tsc, ['-p', join(work, 'tsconfig.json')], repoRoot);
    const facade = join(outDir, facadeEntry.replace(/\.ts$/, '.d.ts'));
    if (!existsSync(facade)) throw new Error(`tsc emitted no declarations for ${facadeEntry}:\n${result.output.slice(0, 2_000)}`);
    const files = (await listFiles(outDir)).filter((file) => file.endsWith('.d.ts'));
    const declarations = await Promise.all(
      files.map(async (file) => ({
        filePath: `${engineRoot}/${relative(outDir, file).split(sep).join('/')}`,
        content: rewriteTsSpecifiers(await readFile(file, 'utf8')),
      })),
    );
    declarations.push({ filePath: `${engineRoot}/index.d.ts`, content: engineIndex });
    return declarations;
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}

const specifierPattern = /(?:from|import)\s*\(?\s*['"](\.{1,2}\/[^'"]+)['"]/g;

/** A package's `.d.ts` files reachable from its entries by relative imports, placed at `file:///node_modules/<name>/<as>`. */
async function packageDeclarations(repoRoot: string, name: string, entries: { file: string; as: string }[]): Promise<TypeDeclaration[]> {
  const packageDir = join(repoRoot, 'node_modules', name);
  const found = new Map<string, TypeDeclaration>();
  const visit = async (file: string, as: string): Promise<void> => {
    if (found.has(as)) return;
    const content = await readFile(join(packageDir, file), 'utf8');
    found.set(as, { filePath: `file:///node_modules/${name}/${as}`, content });
    for (const match of content.matchAll(specifierPattern)) {
      const specifier = match[1]!;
      const base = specifier.replace(/\.js$/, '');
      const candidates = [`${base}.d.ts`, `${base}/index.d.ts`];
      const target = candidates.map((c) => posix.join(posix.dirname(file), c)).find((c) => existsSync(join(packageDir, c)));
      if (target) await visit(target, posix.join(posix.dirname(as), posix.relative(posix.dirname(file), target)));
    }
  };
  for (const entry of entries) await visit(entry.file, entry.as);
  return [...found.values()];
}

/** Every declaration the editor needs, engine first. */
export async function buildEngineTypes(repoRoot: string): Promise<TypeDeclaration[]> {
  const engine = await engineDeclarations(repoRoot);
  // fast-check's `types` condition for TypeScript ≥ 5.7 (Monaco 0.57 carries 5.9).
  const fastCheck = await packageDeclarations(repoRoot, 'fast-check', [{ file: 'lib/fast-check.d.ts', as: 'index.d.ts' }]);
  const pureRand = await packageDeclarations(repoRoot, 'pure-rand', [
    { file: 'lib/esm/types/RandomGenerator.d.ts', as: 'types/RandomGenerator.d.ts' },
    { file: 'lib/esm/types/JumpableRandomGenerator.d.ts', as: 'types/JumpableRandomGenerator.d.ts' },
  ]);
  const zod = await packageDeclarations(repoRoot, 'zod', [{ file: 'index.d.ts', as: 'index.d.ts' }]);
  return [...engine, ...fastCheck, ...pureRand, ...zod, { filePath: 'file:///parley/property-context.d.ts', content: contextDeclaration }];
}
