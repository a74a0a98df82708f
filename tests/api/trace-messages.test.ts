/**
 * Every message of a long trace is stored and served (issue 13: the message list for 100k+ rows),
 * not only the timeline's first 20,000: a trace of 120,000 messages, each known by its place
 * (tests/support/numbered-trace.ts, built with the engine's codec), is paged by index, by time
 * and folded, past row 20,000 to the last one, and the chart's window reads them there too.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { numberedMessageAt } from '../support/numbered-trace.ts';
import { writeNumberedTrace } from '../support/numbered-trace.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

const MESSAGES = 120_000;

type Served = { index: number; t: number; messageType: string; messageId: number; from: string; crcOk: boolean; goodCrcFor?: number; retry?: boolean };

let t: TestApp;
let dataDir: string;
let support: ReturnType<typeof supertest.agent>;
let id: number;

/** What the server should answer for message `index`: the generator's fields, and a GoodCRC's link to the message before it. */
function expected(index: number) {
  const m = numberedMessageAt(index);
  return { index, t: m.t, messageType: m.messageType, messageId: m.messageId, from: m.from, crcOk: true, ...(m.messageType === 'GoodCRC' ? { goodCrcFor: index - 1 } : {}) };
}
const fields = ({ index, t, messageType, messageId, from, crcOk, goodCrcFor }: Served) => ({ index, t, messageType, messageId, from, crcOk, ...(goodCrcFor === undefined ? {} : { goodCrcFor }) });

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'parley-trace-messages-'));
  t = await createTestApp({ dataDir });
  support = await t.signInAs('support');
  const path = join(dataDir, 'numbered.jsonl');
  writeNumberedTrace(path, MESSAGES);
  const res = await support.post('/api/traces').attach('file', readFileSync(path), 'numbered.jsonl');
  expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
  id = res.body.trace.id;
}, 180_000);

afterAll(async () => {
  await t.close();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('a trace of 120,000 messages', () => {
  it('counts every message in its summary and ends at the last one', async () => {
    const { analysis } = (await support.get(`/api/traces/${id}/summary`)).body;
    expect(analysis.messages).toBe(MESSAGES);
    expect(analysis.timeline.messages).toBe(MESSAGES);
    expect(analysis.timeline.omitted.messages).toBe(0);
    const last = numberedMessageAt(MESSAGES - 1);
    expect(analysis.endUs).toBeGreaterThan(last.t);
  });

  it('pages past row 20,000 to the last row, by index', async () => {
    for (const offset of [0, 19_990, 20_000, 63_497, 119_990]) {
      const page = (await support.get(`/api/traces/${id}/messages?offset=${offset}&limit=10`)).body;
      expect(page.total).toBe(MESSAGES);
      expect(page.offset).toBe(offset);
      expect(page.items.map(fields)).toEqual(Array.from({ length: 10 }, (_, k) => expected(offset + k)));
      expect(page.items.every((m: Served) => typeof (m as { hex?: unknown }).hex === 'string' && !('decoded' in m))).toBe(true);
    }
    const end = (await support.get(`/api/traces/${id}/messages?offset=${MESSAGES - 3}&limit=100`)).body;
    expect(end.items.map(fields)).toEqual([expected(MESSAGES - 3), expected(MESSAGES - 2), expected(MESSAGES - 1)]);
    // The offer in force is the one at the start of the trace, found without opening the chunks between.
    expect(end.capabilities).toMatchObject({ index: 0, messageType: 'Source_Capabilities', crcOk: true });
  });

  it('finds the row at a time far into the trace', async () => {
    const target = 100_001;
    const byTime = (await support.get(`/api/traces/${id}/messages?atUs=${numberedMessageAt(target).t}&limit=2`)).body;
    expect(byTime.offset).toBe(target);
    expect(byTime.items.map(fields)).toEqual([expected(target), expected(target + 1)]);
    const past = (await support.get(`/api/traces/${id}/messages?atUs=${numberedMessageAt(MESSAGES - 1).t + 1}`)).body;
    expect(past).toMatchObject({ offset: MESSAGES, total: MESSAGES, items: [] });
  });

  it('folds GoodCRCs away over the whole trace', async () => {
    const rows: number[] = [];
    for (let index = 0; index < MESSAGES; index++) if (numberedMessageAt(index).messageType !== 'GoodCRC') rows.push(index);
    const last = (await support.get(`/api/traces/${id}/messages?fold=goodcrc&offset=${rows.length - 2}&limit=5`)).body;
    expect(last.total).toBe(rows.length);
    expect(last.items.map(fields)).toEqual(Array.from({ length: MESSAGES - rows[rows.length - 2]! }, (_, k) => expected(rows[rows.length - 2]! + k)));
    const at = numberedMessageAt(90_004).t;
    const folded = (await support.get(`/api/traces/${id}/messages?fold=goodcrc&atUs=${at}&limit=1`)).body;
    expect(rows[folded.offset]).toBe(90_004);
    expect(folded.items.map(fields)).toEqual([expected(90_004), expected(90_005)]);
  });

  it("serves the chart's window far into the trace, with every message in it", async () => {
    const startUs = numberedMessageAt(110_000).t;
    const endUs = numberedMessageAt(110_011).t;
    const window = (await support.get(`/api/traces/${id}/timeline?startUs=${startUs}&endUs=${endUs}`)).body;
    expect(window.messages.map(fields)).toEqual(Array.from({ length: 12 }, (_, k) => expected(110_000 + k)));
    expect(window.messagesOmitted).toBe(0);
  });
});
