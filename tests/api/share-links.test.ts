/**
 * Read-only report links: made by a role that may share, opened without an account, refused once
 * expired, withdrawn or altered; only the maker or an admin withdraws one; the e-mail of "Share
 * diagnosis" carries a link when asked to.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type supertest from 'supertest';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';
import { createTestApp, createTestClock, testPublicUrl, type TestApp } from '../support/test-app.ts';

let t: TestApp;
const clock = createTestClock();
let support: ReturnType<typeof supertest.agent>;
let engineer: ReturnType<typeof supertest.agent>;
let viewer: ReturnType<typeof supertest.agent>;
let admin: ReturnType<typeof supertest.agent>;
let traceId: number;

/** Sessions expire with the clock too: sign everyone in again after moving it. */
async function signInAll(): Promise<void> {
  [support, engineer, viewer, admin] = await Promise.all([t.signInAs('support'), t.signInAs('engineer'), t.signInAs('viewer'), t.signInAs('admin')]);
}

beforeAll(async () => {
  t = await createTestApp({ clock });
  await signInAll();
  const uploaded = await support
    .post('/api/traces')
    .field('title', 'K65 drops a programmable contract')
    .attach('file', readFileSync(join(demoTraceFolder, 'k65-pps-stops.trace.jsonl')), 'k65-pps-stops.trace.jsonl');
  traceId = uploaded.body.trace.id;
});

afterAll(async () => {
  await t.close();
});

const tokenOf = (url: string) => url.slice(url.lastIndexOf('/') + 1);

describe('report share links', () => {
  it('makes a link that opens the report without an account, and expires when chosen', async () => {
    const made = await support.post(`/api/traces/${traceId}/share-links`).send({ expiresInDays: 7 });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body).toMatchObject({ traceId, state: 'active', createdBy: { name: 'Sasha Support' }, revokedAt: null });
    expect(made.body.url).toMatch(new RegExp(`^${testPublicUrl}/shared/reports/\\d+\\.\\d+\\.[A-Za-z0-9_-]{43}$`));
    expect(new Date(made.body.expiresAt).getTime() - clock.now().getTime()).toBe(7 * 86_400_000);

    const opened = await t.request().get(`/api/shared/reports/${tokenOf(made.body.url)}`);
    expect(opened.status, JSON.stringify(opened.body)).toBe(200);
    expect(opened.headers['cache-control']).toBe('private, no-store');
    expect(opened.body.report.summary).toMatch(/Hard Reset at 21\.1 s/);
    expect(opened.body.report.findings.map((f: { rule: string }) => f.rule)).toContain('protocol.hard-reset');
    // Nothing internal: no link into the product, no file hash, no uploader's notes beyond the report's own.
    expect(opened.body.report.trace.link).toBeNull();
    expect(opened.body.report.trace.device).toBeNull();
    expect(opened.body.report.trace.sha256).toBeUndefined();
    expect(opened.body.timeline.messages.length).toBeGreaterThan(10);
    expect(opened.body.timeline.messages[0]).not.toHaveProperty('decoded');

    clock.advance(7 * 86_400_000);
    const late = await t.request().get(`/api/shared/reports/${tokenOf(made.body.url)}`);
    expect(late.status).toBe(404);
    expect(late.body.error.code).toBe('share-link.invalid');
    await signInAll();
    const listed = await support.get(`/api/traces/${traceId}/share-links`);
    expect(listed.body.items[0]).toMatchObject({ id: made.body.id, state: 'expired', url: null });
  });

  it('refuses an altered token, and a link once withdrawn; only its maker or an admin withdraws it', async () => {
    const made = await engineer.post(`/api/traces/${traceId}/share-links`).send({ expiresInDays: 1 });
    expect(made.status).toBe(201);
    const token = tokenOf(made.body.url);
    const [id, expires, signature] = token.split('.');
    // A later expiry, the same signature: refused.
    const stretched = await t.request().get(`/api/shared/reports/${id}.${Number(expires) + 86_400}.${signature}`);
    expect(stretched.status).toBe(404);
    const flipped = await t.request().get(`/api/shared/reports/${id}.${expires}.${signature!.slice(0, -1)}${signature!.endsWith('A') ? 'B' : 'A'}`);
    expect(flipped.status).toBe(404);
    const garbage = await t.request().get('/api/shared/reports/not-a-token');
    expect(garbage.status).toBe(400);

    const stranger = await support.delete(`/api/traces/${traceId}/share-links/${made.body.id}`);
    expect(stranger.status).toBe(403);
    expect(stranger.body.error.code).toBe('share-link.not-yours');
    expect((await t.request().get(`/api/shared/reports/${token}`)).status).toBe(200);
    const withdrawn = await admin.delete(`/api/traces/${traceId}/share-links/${made.body.id}`);
    expect(withdrawn.status).toBe(204);
    const after = await t.request().get(`/api/shared/reports/${token}`);
    expect(after.status).toBe(404);
    const audit = await admin.get('/api/audit?pageSize=50');
    const actions = (audit.body.items as { action: string }[]).map((e) => e.action);
    expect(actions).toContain('trace.link_created');
    expect(actions).toContain('trace.link_revoked');
  });

  it('checks roles and input', async () => {
    expect((await viewer.post(`/api/traces/${traceId}/share-links`).send({ expiresInDays: 7 })).status).toBe(403);
    expect((await t.request().post(`/api/traces/${traceId}/share-links`).send({ expiresInDays: 7 })).status).toBe(401);
    const tooLong = await support.post(`/api/traces/${traceId}/share-links`).send({ expiresInDays: 365 });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error.message).toContain('expiresInDays: at most 90 days');
    expect((await support.post('/api/traces/999999/share-links').send({ expiresInDays: 7 })).status).toBe(404);
  });

  it('puts the link in the diagnosis e-mail when the sharer asks for one', async () => {
    const sent = await support.post(`/api/traces/${traceId}/share`).send({ to: 'customer@kestrel.example', message: 'See the report.', linkDays: 14 });
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect(sent.body.link).toMatch(/\/shared\/reports\//);
    const mail = await t.mailbox.waitFor('customer@kestrel.example');
    expect(mail.text).toContain('Read the report (no account needed, until');
    expect(mail.text).toContain(sent.body.link);
    expect(mail.html).toContain(sent.body.link);
  });
});
