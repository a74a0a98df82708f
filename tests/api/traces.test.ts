import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import type supertest from 'supertest';
import { createTestApp, type TestApp } from '../support/test-app.ts';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';
import { encodeWaveform } from '../../shared/wire/index.ts';
import { encodeMessage } from '../../shared/pd/index.ts';
import { fixedPdo } from '../../shared/rules/index.ts';
import { formatVector, parseVector, runVector } from '../../shared/vectors/index.ts';

let t: TestApp;
let dataDir: string;
let support: ReturnType<typeof supertest.agent>;
let engineer: ReturnType<typeof supertest.agent>;
let viewer: ReturnType<typeof supertest.agent>;
let admin: ReturnType<typeof supertest.agent>;

const demo = (name: string) => readFileSync(join(demoTraceFolder, name));
const sha = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');
const storedFiles = () => readdirSync(join(dataDir, 'traces'));

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'parley-traces-test-'));
  t = await createTestApp({ dataDir });
  [support, engineer, viewer, admin] = await Promise.all([t.signInAs('support'), t.signInAs('engineer'), t.signInAs('viewer'), t.signInAs('admin')]);
});

afterAll(async () => {
  await t.close();
  rmSync(dataDir, { recursive: true, force: true });
});

async function deviceId(model: string): Promise<number> {
  const res = await support.get('/api/devices');
  return (res.body.items as { id: number; model: string }[]).find((d) => d.model === model)!.id;
}

describe('POST /api/traces', () => {
  it('stores a JSON Lines trace under its SHA-256 and answers 201 with the analysis', async () => {
    const bytes = demo('k65-pps-stops.trace.jsonl');
    const res = await support
      .post('/api/traces')
      .field('deviceId', String(await deviceId('K65')))
      .field('customerRef', 'CASE-1')
      .field('notes', 'Stops every 20 s')
      .attach('file', bytes, 'capture.jsonl');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trace).toMatchObject({
      format: 'jsonl',
      sha256: sha(bytes),
      sizeBytes: bytes.length,
      status: 'done',
      customerRef: 'CASE-1',
      notes: 'Stops every 20 s',
      device: { name: 'Kestrel K65 travel adapter' },
      uploader: { name: 'Sasha Support' },
      // The header line's title stands in for a title the form left empty.
      title: 'K65 PPS 9 V, field capture',
    });
    expect(res.body.analysis.findings.map((f: { rule: string }) => f.rule)).toEqual(expect.arrayContaining(['timing.pps-keepalive', 'protocol.hard-reset']));
    expect(res.body.trace.rules).toContain('timing.pps-keepalive');
    expect(readFileSync(join(dataDir, 'traces', sha(bytes)))).toEqual(bytes);
  });

  it('sniffs the content, not the name: a text log named .jsonl is read as text', async () => {
    const res = await support.post('/api/traces').attach('file', demo('wren14-late-request.txt'), 'misnamed.trace.jsonl');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trace.format).toBe('text');
    expect(res.body.analysis.findings.map((f: { rule: string }) => f.rule)).toContain('timing.sender-response');
  });

  it('reads a VCD capture of the CC wire', async () => {
    // A Source_Capabilities with one 5 V 3 A offer, encoded by the codec, then a Hard Reset ordered set.
    const caps = encodeMessage({
      sop: 'SOP',
      header: { messageType: 'Source_Capabilities', messageId: 0, specRevision: '3.0', powerRole: 'source', dataRole: 'dfp', extended: false },
      objects: [fixedPdo(5_000, 3_000)],
    });
    if (!caps.ok) throw new Error(caps.error.message);
    const { vcd } = encodeWaveform([{ sop: 'SOP', bytes: caps.bytes }, { orderedSet: 'Hard_Reset' }]);
    const res = await engineer.post('/api/traces').attach('file', Buffer.from(vcd), 'cc.vcd');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trace.format).toBe('vcd');
    expect(res.body.analysis.messages).toBe(1);
    expect(res.body.analysis.findings.map((f: { rule: string }) => f.rule)).toContain('protocol.hard-reset');
  });

  it('keeps one file for the same bytes uploaded twice and answers the second with the first trace', async () => {
    const bytes = demo('k65-late-ps-rdy.trace.jsonl');
    const first = await support.post('/api/traces').attach('file', bytes, 'a.jsonl');
    expect(first.status).toBe(201);
    const before = storedFiles().length;
    const second = await engineer.post('/api/traces').attach('file', bytes, 'b.jsonl');
    expect(second.status).toBe(200);
    expect(second.body).toMatchObject({ duplicate: true, trace: { id: first.body.trace.id, fileName: 'a.jsonl' } });
    expect(storedFiles().length).toBe(before);
    expect(storedFiles().filter((f) => f.startsWith('.incoming-'))).toEqual([]);
  });

  it('reports broken lines as trace.malformed-line with their line numbers and analyses the rest', async () => {
    const lines = demo('k65-wren14-bench.trace.jsonl').toString('utf8').split('\n');
    lines.splice(3, 0, '{"t": 1, "msg": }', 'not json at all');
    const res = await support.post('/api/traces').attach('file', Buffer.from(lines.join('\n')), 'broken.jsonl');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const malformed = res.body.analysis.findings.filter((f: { rule: string }) => f.rule === 'trace.malformed-line');
    expect(malformed.map((f: { line: number }) => f.line)).toEqual([4, 5]);
    expect(res.body.analysis.contracts).toHaveLength(1);
  });

  it('answers 400 trace.not-a-trace for a picture and for prose, keeping nothing', async () => {
    const before = storedFiles().length;
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d, 0x49, 0x48, 0x44, 0x52]);
    const picture = await support.post('/api/traces').attach('file', png, 'trace.jsonl');
    expect(picture.status).toBe(400);
    expect(picture.body.error).toMatchObject({ code: 'trace.not-a-trace', message: expect.stringContaining('binary') });
    const prose = await support.post('/api/traces').attach('file', Buffer.from('Hello,\nmy laptop charges slowly on the desk charger.\nRegards\n'), 'mail.txt');
    expect(prose.status).toBe(400);
    expect(prose.body.error.code).toBe('trace.not-a-trace');
    expect(prose.body.error.message).toContain('line 1');
    expect(storedFiles().length).toBe(before);
  });

  it('answers 400 trace.not-a-trace when nothing past a comment header reads as a record', async () => {
    const text = `${'# console banner\n'.repeat(80)}${'garbage line\n'.repeat(10)}`;
    const res = await support.post('/api/traces').attach('file', Buffer.from(text), 'console.txt');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('trace.not-a-trace');
    const list = await support.get('/api/traces').query({ q: 'console.txt' });
    expect(list.body.total).toBe(0);
  });

  it('answers 413 with a JSON error for a file over 50 MB', async () => {
    const big = Buffer.alloc(50 * 1024 * 1024 + 10, 0x20);
    const res = await support.post('/api/traces').attach('file', big, 'huge.txt');
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'request.too-large', message: 'file: the file is larger than the server accepts' });
    expect(storedFiles().filter((f) => f.startsWith('.incoming-'))).toEqual([]);
  });

  it('wants a file, a known device and a role that may upload', async () => {
    const none = await support.post('/api/traces').field('notes', 'x');
    expect(none.status).toBe(400);
    expect(none.body.error.code).toBe('trace.no-file');
    const device = await support.post('/api/traces').field('deviceId', '99999').attach('file', demo('d100-vbus-sag.trace.jsonl'), 'x.jsonl');
    expect(device.status).toBe(400);
    expect(device.body.error.message).toBe('deviceId: no device under test has that id');
    const asViewer = await viewer.post('/api/traces').attach('file', demo('d100-vbus-sag.trace.jsonl'), 'x.jsonl');
    expect(asViewer.status).toBe(403);
  });
});

describe('analysis progress off the request thread', () => {
  it('streams progress over server-sent events while /api/health keeps answering', async () => {
    // About 12 MB: a negotiation, then 300 000 VBUS readings.
    const head = demo('k65-wren14-bench.trace.jsonl').toString('utf8');
    const reading = (i: number) => `{"t":${40_000_000 + i * 1_000},"vbus":{"mv":${20_000 + (i % 50)},"ma":3000}}\n`;
    const body = head + Array.from({ length: 300_000 }, (_, i) => reading(i)).join('');
    const res = await support.post('/api/traces').query({ wait: 'false' }).attach('file', Buffer.from(body), 'long-run.trace.jsonl');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.analysis).toBeNull();
    const id = res.body.trace.id as number;

    const events = support
      .get(`/api/traces/${id}/events`)
      .buffer(true)
      .parse((response, done) => {
        let text = '';
        response.on('data', (chunk: Buffer) => (text += chunk.toString('utf8')));
        response.on('end', () => done(null, text));
      });
    const health = await t.request().get('/api/health');
    expect(health.status).toBe(200);
    const during = await support.get(`/api/traces/${id}`);
    // The health check came back while the worker was still reading the file.
    expect(['queued', 'analysing']).toContain(during.body.trace.status);

    const stream = await events;
    expect(stream.headers['content-type']).toContain('text/event-stream');
    const parsed = (stream.body as string)
      .split('\n\n')
      .filter((block) => block.startsWith('event:'))
      .map((block) => JSON.parse(block.split('\ndata: ')[1]!) as { type: string; bytesRead?: number; totalBytes?: number });
    expect(parsed.at(-1)).toMatchObject({ type: 'done', status: 'done' });
    const progress = parsed.filter((e) => e.type === 'progress');
    expect(progress.length).toBeGreaterThan(0);
    expect(progress.every((e) => e.totalBytes === Buffer.byteLength(body))).toBe(true);
    const after = await support.get(`/api/traces/${id}`);
    expect(after.body.trace.status).toBe('done');
    expect(after.body.analysis.timeline.measurements.length).toBeGreaterThan(0);
  });
});

describe('reading traces', () => {
  it('lists with search, filters, sorting and server-side pages', async () => {
    const k65 = await deviceId('K65');
    const all = await viewer.get('/api/traces').query({ pageSize: 100 });
    expect(all.status).toBe(200);
    const total = all.body.total as number;
    expect(total).toBeGreaterThanOrEqual(6);
    expect(all.body.uploaders.map((u: { name: string }) => u.name)).toEqual(expect.arrayContaining(['Sasha Support', 'Emery Engineer']));

    const byDevice = await viewer.get('/api/traces').query({ deviceId: k65 });
    expect(byDevice.body.items.length).toBeGreaterThan(0);
    expect(byDevice.body.items.every((i: { device: { id: number } }) => i.device?.id === k65)).toBe(true);

    const errors = await viewer.get('/api/traces').query({ severity: 'error', pageSize: 100 });
    expect(errors.body.items.every((i: { counts: { error: number } }) => i.counts.error > 0)).toBe(true);
    const clean = await viewer.get('/api/traces').query({ severity: 'clean', pageSize: 100 });
    expect(clean.body.items.every((i: { counts: { error: number; warning: number } }) => i.counts.error + i.counts.warning === 0)).toBe(true);
    expect(errors.body.total + clean.body.total).toBeLessThanOrEqual(total);

    const engineerId = all.body.uploaders.find((u: { name: string }) => u.name === 'Emery Engineer').id;
    const mine = await viewer.get('/api/traces').query({ uploaderId: engineerId });
    expect(mine.body.items.map((i: { format: string }) => i.format)).toEqual(['vcd']);

    const search = await viewer.get('/api/traces').query({ q: 'timing.sender-response' });
    expect(search.body.items.map((i: { format: string }) => i.format)).toEqual(['text']);

    const byTitle = await viewer.get('/api/traces').query({ sort: 'title', pageSize: 100 });
    const titles = byTitle.body.items.map((i: { title: string }) => i.title.toLowerCase());
    expect(titles).toEqual([...titles].sort());

    const page2 = await viewer.get('/api/traces').query({ pageSize: 2, page: 2 });
    expect(page2.body).toMatchObject({ page: 2, pageSize: 2, total });
    expect(page2.body.items.map((i: { id: number }) => i.id)).toEqual(all.body.items.slice(2, 4).map((i: { id: number }) => i.id));

    const bad = await viewer.get('/api/traces').query({ severity: 'fatal' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^severity: /);
  });

  it('returns one trace, its original file, and 404 for an unknown id', async () => {
    const list = await viewer.get('/api/traces').query({ q: 'misnamed' });
    const id = list.body.items[0].id;
    const one = await viewer.get(`/api/traces/${id}`);
    expect(one.body.trace.fileName).toBe('misnamed.trace.jsonl');
    expect(one.body.analysis.summary).toMatch(/^Contract 20 V 3.25 A/);
    const file = await viewer
      .get(`/api/traces/${id}/download`)
      .buffer(true)
      .parse((response, done) => {
        const parts: Buffer[] = [];
        response.on('data', (c: Buffer) => parts.push(c));
        response.on('end', () => done(null, Buffer.concat(parts)));
      });
    expect(file.headers['content-disposition']).toContain('misnamed.trace.jsonl');
    expect(file.body).toEqual(demo('wren14-late-request.txt'));
    const missing = await viewer.get('/api/traces/999999');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('trace.not-found');
  });
});

describe('working with a trace', () => {
  let id: number;
  beforeAll(async () => {
    const res = await support
      .post('/api/traces')
      .field('title', 'D100 sags')
      .field('deviceId', String(await deviceId('D100')))
      .attach('file', demo('d100-vbus-sag.trace.jsonl'), 'sag.jsonl');
    id = res.body.trace.id;
  });

  it('keeps a comment thread: support writes, a viewer reads but may not write', async () => {
    const posted = await support.post(`/api/traces/${id}/comments`).send({ text: 'Asked the customer for the cable model.' });
    expect(posted.status).toBe(201);
    expect(posted.body.comment).toMatchObject({ author: { name: 'Sasha Support', role: 'support' }, body: 'Asked the customer for the cable model.' });
    const empty = await support.post(`/api/traces/${id}/comments`).send({ text: '  ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('text: write a comment first');
    expect((await viewer.post(`/api/traces/${id}/comments`).send({ text: 'hi' })).status).toBe(403);
    const thread = await viewer.get(`/api/traces/${id}/comments`);
    expect(thread.body.items.map((c: { body: string }) => c.body)).toEqual(['Asked the customer for the cable model.']);
  });

  it('shares the diagnosis by e-mail: summary, contracts, findings with rule ids, a link', async () => {
    const res = await support.post(`/api/traces/${id}/share`).send({ to: 'firmware@kestrel.example', message: 'Please look at the 20 V rail.' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ sent: true, to: 'firmware@kestrel.example', subject: 'Parley diagnosis: D100 sags' });
    const mail = await t.mailbox.waitFor('firmware@kestrel.example');
    expect(mail.subject).toBe('Parley diagnosis: D100 sags');
    expect(mail.text).toContain('Please look at the 20 V rail.');
    expect(mail.text).toContain('vbus.out-of-range');
    expect(mail.text).toContain('20 V 3.25 A (object 4)');
    expect(mail.text).toContain(`http://parley.test/traces/${id}`);
    expect(mail.html).toContain('<code>vbus.out-of-range</code>');
    const outbox = await admin.get('/api/outbox');
    expect(outbox.body.items[0]).toMatchObject({ to: 'firmware@kestrel.example' });
    const bad = await support.post(`/api/traces/${id}/share`).send({ to: 'not-an-address' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('to: must be an e-mail address');
    expect((await viewer.post(`/api/traces/${id}/share`).send({ to: 'a@kestrel.example' })).status).toBe(403);
  });

  it('exports the report as a JSON download', async () => {
    const res = await viewer.get(`/api/traces/${id}/report.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toContain(`trace-${id}-report.json`);
    expect(res.body).toMatchObject({ report: 1, trace: { id, title: 'D100 sags', device: 'Kestrel D100 desk charger', link: `http://parley.test/traces/${id}` } });
    expect(res.body.findings.find((f: { rule: string }) => f.rule === 'vbus.out-of-range')).toMatchObject({ severity: 'error', title: expect.any(String), t: expect.any(Number) });
  });

  it('keeps the trace as a byte-stable trace vector that the vector runner passes', async () => {
    const res = await viewer
      .get(`/api/traces/${id}/vector`)
      .buffer(true)
      .parse((response, done) => {
        let text = '';
        response.on('data', (c: Buffer) => (text += c.toString('utf8')));
        response.on('end', () => done(null, text));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/d100-sags-\d+\.vector\.json/);
    const text = res.body as string;
    expect(text.endsWith('}\n')).toBe(true);
    expect(formatVector(JSON.parse(text))).toBe(text);
    const parsed = parseVector(text);
    expect(parsed.ok, JSON.stringify(parsed)).toBe(true);
    if (!parsed.ok) return;
    const vector = parsed.vector as unknown as { kind: string; id: string; expect: { findings: { include: string[]; exclude: string[] }; contracts: unknown[] } };
    expect(vector.kind).toBe('trace');
    expect(vector.id).toBe(`traces/d100-sags-${id}`);
    expect(vector.expect.findings.include).toContain('vbus.out-of-range');
    expect(vector.expect.findings.exclude).toEqual([]);
    expect(vector.expect.contracts).toEqual([{ kind: 'fixed', objectPosition: 4, voltageMv: 20_000, currentMa: 3_250, powerMw: 65_000 }]);
    const result = await runVector(parsed.vector);
    expect(result.ok, result.message).toBe(true);
  });

  it('lets the uploader or an admin delete a trace, not somebody else', async () => {
    const res = await support.post('/api/traces').attach('file', Buffer.from('0.1 SRC 41 00\n0.2 SNK 41 00\n'), 'tiny.txt');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const tiny = res.body.trace;
    expect((await engineer.delete(`/api/traces/${tiny.id}`)).status).toBe(403);
    expect((await support.delete(`/api/traces/${tiny.id}`)).status).toBe(204);
    expect((await viewer.get(`/api/traces/${tiny.id}`)).status).toBe(404);
    expect(storedFiles()).not.toContain(tiny.sha256);
  });
});
