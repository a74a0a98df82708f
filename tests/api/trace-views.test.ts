/**
 * The trace page's reads (issue: big inputs stay flat; house: stored analysis without the decoded
 * messages). An 8 MB trace is stored once, compressed, without the decoded form of each message;
 * the page reads the summary, pages of findings and windows of the timeline.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type supertest from 'supertest';
import { createTestApp, type TestApp } from '../support/test-app.ts';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';
import { TraceChunk, TraceItem } from '../../server/db/trace-entities.ts';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';

let t: TestApp;
let dataDir: string;
let support: ReturnType<typeof supertest.agent>;
let bigId: number;
let bigBytes: number;
let demoId: number;

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'parley-trace-views-'));
  t = await createTestApp({ dataDir });
  support = await t.signInAs('support');
  const path = join(dataDir, 'soak.jsonl');
  bigBytes = writeSyntheticTrace(path, 8 * 1024 * 1024);
  const big = await support.post('/api/traces').attach('file', readFileSync(path), 'soak.jsonl');
  expect(big.status, JSON.stringify(big.body).slice(0, 300)).toBe(201);
  bigId = big.body.trace.id;
  const demo = await support.post('/api/traces').attach('file', readFileSync(join(demoTraceFolder, 'k65-pps-stops.trace.jsonl')), 'k65.jsonl');
  expect(demo.status).toBe(201);
  demoId = demo.body.trace.id;
}, 120_000);

afterAll(async () => {
  await t.close();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('the stored analysis', () => {
  it('of an 8 MB trace stays under 1.5× the file with every message in it, none decoded', async () => {
    const res = await support.get(`/api/traces/${bigId}`);
    expect(res.status).toBe(200);
    const sha = res.body.trace.sha256 as string;
    const fileBytes = statSync(join(dataDir, 'traces', `${sha}.analysis`)).size;
    const em = t.orm.em.fork();
    const rowBytes = [...(await em.find(TraceItem, { traceId: bigId })), ...(await em.find(TraceChunk, { traceId: bigId }))].reduce((sum, row) => sum + row.body.length, 0);
    expect(bigBytes).toBeGreaterThan(8_000_000);
    expect((fileBytes + rowBytes) / bigBytes).toBeLessThan(1.5);
    const messages = res.body.analysis.timeline.messages as Record<string, unknown>[];
    // The whole analysis keeps the timeline's first 20,000; the message chunks (counted above) hold all.
    expect(messages.length).toBe(20_000);
    expect(messages.every((m) => typeof m.hex === 'string' && !('decoded' in m))).toBe(true);
    const summary = (await support.get(`/api/traces/${bigId}/summary`)).body.analysis;
    expect(summary.timeline.messages).toBe(summary.messages);
    expect(summary.messages).toBeGreaterThan(60_000);
  });

  it('is sent compressed as stored, and plain to a client that does not take gzip', async () => {
    const gz = await support.get(`/api/traces/${demoId}`).set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    const plain = await support.get(`/api/traces/${demoId}`).set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body).toEqual(gz.body);
    expect(gz.body.trace).toMatchObject({ id: demoId, status: 'done' });
    expect(gz.body.analysis.findings.map((f: { rule: string }) => f.rule)).toContain('timing.pps-keepalive');
    expect(gz.body.progress).toBeNull();
  });
});

describe('the trace page reads', () => {
  it('GET /summary: the analysis without its lists, with their lengths and the end of the trace', async () => {
    const full = (await support.get(`/api/traces/${demoId}`)).body;
    const res = await support.get(`/api/traces/${demoId}/summary`);
    expect(res.status).toBe(200);
    const a = res.body.analysis;
    expect(a).not.toHaveProperty('findings');
    expect(a).not.toHaveProperty('contracts');
    expect(a.summary).toBe(full.analysis.summary);
    expect(a.counts).toEqual(full.analysis.counts);
    expect(a.findingsListed).toBe(full.analysis.findings.length);
    expect(a.contractsListed).toBe(full.analysis.contracts.length);
    expect(a.timeline.messages).toBe(full.analysis.timeline.messages.length);
    const lastMessage = full.analysis.timeline.messages.at(-1);
    expect(a.endUs).toBeGreaterThanOrEqual(lastMessage.t + lastMessage.durationUs);
    expect(res.body.trace.id).toBe(demoId);
  });

  it('GET /findings and /contracts: pages in list order, filtered by severity in SQL', async () => {
    const full = (await support.get(`/api/traces/${demoId}`)).body.analysis;
    const page2 = await support.get(`/api/traces/${demoId}/findings?page=2&pageSize=2`);
    expect(page2.body.total).toBe(full.findings.length);
    expect(page2.body.items.map((f: { index: number }) => f.index)).toEqual([2, 3].filter((i) => i < full.findings.length));
    expect(page2.body.items[0]).toEqual({ ...full.findings[2], index: 2 });
    const errors = await support.get(`/api/traces/${demoId}/findings?severity=error&pageSize=500`);
    expect(errors.body.total).toBe(full.findings.filter((f: { severity: string }) => f.severity === 'error').length);
    expect(errors.body.items.every((f: { severity: string }) => f.severity === 'error')).toBe(true);
    const contracts = await support.get(`/api/traces/${demoId}/contracts?pageSize=500`);
    expect(contracts.body.items.map(({ index: _i, ...c }: { index: number }) => c)).toEqual(full.contracts);
    expect((await support.get(`/api/traces/${demoId}/findings?pageSize=501`)).status).toBe(400);
  });

  it('GET /timeline: a whole-trace window is bounded; a narrow one has every reading and message in it', async () => {
    const whole = await support.get(`/api/traces/${bigId}/timeline?points=1000&limit=500`);
    expect(whole.status).toBe(200);
    expect(whole.body.measurementLevel).toBeGreaterThan(0);
    expect(whole.body.measurements.length).toBeLessThanOrEqual(2_500);
    expect(whole.body.messages.length).toBe(500);
    expect(whole.body.messagesOmitted).toBeGreaterThan(0);
    expect(JSON.stringify(whole.body).length).toBeLessThan(400_000);

    const full = (await support.get(`/api/traces/${bigId}`)).body.analysis.timeline;
    const startUs = 100_000_000;
    const endUs = 110_000_000;
    const narrow = (await support.get(`/api/traces/${bigId}/timeline?startUs=${startUs}&endUs=${endUs}`)).body;
    expect(narrow.measurementLevel).toBe(0);
    expect(narrow.measurements).toEqual(full.measurements.filter((m: { t: number }) => m.t >= startUs && m.t <= endUs));
    const expected = full.messages
      .map((m: { t: number; durationUs: number }, index: number) => ({ ...m, index }))
      .filter((m: { t: number; durationUs: number }) => m.t + m.durationUs >= startUs && m.t <= endUs);
    expect(narrow.messages).toEqual(expected);
    expect(narrow.messagesOmitted).toBe(0);
    // The readings either side of the window, which carry the held value to its edges.
    const measurements = full.measurements as { t: number }[];
    expect(narrow.readingBefore).toEqual(measurements.findLast((m) => m.t < startUs));
    expect(narrow.readingAfter).toEqual(measurements.find((m) => m.t > endUs));
    // A window between two readings holds none, and still has the two readings around it.
    const pair = measurements.findIndex((m, i) => i > 0 && m.t - measurements[i - 1]!.t > 2);
    const [a, b] = [measurements[pair - 1]!, measurements[pair]!];
    const between = (await support.get(`/api/traces/${bigId}/timeline?startUs=${a.t + 1}&endUs=${b.t - 1}`)).body;
    expect(between.measurements).toEqual([]);
    expect([between.readingBefore, between.readingAfter]).toEqual([a, b]);
    // Before the first reading and after the last, there is nothing either side.
    const first = measurements[0]!;
    const last = measurements[measurements.length - 1]!;
    expect((await support.get(`/api/traces/${bigId}/timeline?startUs=0&endUs=${Math.max(0, first.t - 1)}`)).body.readingBefore).toBeNull();
    expect((await support.get(`/api/traces/${bigId}/timeline?startUs=${last.t + 1}&endUs=${last.t + 1_000_000}`)).body.readingAfter).toBeNull();
    expect((await support.get(`/api/traces/${bigId}/timeline?startUs=5&endUs=4`)).status).toBe(400);
  });

  it('GET /messages: any run of the whole trace by index or from a time, with the offer in force before it', async () => {
    // The whole analysis carries the first 20,000 messages: the reference for runs among them
    // (runs past them: trace-messages.test.ts, on a trace whose every message is known).
    const full = (await support.get(`/api/traces/${bigId}`)).body.analysis.timeline.messages as { t: number; messageType: string; crcOk: boolean }[];
    const total = (await support.get(`/api/traces/${bigId}/summary`)).body.analysis.messages as number;
    const indexed = full.map((m, index) => ({ ...m, index }));
    const first = (await support.get(`/api/traces/${bigId}/messages?limit=5`)).body;
    expect(first).toEqual({ offset: 0, total, items: indexed.slice(0, 5), capabilities: null });
    // Across a chunk boundary (500 messages a chunk) and deep into the trace.
    const across = (await support.get(`/api/traces/${bigId}/messages?offset=497&limit=6`)).body;
    expect(across.items).toEqual(indexed.slice(497, 503));
    const deep = (await support.get(`/api/traces/${bigId}/messages?offset=15001&limit=200`)).body;
    expect(deep.items).toEqual(indexed.slice(15_001, 15_201));
    const lastCaps = indexed.slice(0, 15_001).findLast((m) => m.messageType === 'Source_Capabilities' && m.crcOk);
    expect(lastCaps).toBeDefined();
    expect(deep.capabilities).toEqual(lastCaps);
    const atUs = full[12_345]!.t;
    const byTime = (await support.get(`/api/traces/${bigId}/messages?atUs=${atUs}&limit=3`)).body;
    expect(byTime.offset).toBe(indexed.findIndex((m) => m.t >= atUs));
    expect(byTime.items).toEqual(indexed.slice(byTime.offset, byTime.offset + 3));
    // The timeline's 20,000th message is not the end: the run goes on past it.
    const across20k = (await support.get(`/api/traces/${bigId}/messages?offset=19998&limit=10`)).body;
    expect(across20k.items.map((m: { index: number }) => m.index)).toEqual([19_998, 19_999, 20_000, 20_001, 20_002, 20_003, 20_004, 20_005, 20_006, 20_007]);
    expect(across20k.items.slice(0, 2)).toEqual(indexed.slice(19_998));
    const end = (await support.get(`/api/traces/${bigId}/messages?offset=${total - 2}&limit=10`)).body;
    expect(end.items.map((m: { index: number }) => m.index)).toEqual([total - 2, total - 1]);
    const past = (await support.get(`/api/traces/${bigId}/messages?atUs=${end.items[1].t + 1}`)).body;
    expect(past).toMatchObject({ offset: total, total, items: [] });
    // Folded: rows are the messages other than GoodCRC; each run carries the GoodCRCs up to the next row.
    const rowIndices = indexed.filter((m) => m.messageType !== 'GoodCRC').map((m) => m.index);
    const folded = (await support.get(`/api/traces/${bigId}/messages?fold=goodcrc&offset=7001&limit=300`)).body;
    expect(folded.total).toBeGreaterThan(rowIndices.length);
    expect(folded.offset).toBe(7_001);
    expect(folded.items).toEqual(indexed.slice(rowIndices[7_001], rowIndices[7_301]));
    expect(folded.items.filter((m: { messageType: string }) => m.messageType !== 'GoodCRC')).toHaveLength(300);
    const foldedAt = (await support.get(`/api/traces/${bigId}/messages?fold=goodcrc&atUs=${atUs}&limit=2`)).body;
    expect(rowIndices[foldedAt.offset]).toBe(indexed.findIndex((m) => m.t >= atUs && m.messageType !== 'GoodCRC'));
    const foldedEnd = (await support.get(`/api/traces/${bigId}/messages?fold=goodcrc&offset=${folded.total - 1}`)).body;
    expect(foldedEnd.items[0].messageType).not.toBe('GoodCRC');
    expect(foldedEnd.items.at(-1).index).toBe(total - 1);
    expect((await support.get(`/api/traces/${bigId}/messages?limit=1001`)).status).toBe(400);
    expect((await support.get(`/api/traces/${bigId}/messages?offset=-1`)).status).toBe(400);
  });

  it('answers 404 for a trace that does not exist and 401 without a session', async () => {
    expect((await support.get('/api/traces/999999/summary')).status).toBe(404);
    expect((await t.request().get(`/api/traces/${demoId}/timeline`)).status).toBe(401);
  });
});
