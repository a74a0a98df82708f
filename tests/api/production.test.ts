/** Demo accounts in production (issue 14, item 1). */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer } from '../../server/start.ts';
import { openOrm } from '../../server/db/orm.ts';
import { seedDemo } from '../../server/db/seed.ts';
import { User } from '../../server/db/entities.ts';
import { systemClock } from '../../server/context.ts';

const saved = { ...process.env };
let dataDir: string;

beforeEach(() => {
  dataDir = mkdtempSync(join(tmpdir(), 'parley-production-'));
  process.env.NODE_ENV = 'production';
  process.env.PARLEY_SECRET = 'production-secret-0123456789abcdef0123';
  delete process.env.PARLEY_DEMO;
});

afterEach(async () => {
  process.env = { ...saved };
  rmSync(dataDir, { recursive: true, force: true });
});

describe('a production server', () => {
  it('creates no demo data unless PARLEY_DEMO asks for it', async () => {
    const server = await startServer({ port: 0, dataDir, log: false });
    try {
      expect(await server.orm.em.fork().count(User)).toBe(0);
      const res = await fetch(`${server.url}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: 'admin@kestrel.example', password: 'parley-demo' }),
      });
      expect(res.status).toBe(401);
    } finally {
      await server.close();
    }
  });

  it('refuses to start while a demo account still has the demo password', async () => {
    const orm = await openOrm({ dbName: join(dataDir, 'parley.sqlite') });
    await seedDemo(orm.em.fork(), systemClock);
    await orm.close();
    await expect(startServer({ port: 0, dataDir, log: false })).rejects.toThrow(/Refusing to start in production: admin@kestrel\.example, .* published demo password/);
  });
});
