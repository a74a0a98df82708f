/**
 * The report lists the messages around each finding from every stored message of the trace, not
 * from the timeline's first 20,000 (which, for a finding later in a long capture, listed the
 * messages around message 20,000 instead). A 30,002-message trace (tests/support/numbered-trace.ts,
 * built with the engine's codec) ends with one VBUS reading of 5 V under its 9 V contract: the
 * analyser's VBUS rule fires there, past the timeline's end, and both the team's report route and
 * the read-only shared report list the three messages before it.
 */
import { appendFileSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { numberedMessageAt, writeNumberedTrace } from '../support/numbered-trace.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/** The offer and its GoodCRC, then 5,000 cycles of six: the last message is the last PS_RDY's GoodCRC. */
const MESSAGES = 2 + 5_000 * 6;

let t: TestApp;
let dataDir: string;
let support: ReturnType<typeof supertest.agent>;
let id: number;
let readingUs: number;

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'parley-report-around-'));
  t = await createTestApp({ dataDir });
  support = await t.signInAs('support');
  const path = join(dataDir, 'numbered-low-vbus.jsonl');
  writeNumberedTrace(path, MESSAGES, 'Kestrel K65 numbered soak, VBUS drops at the end');
  // 200 ms after the last PS_RDY's GoodCRC, in the steady 9 V contract: 5 V is far below 9 V − 5 %
  // (USB PD R3.2 V1.1 §7.1, vSrcNew; from memory, as shared/trace/vbus.ts).
  readingUs = numberedMessageAt(MESSAGES - 1).t + 200_000;
  appendFileSync(path, `{"t":${readingUs},"vbus":{"mv":5000,"ma":2000}}\n`);
  const res = await support.post('/api/traces').attach('file', readFileSync(path), 'numbered-low-vbus.jsonl');
  expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
  id = res.body.trace.id;
}, 180_000);

afterAll(async () => {
  await t.close();
  rmSync(dataDir, { recursive: true, force: true });
});

/** The last three rows other than GoodCRC before the reading: the last cycle's Request, Accept and PS_RDY. */
function lastThreeRows() {
  const rows = [];
  for (let index = MESSAGES - 1; rows.length < 3; index--) {
    const m = numberedMessageAt(index);
    if (m.messageType !== 'GoodCRC') rows.unshift({ index, t: m.t, messageType: m.messageType, messageId: m.messageId, from: m.from });
  }
  return rows;
}
const fields = (m: { index: number; t: number; messageType: string; messageId: number; from: string }) => ({
  index: m.index,
  t: m.t,
  messageType: m.messageType,
  messageId: m.messageId,
  from: m.from,
});

describe('the messages around a finding past the timeline', () => {
  it('the finding is there, after the timeline kept its first 20,000 messages', async () => {
    const { analysis } = (await support.get(`/api/traces/${id}`)).body;
    expect(analysis.timeline.messages.length).toBe(20_000);
    const low = analysis.findings.filter((f: { t?: number }) => f.t === readingUs);
    expect(low.map((f: { rule: string }) => f.rule)).toEqual(['vbus.out-of-range']);
  });

  it('GET /api/traces/:id/messages-around-findings lists the last cycle before it', async () => {
    const res = await support.get(`/api/traces/${id}/messages-around-findings`);
    expect(res.status).toBe(200);
    const around = res.body.items.find((item: { t: number }) => item.t === readingUs);
    expect(around.messages.map(fields)).toEqual(lastThreeRows());
    expect(around.messages.every((m: { messageType: string }) => m.messageType !== 'GoodCRC')).toBe(true);
    expect((await t.request().get(`/api/traces/${id}/messages-around-findings`)).status).toBe(401);
  });

  it('the shared report carries the same messages for a reader without an account', async () => {
    const made = await support.post(`/api/traces/${id}/share-links`).send({ expiresInDays: 7 });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const opened = await t.request().get(`/api/shared/reports/${made.body.url.slice(made.body.url.lastIndexOf('/') + 1)}`);
    expect(opened.status).toBe(200);
    const around = opened.body.aroundFindings.items.find((item: { t: number }) => item.t === readingUs);
    expect(around.messages.map(fields)).toEqual(lastThreeRows());
  });
});
