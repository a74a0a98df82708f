import supertest from 'supertest';
import { inject } from 'vitest';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import type { Express } from 'express';
import { createApp, type AppOptions } from '../../server/app.ts';
import { openOrm, type Orm } from '../../server/db/orm.ts';
import { demoAccounts, demoPassword, seedDemo } from '../../server/db/seed.ts';
import type { Role } from '../../server/db/entities.ts';
import { startMailFake } from '../../server/mail/fake-smtp.ts';
import { createSmtpMailer } from '../../server/mail/mailer.ts';
import { createMailbox, type Mailbox } from '../../server/mail/mailbox.ts';
import type { Clock } from '../../server/context.ts';
import { createAnalysisPool } from '../../server/analysis/pool.ts';
import { createRunPool } from '../../server/runner/pool.ts';
import { createLocalJobQueue } from '../../server/jobs/local-queue.ts';

/** A clock that stands still until a test moves it. */
export function createTestClock(start = new Date('2026-03-02T09:00:00Z')): Clock & { advance(ms: number): void } {
  let nowMs = start.getTime();
  return {
    now: () => new Date(nowMs),
    advance: (ms) => {
      nowMs += ms;
    },
  };
}

export const testPublicUrl = 'http://parley.test';

export interface TestApp {
  app: Express;
  orm: Orm;
  mailbox: Mailbox;
  /** A fresh supertest client without cookies. */
  request(): ReturnType<typeof supertest>;
  /** A supertest agent signed in as the demo account of that role (it keeps the cookie). */
  signInAs(role: Role): Promise<ReturnType<typeof supertest.agent>>;
  /** The `Cookie` header value of a fresh session for that role, for requests that must not share a jar. */
  cookieFor(role: Role): Promise<string>;
  close(): Promise<void>;
}

/**
 * The app on `:memory:` SQLite with the demo seed and the real SMTP fake on a loopback port,
 * so mail goes through nodemailer exactly as in production and lands in the Outbox.
 */
/**
 * The database of a test app: `:memory:` SQLite, or, in the `api-postgres` project, a fresh
 * PostgreSQL database copied from the migrated template (tests/support/pg-global-setup.ts).
 */
async function openTestOrm(): Promise<{ orm: Orm; drop(): Promise<void> }> {
  const adminUrl = inject('postgresUrl');
  if (!adminUrl) return { orm: await openOrm({ dbName: ':memory:' }), drop: async () => undefined };
  const name = `parley_t_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    await admin.query(`create database ${name} template parley_template`);
  } finally {
    await admin.end();
  }
  const orm = await openOrm({ databaseUrl: adminUrl.replace(/\/postgres$/, `/${name}`) });
  return {
    orm,
    async drop() {
      const client = new pg.Client({ connectionString: adminUrl });
      await client.connect();
      try {
        await client.query(`drop database if exists ${name} with (force)`);
      } finally {
        await client.end();
      }
    },
  };
}

export async function createTestApp(options: Partial<Omit<AppOptions, 'orm' | 'mailer'>> & { demo?: boolean } = {}): Promise<TestApp> {
  const { orm, drop } = await openTestOrm();
  const clock = options.clock ?? createTestClock();
  if (options.demo !== false) await seedDemo(orm.em.fork(), clock);
  const fake = await startMailFake({ orm, clock });
  const mailer = createSmtpMailer({ url: fake.url, from: 'Parley <parley@localhost>' });
  const jobs = options.jobs ?? createLocalJobQueue();
  const analysisPool = options.analysisPool ?? createAnalysisPool();
  const runPool = options.runPool ?? createRunPool();
  const app = createApp({ secret: 'test-secret-0123456789abcdef0123456789', publicUrl: testPublicUrl, ...options, clock, orm, mailer, jobs, analysisPool, runPool });

  const signIn = async (agent: ReturnType<typeof supertest.agent> | ReturnType<typeof supertest>, role: Role) => {
    const account = demoAccounts.find((a) => a.role === role)!;
    const res = await agent.post('/api/auth/login').send({ email: account.email, password: demoPassword });
    if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res;
  };

  return {
    app,
    orm,
    mailbox: createMailbox(orm),
    request: () => supertest(app),
    async signInAs(role) {
      const agent = supertest.agent(app);
      await signIn(agent, role);
      return agent;
    },
    async cookieFor(role) {
      const res = await signIn(supertest(app), role);
      const setCookie = res.headers['set-cookie'] as unknown as string[];
      return setCookie.map((c) => c.split(';')[0]).join('; ');
    },
    async close() {
      const jobsStopped = jobs.close();
      await Promise.all([analysisPool.close(), runPool.close()]);
      await jobsStopped;
      mailer.close();
      await fake.close();
      await orm.close();
      await drop();
    },
  };
}
