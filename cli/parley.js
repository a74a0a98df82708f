#!/usr/bin/env node
// The package's `parley` bin: loads the TypeScript CLI through tsx's loader.
import { register } from 'tsx/esm/api';
register();
process.env.PARLEY_CLI_ENTRY = '1';
await import('./main.ts');
