import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
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
