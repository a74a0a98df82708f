/** The "also fix" list of issue 14: each failed before its fix. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { createTestApp, type TestApp } from '../support/test-app.ts';
import { startServer } from '../../server/start.ts';
import { startMailFake } from '../../server/mail/fake-smtp.ts';
import { OutboxMessage } from '../../server/db/entities.ts';
import { systemClock } from '../../server/context.ts';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';
import { readFileSync } from 'node:fs';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

function deepChain(depth: number): string {
  return '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
}

describe('also fix', () => {
  it('answers 400, not 500, to a vector nested 5,000 levels deep', async () => {
    const qa = await t.signInAs('qa');
    const body = `{"vector":1,"id":"caps/deep/x","title":"Deep","tags":[],"ref":"x","kind":"caps","input":{"pdos":["0x0001912c"],"extra":${deepChain(5_000)}},"expect":{}}`;
    const res = await qa.post('/api/vectors').set('Content-Type', 'application/json').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('nested deeper than 64 levels');
  });

  it('reads upload file names as UTF-8', async () => {
    const support = await t.signInAs('support');
    const res = await support.post('/api/traces').attach('file', readFileSync(join(demoTraceFolder, 'k65-pps-stops.trace.jsonl')), 'Prüfbericht-é.jsonl');
    expect(res.status).toBe(201);
    expect(res.body.trace.fileName).toBe('Prüfbericht-é.jsonl');
  });

  it('removes leftover temporary uploads at start-up and keeps the data folder private (0700, files 0600)', async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'parley-leftovers-'));
    mkdirSync(join(dataDir, 'traces'));
    writeFileSync(join(dataDir, 'traces', '.incoming-0123456789abcdef'), 'half an upload');
    const server = await startServer({ port: 0, dataDir, demo: false, log: false });
    try {
      expect(readdirSync(join(dataDir, 'traces'))).toEqual([]);
      expect(statSync(dataDir).mode & 0o777).toBe(0o700);
      expect(statSync(join(dataDir, 'parley.sqlite')).mode & 0o777).toBe(0o600);
    } finally {
      await server.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  });

  it('the built-in SMTP fake takes mail only with its per-start credential', async () => {
    const fake = await startMailFake({ orm: t.orm, clock: systemClock });
    try {
      const url = new URL(fake.url);
      expect(url.hostname).toBe('127.0.0.1');
      const intruder = nodemailer.createTransport({ host: '127.0.0.1', port: Number(url.port), secure: false, ignoreTLS: true });
      await expect(intruder.sendMail({ from: 'x@example.com', to: 'victim@kestrel.example', subject: 'injected', text: 'x' })).rejects.toThrow();
      const sender = nodemailer.createTransport(fake.url);
      await sender.sendMail({ from: 'parley@localhost', to: 'someone@kestrel.example', subject: 'allowed', text: 'x' });
      const subjects = (await t.orm.em.fork().find(OutboxMessage, {})).map((m) => m.subject);
      expect(subjects).toContain('allowed');
      expect(subjects).not.toContain('injected');
    } finally {
      await fake.close();
    }
  });
});
