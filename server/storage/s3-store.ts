/**
 * The trace store in an S3-compatible bucket (AWS SDK v3): objects `<prefix><sha256>`. Uploads
 * stream from the received temporary file in parts (`@aws-sdk/lib-storage`); a failed upload is
 * aborted, so neither a partial object nor the temporary file stays behind. Credentials come the
 * SDK's usual way (AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY, a profile or an instance role).
 */
import { createReadStream, createWriteStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, HeadObjectCommand, PutObjectCommand, S3Client, type S3ClientConfig } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { assertSha256, type TraceStore } from './types.ts';

export interface S3StoreOptions {
  endpoint: string;
  bucket: string;
  region?: string;
  prefix?: string;
  /** Local folder for received files; default a folder in the system temp directory. */
  incomingDir?: string;
  /** Tests pass fixed credentials; otherwise the SDK's default chain. */
  credentials?: S3ClientConfig['credentials'];
  /** Bytes per uploaded part (S3's minimum is 5 MiB); the file never sits in memory whole. */
  partSizeBytes?: number;
}

export const DEFAULT_PART_SIZE_BYTES = 8 * 1024 * 1024;

function isNotFound(error: unknown): boolean {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e.name === 'NotFound' || e.name === 'NoSuchKey' || e.$metadata?.httpStatusCode === 404;
}

export function createS3TraceStore(options: S3StoreOptions): TraceStore {
  const client = new S3Client({
    endpoint: options.endpoint,
    region: options.region ?? 'us-east-1',
    // Path-style addressing works with every S3-compatible server; virtual hosts need DNS per bucket.
    forcePathStyle: true,
    ...(options.credentials ? { credentials: options.credentials } : {}),
  });
  const Bucket = options.bucket;
  const keyOf = (sha256: string) => `${options.prefix ?? 'traces/'}${assertSha256(sha256)}`;
  const analysisKeyOf = (sha256: string) => `${keyOf(sha256)}.analysis`;
  const incomingDir = options.incomingDir ?? join(tmpdir(), 'parley-incoming');
  const has = async (sha256: string) => {
    try {
      await client.send(new HeadObjectCommand({ Bucket, Key: keyOf(sha256) }));
      return true;
    } catch (error) {
      if (isNotFound(error)) return false;
      throw error;
    }
  };
  const readKey = async (Key: string): Promise<Readable> => {
    const object = await client.send(new GetObjectCommand({ Bucket, Key }));
    if (!(object.Body instanceof Readable)) throw new Error('trace store: the object has no body');
    return object.Body;
  };
  const read = (sha256: string) => readKey(keyOf(sha256));
  const upload = async (tempPath: string, Key: string) => {
    const parts = new Upload({
      client,
      params: { Bucket, Key, Body: createReadStream(tempPath), ContentType: 'application/octet-stream' },
      queueSize: 2,
      partSize: options.partSizeBytes ?? DEFAULT_PART_SIZE_BYTES,
      leavePartsOnError: false,
    });
    await parts.done();
  };
  return {
    kind: 's3',
    incomingDir,
    has,
    async keep(tempPath, sha256) {
      try {
        if (await has(sha256)) return;
        await upload(tempPath, keyOf(sha256));
      } finally {
        await rm(tempPath, { force: true });
      }
    },
    async put(sha256, bytes) {
      if (!(await has(sha256))) await client.send(new PutObjectCommand({ Bucket, Key: keyOf(sha256), Body: bytes }));
    },
    async remove(sha256) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: keyOf(sha256) }));
      await client.send(new DeleteObjectCommand({ Bucket, Key: analysisKeyOf(sha256) }));
    },
    read,
    async keepAnalysis(tempPath, sha256) {
      try {
        await upload(tempPath, analysisKeyOf(sha256));
      } finally {
        await rm(tempPath, { force: true });
      }
    },
    async readAnalysis(sha256) {
      try {
        return await readKey(analysisKeyOf(sha256));
      } catch (error) {
        if (isNotFound(error)) return null;
        throw error;
      }
    },
    async withLocalFile(sha256, use) {
      mkdirSync(incomingDir, { recursive: true });
      const path = join(incomingDir, `.download-${randomBytes(8).toString('hex')}`);
      try {
        await pipeline(await read(sha256), createWriteStream(path, { mode: 0o600 }));
        return await use(path);
      } finally {
        await rm(path, { force: true });
      }
    },
    async check() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
        return { ok: true };
      } catch (error) {
        return { ok: false, message: error instanceof Error ? error.name : String(error) };
      }
    },
  };
}
