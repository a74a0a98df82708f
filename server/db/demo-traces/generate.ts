/**
 * Writes the demo traces and their manifest into this folder:
 * `npx tsx server/db/demo-traces/generate.ts`. The seed reads the files, not this script, so the
 * server does not rebuild them at start; build.test.ts keeps files and script in step.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildDemoTraces } from './scenarios.ts';
import { demoManifestOf } from './manifest.ts';

const folder = fileURLToPath(new URL('.', import.meta.url));
const traces = buildDemoTraces();
for (const trace of traces) writeFileSync(join(folder, trace.fileName), trace.content);
writeFileSync(join(folder, 'manifest.json'), `${JSON.stringify(demoManifestOf(traces), null, 2)}\n`);
process.stdout.write(`wrote ${traces.length} demo traces and manifest.json to ${folder}\n`);
