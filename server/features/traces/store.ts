/**
 * Receiving an upload: multer streams it to a temporary file in the store's `incomingDir` while it
 * is hashed (the storage engine below); the handler then keeps it in the trace store
 * (server/storage) under its hash, or drops it.
 */
import { createHash, randomBytes } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import { SNIFF_BYTES } from './sniff.ts';
import type { TraceStore } from '../../storage/types.ts';

export type { TraceStore } from '../../storage/types.ts';

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
      mkdirSync(store.incomingDir, { recursive: true });
      const path = join(store.incomingDir, `.incoming-${randomBytes(8).toString('hex')}`);
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
