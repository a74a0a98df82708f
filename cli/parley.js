#!/usr/bin/env node
// The package's `parley` bin. It runs the bundled CLI (build/parley.mjs, made by cli/build.mjs when
// the package is installed, tested or started); a checkout that has not built it yet runs the
// TypeScript source through tsx's loader instead, which starts several times slower.
import { existsSync } from 'node:fs';

process.env.PARLEY_CLI_ENTRY = '1';
const bundle = new URL('../build/parley.mjs', import.meta.url);
if (existsSync(bundle)) {
  await import(bundle.href);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import('./main.ts');
}
