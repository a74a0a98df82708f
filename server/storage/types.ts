/**
 * Where uploaded trace files live, named by their SHA-256 (the same file uploaded twice is kept
 * once): a local folder (one machine, the default) or an S3-compatible bucket (several instances).
 * Uploads always stream to a temporary file in `incomingDir` first, where they are hashed and
 * sniffed; `keep` then moves that file into the store, or leaves nothing behind if it fails.
 */
import type { Readable } from 'node:stream';

export interface TraceStore {
  readonly kind: 'local' | 's3';
  /** A local folder for files being received (uploads, downloads for the analysis workers). */
  readonly incomingDir: string;
  has(sha256: string): Promise<boolean>;
  /** Moves a received temporary file into the store under its hash (dropping it when the hash is stored already). */
  keep(tempPath: string, sha256: string): Promise<void>;
  /** Stores bytes under their hash (the demo seed). */
  put(sha256: string, bytes: Buffer): Promise<void>;
  /** Removes the file and its stored analysis. */
  remove(sha256: string): Promise<void>;
  /** The stored file as a stream (downloads). */
  read(sha256: string): Promise<Readable>;
  /**
   * Moves a stored analysis of the file (server/analysis/deflated-json.ts, written by an analysis
   * worker to a temporary file in `incomingDir`) in beside it, replacing an older one.
   */
  keepAnalysis(tempPath: string, sha256: string): Promise<void>;
  /** The stored analysis as a stream, or null when the file has none. */
  readAnalysis(sha256: string): Promise<Readable | null>;
  /**
   * Runs `use` with a local path of the stored file (the analysis workers read files): the file
   * itself for the local store, a temporary copy (deleted afterwards) for a bucket.
   */
  withLocalFile<T>(sha256: string, use: (path: string) => Promise<T>): Promise<T>;
  /** For /api/health. */
  check(): Promise<{ ok: boolean; message?: string }>;
}

export function assertSha256(sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('trace store: not a SHA-256');
  return sha256;
}
