import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyseTrace } from '../../../shared/trace/index.ts';
import { openOrm } from '../orm.ts';
import { seedDemo } from '../seed.ts';
import { Trace } from '../trace-entities.ts';
import { demoTraceFolder, readDemoManifest } from './manifest.ts';
import { buildDemoTraces } from './scenarios.ts';

const traces = buildDemoTraces();

describe('the demo traces', () => {
  it('are the files generate.ts writes (run it after changing a scenario)', () => {
    for (const trace of traces) expect(readFileSync(join(demoTraceFolder, trace.fileName), 'utf8'), trace.fileName).toBe(trace.content);
    expect(readDemoManifest().map((e) => e.fileName)).toEqual(traces.map((t) => t.fileName));
  });

  it.each(traces.map((t) => [t.fileName, t] as const))('%s shows its fault and nothing worse', (_name, trace) => {
    const result = analyseTrace(trace.content);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const rules = result.analysis.findings.map((f) => f.rule);
    expect(rules).toEqual(expect.arrayContaining(trace.expectRules));
    // Every error or warning is one the scenario meant to show.
    const serious = result.analysis.findings.filter((f) => f.severity !== 'info').map((f) => f.rule);
    expect(serious.filter((r) => !trace.expectRules.includes(r))).toEqual([]);
    expect(result.analysis.contracts.length).toBeGreaterThan(0);
  });

  it('are stored and analysed by the demo seed when it has a data folder', async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'parley-demo-seed-'));
    const orm = await openOrm({ dbName: ':memory:' });
    try {
      expect(await seedDemo(orm.em.fork(), { now: () => new Date('2026-12-01T10:00:00Z') }, { dataDir })).toBe(true);
      const rows = await orm.em.fork().find(Trace, {}, { orderBy: { createdAt: 'asc' } });
      expect(rows.map((r) => r.fileName)).toEqual(traces.map((t) => t.fileName));
      expect(rows.every((r) => r.status === 'done' && r.deviceId !== null)).toBe(true);
      for (const [i, row] of rows.entries()) for (const rule of traces[i]!.expectRules) expect(row.rules).toContain(` ${rule} `);
      expect(rows[0]!.errorCount + rows[0]!.warningCount).toBe(0);
    } finally {
      await orm.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  });
});
