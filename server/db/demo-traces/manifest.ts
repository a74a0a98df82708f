/** The demo traces' metadata, as generate.ts writes it to manifest.json and the seed reads it back. */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

export const demoTraceFolder = fileURLToPath(new URL('.', import.meta.url));

const entrySchema = z.object({
  fileName: z.string().regex(/^[a-z0-9.-]+$/),
  title: z.string(),
  deviceModel: z.string(),
  customerRef: z.string(),
  notes: z.string(),
  expectRules: z.array(z.string()),
});
export type DemoTraceEntry = z.infer<typeof entrySchema>;

export function demoManifestOf(traces: readonly DemoTraceEntry[]): DemoTraceEntry[] {
  return traces.map(({ fileName, title, deviceModel, customerRef, notes, expectRules }) => ({ fileName, title, deviceModel, customerRef, notes, expectRules }));
}

export function readDemoManifest(folder = demoTraceFolder): DemoTraceEntry[] {
  return z.array(entrySchema).parse(JSON.parse(readFileSync(join(folder, 'manifest.json'), 'utf8')));
}
