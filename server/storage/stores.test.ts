/**
 * Both trace stores against real back ends: the local folder, and the S3 store against an S3 fake
 * (s3rver from npm, tests/support/s3-fake.ts) that this file starts on a loopback port. Uploads go
 * in parts from the temporary file, downloads come as streams, and a failed upload leaves nothing
 * behind: no object, no open multipart upload, no temporary file.
 */
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startS3Fake, type S3Fake } from '../../tests/support/s3-fake.ts';
import { createLocalTraceStore } from './local-store.ts';
import { createS3TraceStore } from './s3-store.ts';
import type { TraceStore } from './types.ts';

const MIB = 1024 * 1024;
/** S3's smallest part; a 12 MiB file then goes in three parts. */
const PART_BYTES = 5 * MIB;

const sha256Of = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

let folder: string;
let fake: S3Fake;
let s3: TraceStore;

/** A received upload as multer leaves it: a temporary file in the store's incoming folder. */
function received(store: TraceStore, bytes: Buffer): { path: string; sha256: string } {
  mkdirSync(store.incomingDir, { recursive: true });
  const path = join(store.incomingDir, `.incoming-${randomBytes(6).toString('hex')}`);
  writeFileSync(path, bytes);
  return { path, sha256: sha256Of(bytes) };
}

async function readAll(store: TraceStore, sha256: string): Promise<{ bytes: Buffer; chunks: number }> {
  const parts: Buffer[] = [];
  for await (const chunk of await store.read(sha256)) parts.push(chunk as Buffer);
  return { bytes: Buffer.concat(parts), chunks: parts.length };
}

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'parley-stores-'));
  fake = await startS3Fake();
  s3 = createS3TraceStore({ endpoint: fake.url, bucket: fake.bucket, credentials: fake.credentials, incomingDir: join(folder, 's3-incoming'), partSizeBytes: PART_BYTES });
});

afterAll(async () => {
  await fake?.stop();
  rmSync(folder, { recursive: true, force: true });
});

describe('S3 trace store (s3rver)', () => {
  it('uploads a 12 MiB file in three parts, none bigger than a part, and removes the temporary file', async () => {
    const bytes = randomBytes(12 * MIB);
    const { path, sha256 } = received(s3, bytes);
    fake.requests.length = 0;
    await s3.keep(path, sha256);

    expect(existsSync(path)).toBe(false);
    expect(fake.objectKeys()).toContain(`traces/${sha256}`);
    const parts = fake.requests.filter((r) => r.method === 'PUT' && r.query.partNumber !== undefined);
    expect(parts.map((r) => Number(r.query.partNumber)).sort()).toEqual([1, 2, 3]);
    expect(Math.max(...parts.map((r) => r.bodyBytes))).toBeLessThanOrEqual(PART_BYTES + 64 * 1024);
    expect(parts.reduce((sum, r) => sum + r.bodyBytes, 0)).toBeGreaterThanOrEqual(bytes.length);
    expect(fake.openUploads()).toEqual([]);
    expect(await s3.has(sha256)).toBe(true);
  });

  it('streams a download in many chunks with the same bytes, and a local copy that goes afterwards', async () => {
    const bytes = randomBytes(6 * MIB);
    const { path, sha256 } = received(s3, bytes);
    await s3.keep(path, sha256);

    const { bytes: back, chunks } = await readAll(s3, sha256);
    expect(sha256Of(back)).toBe(sha256);
    expect(chunks).toBeGreaterThan(10);

    let copy = '';
    const size = await s3.withLocalFile(sha256, async (local) => {
      copy = local;
      return readFileSync(local).length;
    });
    expect(size).toBe(bytes.length);
    expect(existsSync(copy)).toBe(false);
    expect(readdirSync(s3.incomingDir)).toEqual([]);
  });

  it('a file stored already is not uploaded again', async () => {
    const bytes = randomBytes(64 * 1024);
    const first = received(s3, bytes);
    await s3.keep(first.path, first.sha256);
    const again = received(s3, bytes);
    fake.requests.length = 0;
    await s3.keep(again.path, again.sha256);
    expect(fake.requests.filter((r) => r.method === 'PUT' || r.method === 'POST')).toEqual([]);
    expect(existsSync(again.path)).toBe(false);
  });

  it('an upload whose second part fails is aborted: no object, no parts, no temporary file', async () => {
    const bytes = randomBytes(11 * MIB);
    const { path, sha256 } = received(s3, bytes);
    fake.failParts.add(2);
    try {
      await expect(s3.keep(path, sha256)).rejects.toThrow();
    } finally {
      fake.failParts.clear();
    }
    expect(fake.requests.some((r) => r.method === 'DELETE' && r.query.uploadId !== undefined)).toBe(true);
    expect(fake.objectKeys()).not.toContain(`traces/${sha256}`);
    expect(fake.openUploads()).toEqual([]);
    expect(existsSync(path)).toBe(false);
    expect(await s3.has(sha256)).toBe(false);
  });

  it('an unreachable bucket fails the upload and still removes the temporary file', async () => {
    const gone = createS3TraceStore({
      endpoint: 'http://127.0.0.1:9',
      bucket: fake.bucket,
      credentials: fake.credentials,
      incomingDir: join(folder, 'gone-incoming'),
    });
    const { path, sha256 } = received(gone, randomBytes(1024));
    await expect(gone.keep(path, sha256)).rejects.toThrow();
    expect(existsSync(path)).toBe(false);
    expect((await gone.check()).ok).toBe(false);
    expect((await s3.check()).ok).toBe(true);
  });

  it('remove deletes the object', async () => {
    const { path, sha256 } = received(s3, randomBytes(2048));
    await s3.keep(path, sha256);
    await s3.remove(sha256);
    expect(await s3.has(sha256)).toBe(false);
    expect(fake.objectKeys()).not.toContain(`traces/${sha256}`);
  });
});

describe('stored analyses beside the file (both stores)', () => {
  for (const kind of ['s3', 'local'] as const) {
    it(`${kind}: keeps an analysis written to the incoming folder, replaces it, streams it back, and remove takes it with the file`, async () => {
      const store = kind === 's3' ? s3 : createLocalTraceStore(join(folder, 'local-analyses'));
      const file = received(store, randomBytes(4096));
      await store.keep(file.path, file.sha256);
      expect(await store.readAnalysis(file.sha256)).toBeNull();
      for (const version of ['first', 'second']) {
        const analysis = received(store, Buffer.from(`${version} analysis`));
        await store.keepAnalysis(analysis.path, file.sha256);
        expect(existsSync(analysis.path)).toBe(false);
      }
      const parts: Buffer[] = [];
      for await (const chunk of (await store.readAnalysis(file.sha256))!) parts.push(chunk as Buffer);
      expect(Buffer.concat(parts).toString()).toBe('second analysis');
      if (kind === 's3') expect(fake.objectKeys()).toContain(`traces/${file.sha256}.analysis`);
      await store.remove(file.sha256);
      expect(await store.has(file.sha256)).toBe(false);
      expect(await store.readAnalysis(file.sha256)).toBeNull();
    });
  }
});

describe('local trace store', () => {
  it('keeps a received file under its hash and streams it back', async () => {
    const local = createLocalTraceStore(join(folder, 'local'));
    const bytes = randomBytes(3 * MIB);
    const { path, sha256 } = received(local, bytes);
    await local.keep(path, sha256);
    expect(existsSync(path)).toBe(false);
    const { bytes: back } = await readAll(local, sha256);
    expect(sha256Of(back)).toBe(sha256);
    expect(readdirSync(local.incomingDir)).toEqual([sha256]);
  });

  it('a failed move leaves neither the temporary file nor a stored file', async () => {
    const dataDir = join(folder, 'broken');
    const local = createLocalTraceStore(dataDir);
    const incoming = join(folder, 'broken-incoming');
    mkdirSync(incoming, { recursive: true });
    const bytes = randomBytes(4096);
    const path = join(incoming, '.incoming-1');
    writeFileSync(path, bytes);
    // The store's folder is a plain file: the rename into it fails.
    mkdirSync(dataDir, { recursive: true });
    writeFileSync(join(dataDir, 'traces'), 'not a folder');
    await expect(local.keep(path, sha256Of(bytes))).rejects.toThrow();
    expect(existsSync(path)).toBe(false);
    expect(await local.has(sha256Of(bytes))).toBe(false);
  });
});
