// Bundles the command line into build/ (`npm run build:cli`; `npm ci` and `npm install` run it as
// `prepare`, `npm test` and `npm start` before they use it): no TypeScript is transpiled when
// `parley` starts. Commands stay lazy: each is its own chunk, loaded when it runs. Plain JavaScript
// so it runs before anything is built. The property worker is an entry of its own because
// `parley run` starts it as a worker thread from beside its own chunk.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
/** `node cli/build.mjs [outdir]`: a test builds into a folder of its own. */
const outdir = process.argv[2] ?? 'build';

await build({
  absWorkingDir: root,
  entryPoints: { parley: 'cli/main.ts', 'property-worker': 'cli/commands/property-worker.mjs', 'sweep-worker': 'cli/commands/sweep-worker.mjs' },
  outdir,
  outExtension: { '.js': '.mjs' },
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  // The bundle loads the engine directly; the source tree loads it through tsx (property-worker.mjs).
  define: { 'process.env.PARLEY_BUNDLED': '"1"' },
  external: ['tsx', 'tsx/*'],
  // CommonJS packages bundled into ESM still call require() for Node's built-ins.
  banner: { js: "import { createRequire as __parleyRequire } from 'node:module'; const require = __parleyRequire(import.meta.url);" },
  minifySyntax: true,
  legalComments: 'none',
  logLevel: 'warning',
});
