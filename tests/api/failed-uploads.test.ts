/**
 * An upload that fails leaves nothing behind, in either trace store: no row, no stored file, no
 * temporary file, no open multipart upload. Cases: the bucket refuses a part half-way (S3 fake from
 * npm, started here), the store's folder cannot take the file (local), a client that gives up
 * mid-upload, and a file that is no trace.
 */
import { mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLocalTraceStore } from '../../server/storage/local-store.ts';
import { createS3TraceStore } from '../../server/storage/s3-store.ts';
import type { TraceStore } from '../../server/storage/types.ts';
import { Trace } from '../../server/db/trace-entities.ts';
import { startS3Fake, type S3Fake } from '../support/s3-fake.ts';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

const MIB = 1024 * 1024;
let folder: string;
let fake: S3Fake;

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'parley-failed-uploads-'));
  fake = await startS3Fake();
});
afterAll(async () => {
  await fake?.stop();
  rmSync(folder, { recursive: true, force: true });
});

const listed = (dir: string) => (existsSync(dir) ? readdirSync(dir) : []);

async function withApp(store: TraceStore, use: (app: TestApp) => Promise<void>): Promise<void> {
  const app = await createTestApp({ traceStore: store, demo: true });
  try {
    await use(app);
  } finally {
    await app.close();
  }
}

describe('a failed upload leaves nothing behind', () => {
  it('S3: a part refused half-way answers 502 trace.not-stored; no row, object, parts or temporary file', async () => {
    const incomingDir = join(folder, 's3-incoming');
    const store = createS3TraceStore({ endpoint: fake.url, bucket: fake.bucket, credentials: fake.credentials, incomingDir, partSizeBytes: 5 * MIB });
    const tracePath = join(folder, 'soak.jsonl');
    writeSyntheticTrace(tracePath, 12 * MIB);
    await withApp(store, async (app) => {
      const agent = await app.signInAs('support');
      const objectsBefore = fake.objectKeys();
      fake.failParts.add(2);
      try {
        const res = await agent.post('/api/traces?wait=false').attach('file', tracePath);
        expect(res.status).toBe(502);
        expect(res.body.error.code).toBe('trace.not-stored');
      } finally {
        fake.failParts.clear();
      }
      expect(await app.orm.em.fork().count(Trace, { fileName: 'soak.jsonl' })).toBe(0);
      expect(fake.objectKeys()).toEqual(objectsBefore);
      expect(fake.openUploads()).toEqual([]);
      expect(listed(incomingDir)).toEqual([]);
      // The same file goes through once the bucket takes parts again.
      const again = await agent.post('/api/traces?wait=false').attach('file', tracePath);
      expect(again.status).toBe(201);
      expect(fake.objectKeys()).toHaveLength(objectsBefore.length + 1);
    });
  });

  it('local: a store folder that cannot take the file answers 502; no row and no temporary file', async () => {
    const dataDir = join(folder, 'local-broken');
    const store = createLocalTraceStore(dataDir);
    // Received files land in `incoming`, kept ones in `traces`: make `traces` a plain file.
    const kept = { ...store, incomingDir: join(dataDir, 'incoming') };
    mkdirSync(kept.incomingDir, { recursive: true });
    writeFileSync(join(dataDir, 'traces'), 'not a folder');
    const tracePath = join(folder, 'small.jsonl');
    writeSyntheticTrace(tracePath, 64 * 1024);
    await withApp(kept, async (app) => {
      const agent = await app.signInAs('support');
      const res = await agent.post('/api/traces?wait=false').attach('file', tracePath);
      expect(res.status).toBe(502);
      expect(await app.orm.em.fork().count(Trace, { fileName: 'small.jsonl' })).toBe(0);
      expect(listed(kept.incomingDir)).toEqual([]);
    });
  });

  it('local: a client that gives up half-way and a file that is no trace leave no temporary file', async () => {
    const dataDir = join(folder, 'local');
    const store = createLocalTraceStore(dataDir);
    await withApp(store, async (app) => {
      const before = listed(store.incomingDir);
      const cookie = await app.cookieFor('support');
      const server = app.app.listen(0, '127.0.0.1');
      await new Promise((r) => server.once('listening', r));
      try {
        const { port } = server.address() as AddressInfo;
        // A multipart body announced at 8 MiB, cut after 1 MiB.
        await new Promise<void>((resolveCut) => {
          const boundary = 'parley-cut';
          const req = httpRequest({
            host: '127.0.0.1',
            port,
            method: 'POST',
            path: '/api/traces?wait=false',
            headers: { cookie, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(8 * MIB) },
          });
          req.on('error', () => resolveCut());
          req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.jsonl"\r\nContent-Type: application/octet-stream\r\n\r\n`);
          req.write(Buffer.alloc(MIB, '{"t": 1, "vbus": {"mv": 5000}}\n'));
          setTimeout(() => {
            req.destroy();
            resolveCut();
          }, 300);
        });
        // The server notices the closed connection and deletes what it had received.
        const deadline = Date.now() + 10_000;
        while (Date.now() < deadline && listed(store.incomingDir).length !== before.length) await new Promise((r) => setTimeout(r, 50));
        expect(listed(store.incomingDir)).toEqual(before);

        const notATrace = join(folder, 'holiday.png');
        writeFileSync(notATrace, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...Buffer.alloc(4096)]));
        const res = await (await app.signInAs('support')).post('/api/traces').attach('file', notATrace);
        expect(res.status).toBe(400);
        expect(res.body.error.code).toBe('trace.not-a-trace');
        expect(listed(store.incomingDir)).toEqual(before);
        expect(await app.orm.em.fork().count(Trace, { fileName: { $in: ['cut.jsonl', 'holiday.png'] } })).toBe(0);
      } finally {
        await new Promise((r) => server.close(r));
      }
    });
  });
});
