/**
 * State two instances must share on one PostgreSQL database: rate limits (sign-in, password reset,
 * share) count every request whichever instance took it, and the session secret may not default.
 * Two apps, each with its own connection pool and the database-backed limit store, stand for two
 * server processes (the process-level test is ./two-instances.test.ts).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { resolveSecret } from '../../server/config/secret.ts';
import { openOrm, type Orm } from '../../server/db/orm.ts';
import { createSqlRateLimitStore } from '../../server/db/rate-limit-store.ts';
import { demoPassword, seedDemo } from '../../server/db/seed.ts';
import type { Mailer } from '../../server/mail/mailer.ts';
import { createLocalJobQueue } from '../../server/jobs/local-queue.ts';
import type { JobQueue } from '../../server/jobs/types.ts';
import { systemClock } from '../../server/context.ts';

const windowMs = 15 * 60_000;
const limits = {
  login: { windowMs, limit: 4 },
  loginPerAddress: { windowMs, limit: 100 },
  loginPerAccount: { windowMs, limit: 100 },
  forgot: { windowMs, limit: 3 },
  forgotPerAddress: { windowMs, limit: 100 },
  share: { windowMs, limit: 2 },
};

const quietMailer: Mailer = { send: async () => undefined, close: () => undefined };
let databaseName: string;
let adminUrl: string;
const orms: Orm[] = [];
const queues: JobQueue[] = [];
let apps: ReturnType<typeof createApp>[];

async function admin(sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  adminUrl = inject('postgresUrl');
  databaseName = `parley_limits_${randomBytes(5).toString('hex')}`;
  await admin(`create database ${databaseName} template parley_template`);
  const url = adminUrl.replace(/\/postgres$/, `/${databaseName}`);
  for (let i = 0; i < 2; i++) orms.push(await openOrm({ databaseUrl: url }));
  await seedDemo(orms[0]!.em.fork(), systemClock);
  apps = orms.map((orm) => {
    const jobs = createLocalJobQueue();
    queues.push(jobs);
    return createApp({
      orm,
      mailer: quietMailer,
      jobs,
      secret: 'shared-limits-secret-0123456789abcdef0123',
      publicUrl: 'http://parley.test',
      rateLimits: limits,
      rateLimitStore: (name) => createSqlRateLimitStore({ orm, name }),
    });
  });
});

afterAll(async () => {
  await Promise.all(queues.map((q) => q.close()));
  await Promise.all(orms.map((o) => o.close()));
  await admin(`drop database if exists ${databaseName} with (force)`);
});

describe('limits shared by two instances on PostgreSQL', () => {
  it('failed sign-ins count across instances: the fifth, on either, is refused', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      const res = await supertest(apps[i % 2]!)
        .post('/api/auth/login')
        .send({ email: 'viewer@kestrel.example', password: `wrong-${i}` });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 429, 429]);
    // The right password is refused too while the limit holds, on both instances.
    for (const app of apps) {
      const res = await supertest(app).post('/api/auth/login').send({ email: 'viewer@kestrel.example', password: demoPassword });
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('request.rate-limited');
    }
  });

  it('password-reset requests count across instances', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++)
      statuses.push(
        (
          await supertest(apps[i % 2]!)
            .post('/api/auth/forgot')
            .send({ email: 'qa@kestrel.example' })
        ).status,
      );
    expect(statuses).toEqual([202, 202, 202, 429, 429]);
  });

  it('shares of one user count across instances', async () => {
    const agents = apps.map((app) => supertest.agent(app));
    for (const agent of agents) expect((await agent.post('/api/auth/login').send({ email: 'support@kestrel.example', password: demoPassword })).status).toBe(200);
    // The limit counts every share request before the handler looks for the trace (none here: 404).
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) statuses.push((await agents[i % 2]!.post('/api/traces/999999/share').send({ to: 'lab@kestrel.example' })).status);
    expect(statuses).toEqual([404, 404, 429]);
  });

  it('the session secret may not default when DATABASE_URL is set', () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'parley-secret-'));
    try {
      expect(() => resolveSecret({ dataDir, production: false, shared: true })).toThrow('PARLEY_SECRET must be set (32 characters or more, the same on every instance) when DATABASE_URL is set');
    } finally {
      rmSync(dataDir, { recursive: true, force: true });
    }
  });
});
