/**
 * Under attack (issue 14, items 1, 4, 5 and 7): each test failed before its fix.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import jwt from 'jsonwebtoken';
import { createTestApp, createTestClock, testPublicUrl, type TestApp } from '../support/test-app.ts';
import { createAuditBudget } from '../../server/features/audit/budget.ts';
import { checkPassword, hashPassword } from '../../server/features/auth/passwords.ts';
import { sessionCookie } from '../../server/features/auth/session.ts';
import { AuditEvent, User } from '../../server/db/entities.ts';

const secret = 'test-secret-0123456789abcdef0123456789';
const linkToken = (text: string, kind: 'invite' | 'reset') => new RegExp(`${testPublicUrl}/${kind}/([A-Za-z0-9_-]+)`).exec(text)![1]!;
const minutes = (n: number) => n * 60_000;

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ rateLimits: { loginPerAddress: { windowMs: minutes(15), limit: 5 }, forgot: { windowMs: minutes(15), limit: 3 } } });
});
afterAll(() => t.close());

describe('sessions and links (item 7)', () => {
  it('signing out ends the session on the server: the old cookie no longer works', async () => {
    const cookie = await t.cookieFor('viewer');
    expect((await t.request().get('/api/me').set('Cookie', cookie)).status).toBe(200);
    expect((await t.request().post('/api/auth/logout').set('Cookie', cookie)).status).toBe(204);
    expect((await t.request().get('/api/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('refuses a correctly signed session token without an expiry', async () => {
    const user = await t.orm.em.fork().findOneOrFail(User, { email: 'qa@kestrel.example' });
    const forever = jwt.sign({ sub: String(user.id), v: user.sessionVersion }, secret, { algorithm: 'HS256', noTimestamp: true });
    expect((await t.request().get('/api/me').set('Cookie', `${sessionCookie}=${forever}`)).status).toBe(401);
  });

  it('a reset link used three times at once works exactly once', async () => {
    await t.request().post('/api/auth/forgot').send({ email: 'engineer@kestrel.example' });
    const token = linkToken((await t.mailbox.waitFor('engineer@kestrel.example')).text, 'reset');
    const tries = await Promise.all(['pass-one-1234', 'pass-two-1234', 'pass-three-12'].map((password) => t.request().post('/api/auth/reset').send({ token, password })));
    expect(tries.map((r) => r.status).sort()).toEqual([200, 404, 404]);
  });

  it('an invitation accepted three times at once works exactly once', async () => {
    const admin = await t.signInAs('admin');
    expect((await admin.post('/api/users/invite').send({ email: 'ria.race@kestrel.example', name: 'Ria Race', role: 'qa' })).status).toBe(201);
    const token = linkToken((await t.mailbox.waitFor('ria.race@kestrel.example')).text, 'invite');
    const tries = await Promise.all(['pass-one-1234', 'pass-two-1234', 'pass-three-12'].map((password) => t.request().post(`/api/invites/${token}/accept`).send({ password })));
    expect(tries.map((r) => r.status).sort()).toEqual([200, 404, 404]);
  });

  it('/forgot answers 202 at once and is limited per address even though it always succeeds', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) statuses.push((await t.request().post('/api/auth/forgot').send({ email: 'nobody-here@kestrel.example' })).status);
    expect(statuses).toEqual([202, 202, 202, 429]);
  });

  it('does not take X-Forwarded-For from a client when no proxy is configured', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      const res = await t
        .request()
        .post('/api/auth/login')
        .set('X-Forwarded-For', `203.0.113.${i}`)
        .send({ email: `flood-${i}@example.com`, password: 'wrong-password' });
      statuses.push(res.status);
    }
    expect(statuses.at(-1)).toBe(429);
  });
});

describe('client addresses behind a configured proxy (item 7)', () => {
  it('takes X-Forwarded-For from the configured proxy only: clients behind it are counted apart', async () => {
    const app = await createTestApp({ trustProxy: 'loopback', rateLimits: { loginPerAddress: { windowMs: minutes(15), limit: 2 } } });
    try {
      const tryFrom = async (address: string, n: number) =>
        (
          await app
            .request()
            .post('/api/auth/login')
            .set('X-Forwarded-For', address)
            .send({ email: `proxy-${address}-${n}@example.com`, password: 'wrong-password' })
        ).status;
      expect([await tryFrom('203.0.113.7', 1), await tryFrom('203.0.113.7', 2), await tryFrom('203.0.113.7', 3)]).toEqual([401, 401, 429]);
      expect(await tryFrom('203.0.113.8', 1)).toBe(401);
    } finally {
      await app.close();
    }
  });
});

describe('sign-in floods (item 4)', () => {
  it('limits failed sign-ins per client address across new e-mail addresses', async () => {
    const app = await createTestApp({ rateLimits: { loginPerAddress: { windowMs: minutes(15), limit: 3 } } });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 4; i++)
        statuses.push(
          (
            await app
              .request()
              .post('/api/auth/login')
              .send({ email: `new-${i}@example.com`, password: 'wrong-password' })
          ).status,
        );
      expect(statuses).toEqual([401, 401, 401, 429]);
    } finally {
      await app.close();
    }
  });

  it('limits failed sign-ins per account across client addresses (password spraying)', async () => {
    const app = await createTestApp({ trustProxy: 1, rateLimits: { loginPerAccount: { windowMs: minutes(15), limit: 3 } } });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 4; i++) {
        statuses.push(
          (
            await app
              .request()
              .post('/api/auth/login')
              .set('X-Forwarded-For', `198.51.100.${i}`)
              .send({ email: 'admin@kestrel.example', password: `guess-${i}-wrong` })
          ).status,
        );
      }
      expect(statuses).toEqual([401, 401, 401, 429]);
    } finally {
      await app.close();
    }
  });

  it('hashes with scrypt on the thread pool; old bcrypt hashes still check', async () => {
    const hash = await hashPassword('correct horse battery');
    expect(hash).toMatch(/^scrypt\$15\$8\$1\$/);
    expect(await checkPassword('correct horse battery', hash)).toBe(true);
    expect(await checkPassword('correct horse batterY', hash)).toBe(false);
    // bcryptjs hash of "parley-demo" at cost 4 (made with bcryptjs.hashSync).
    expect(await checkPassword('parley-demo', '$2b$04$rE5zWws7j1xRDzQVtKpDqOJUSNoCWKff8HGYIDs9tKSZnV8X9yH5W')).toBe(true);
  });

  it('a flood of failed sign-ins all answer 401 but write only the audit budget of rows, then say how many were left out', async () => {
    const open = { windowMs: minutes(15), limit: 10_000 };
    const clock = createTestClock();
    const app = await createTestApp({ clock, failedSignInAuditPerMinute: 10, rateLimits: { login: open, loginPerAddress: open, loginPerAccount: open } });
    try {
      const flood = (from: number) =>
        Promise.all(
          Array.from({ length: 15 }, (_, i) =>
            app
              .request()
              .post('/api/auth/login')
              .send({ email: `flood-${from + i}@example.com`, password: 'wrong-password' }),
          ),
        );
      const statuses = (await flood(0)).map((r) => r.status);
      expect(statuses.filter((s) => s === 401)).toHaveLength(15);
      const em = app.orm.em.fork();
      expect(await em.count(AuditEvent, { action: 'auth.sign_in_failed' })).toBe(10);
      clock.advance(61_000);
      await flood(100);
      const rows = await em.find(AuditEvent, { action: 'auth.sign_in_failed' }, { orderBy: { id: 'asc' } });
      expect(rows).toHaveLength(20);
      expect(rows[10]!.details).toMatchObject({ notRecorded: 5 });
    } finally {
      await app.close();
    }
  });

  it('writes at most 120 failed-sign-in audit rows a minute and says how many it left out', () => {
    const budget = createAuditBudget(120);
    const written = Array.from({ length: 200 }, () => budget.take(1_000)).filter((r) => r.write).length;
    expect(written).toBe(120);
    expect(budget.take(61_000)).toEqual({ write: true, suppressed: 80 });
  });
});

describe('cross-site writes (item 5)', () => {
  it('refuses a cookie-signed write from another origin, by Sec-Fetch-Site or Origin, and takes our own', async () => {
    const app = await createTestApp();
    const cookie = await app.cookieFor('qa');
    const crossSite = await app.request().post('/api/devices').set('Cookie', cookie).set('Sec-Fetch-Site', 'same-site').field('name', 'x');
    expect(crossSite.status).toBe(403);
    expect(crossSite.body.error.code).toBe('request.cross-site');
    const otherOrigin = await app.request().post('/api/devices').set('Cookie', cookie).set('Origin', 'http://127.0.0.1:9999').send({ name: 'x' });
    expect(otherOrigin.status).toBe(403);
    const own = await app.request().post('/api/auth/logout').set('Cookie', cookie).set('Origin', testPublicUrl).set('Sec-Fetch-Site', 'same-origin');
    expect(own.status).toBe(204);
    await app.close();
  });
});
