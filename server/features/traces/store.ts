/**
 * The trace store: files named by their SHA-256 under `<dataDir>/traces/`, so the same file
 * uploaded twice is kept once. Uploads stream to a temporary file in the same folder while they
 * are hashed (multer storage engine below); the handler then keeps it under its hash or drops it.
 */
import { createHash, randomBytes } from 'node:crypto';
import { createWriteStream, existsSync, mkdirSync } from 'node:fs';
import { rename, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import { SNIFF_BYTES } from './sniff.ts';

export interface TraceStore {
  dir: string;
  pathOf(sha256: string): string;
  /** The stored analysis of that file (server/analysis/deflated-json.ts). */
  analysisPathOf(sha256: string): string;
  has(sha256: string): boolean;
  /** Moves a received temporary file to its hash name; when that file exists already, drops the copy. */
  keep(tempPath: string, sha256: string): Promise<string>;
  remove(sha256: string): Promise<void>;
}

export function traceStore(dataDir: string): TraceStore {
  const dir = join(dataDir, 'traces');
  const pathOf = (sha256: string) => {
    if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('trace store: not a SHA-256');
    return join(dir, sha256);
  };
  return {
    dir,
    pathOf,
    analysisPathOf: (sha256) => `${pathOf(sha256)}.analysis`,
    has: (sha256) => existsSync(pathOf(sha256)),
    async keep(tempPath, sha256) {
      const target = pathOf(sha256);
      if (existsSync(target)) await rm(tempPath, { force: true });
      else await rename(tempPath, target);
      return target;
    },
    async remove(sha256) {
      await rm(pathOf(sha256), { force: true });
      await rm(`${pathOf(sha256)}.analysis`, { force: true });
    },
  };
}

/** What the storage engine adds to `req.file`. */
export interface ReceivedTrace {
  path: string;
  size: number;
  sha256: string;
  /** The first SNIFF_BYTES bytes, for sniffing the format. */
  head: Buffer;
}

/** A multer storage engine: hashes while writing, keeps the head, never holds the file in memory. */
export function hashingStorage(store: TraceStore): StorageEngine {
  return {
    _handleFile(_req: Request, file, callback) {
      mkdirSync(store.dir, { recursive: true });
      const path = join(store.dir, `.incoming-${randomBytes(8).toString('hex')}`);
      const hash = createHash('sha256');
      const headParts: Buffer[] = [];
      let headBytes = 0;
      let size = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          hash.update(chunk);
          size += chunk.length;
          if (headBytes < SNIFF_BYTES) {
            const part = chunk.subarray(0, SNIFF_BYTES - headBytes);
            headParts.push(part);
            headBytes += part.length;
          }
          done(null, chunk);
        },
      });
      pipeline(file.stream, tap, createWriteStream(path, { mode: 0o600 })).then(
        () => {
          const received: ReceivedTrace = { path, size, sha256: hash.digest('hex'), head: Buffer.concat(headParts) };
          callback(null, received as unknown as Partial<Express.Multer.File>);
        },
        (error: unknown) => {
          void rm(path, { force: true });
          callback(error as Error);
        },
      );
    },
    _removeFile(_req, file, callback) {
      rm((file as unknown as ReceivedTrace).path, { force: true }).then(() => callback(null), callback);
    },
  };
}
