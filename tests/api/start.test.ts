import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { startServer } from '../../server/start.ts';

describe('startServer', () => {
  it('starts on a random port with a fresh data folder, mails into the outbox, and closes', async () => {
    const dataDir = join(mkdtempSync(join(tmpdir(), 'parley-start-')), 'data');
    const server = await startServer({ port: 0, host: '127.0.0.1', dataDir, log: false, distDir: join(dataDir, 'no-dist') });
    try {
      expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
      expect(server.url).not.toMatch(/:3000$/);
      expect(await (await fetch(`${server.url}/api/health`)).json()).toMatchObject({
        ok: true,
        database: { ok: true, kind: 'sqlite' },
        storage: { ok: true, kind: 'local' },
        queue: { ok: true, kind: 'local' },
      });
      expect(existsSync(join(dataDir, 'parley.sqlite'))).toBe(true);
      expect(existsSync(join(dataDir, 'secret'))).toBe(true);

      const forgot = await fetch(`${server.url}/api/auth/forgot`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: 'qa@kestrel.example' }),
      });
      expect(forgot.status).toBe(202);
      const mail = await server.mailbox.waitFor('qa@kestrel.example');
      const port = new URL(server.url).port;
      expect(mail.text).toContain(`http://localhost:${port}/reset/`);
    } finally {
      await server.close();
    }
    await expect(fetch(`${server.url}/api/health`)).rejects.toThrow();
  });
});

describe('npm start (server/main.ts) with a bad setting', () => {
  it('exits 1 with one line naming the setting, no stack trace', () => {
    const dataDir = join(mkdtempSync(join(tmpdir(), 'parley-start-')), 'data');
    const result = spawnSync(process.execPath, ['--import', 'tsx', join(import.meta.dirname, '..', '..', 'server', 'main.ts')], {
      env: { ...process.env, PARLEY_DATA: dataDir, PORT: '0', DATABASE_URL: '', PARLEY_RUN_JOBS: 'off' },
      encoding: 'utf8',
      timeout: 60_000,
    });
    expect(result.status).toBe(1);
    expect(result.stderr.trim()).toBe(
      'Parley could not start: Invalid environment: PARLEY_RUN_JOBS: off needs DATABASE_URL (a team deployment, where parley worker processes run the jobs); with SQLite the server runs its jobs itself',
    );
  });
});
