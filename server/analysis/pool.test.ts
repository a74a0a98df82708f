import { afterAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { demoTraceFolder } from '../db/demo-traces/manifest.ts';
import { createAnalysisPool, type AnalysisProgress } from './pool.ts';

// One thread: the machine is shared; the test checks the worker loads its TypeScript under vitest.
const pool = createAnalysisPool({ maxThreads: 1, idleTimeoutMs: 1_000 });
afterAll(() => pool.close());

describe('the analysis pool', () => {
  it('analyses a stored trace in a worker thread and reports progress up to the whole file', async () => {
    const progress: AnalysisProgress[] = [];
    const result = await pool.analyze(join(demoTraceFolder, 'k65-pps-stops.trace.jsonl'), { onProgress: (p) => progress.push(p) });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.analysis.format).toBe('jsonl');
    expect(result.analysis.findings.map((f) => f.rule)).toContain('timing.pps-keepalive');
    // Progress arrives through a MessagePort, so it may land just after the result.
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(progress.at(-1)).toEqual({ bytesRead: result.bytesRead, totalBytes: result.bytesRead });
  });

  it('answers a missing file with an error value, not a crash', async () => {
    const result = await pool.analyze('/nonexistent/parley-trace');
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error.code).toBe('analysis.failed');
  });

  it('answers a file without records with trace.empty', async () => {
    const result = await pool.analyze(join(demoTraceFolder, 'manifest.ts'), { format: 'jsonl' });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error.code).toBe('trace.empty');
  });
});

describe('reading records in the pool', () => {
  it('returns the plain trace records of a stored file, and stops at the limit', async () => {
    const path = join(demoTraceFolder, 'wren14-late-request.txt');
    const result = await pool.records(path, 'text', 100_000);
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.records[0]).toEqual({ t: 0, event: 'attach', from: 'source' });
    const limited = await pool.records(path, 'text', 3);
    expect(limited).toMatchObject({ ok: false, error: { code: 'trace.too-many-records' } });
  });
});
