/**
 * A local S3 fake for tests and benchmarks: s3rver (npm) on a free loopback port with one bucket in
 * a temporary folder, started by the test and deleted afterwards. Two things are added in front of
 * its routes:
 *
 * - **AbortMultipartUpload** (`DELETE /<bucket>/<key>?uploadId=…`), which s3rver 3 answers with
 *   "method not allowed": it deletes the upload's parts, as S3 does, so a test can see that a
 *   failed upload leaves no parts behind.
 * - **A request log and fault injection**: every request's method, query and body size is kept
 *   (a test can see that an upload went in parts, none the size of the file), and `failParts`
 *   makes every UploadPart of a given part number answer 500 until it is cleared.
 *
 * s3rver's one account signs with the key pair below; servers started by a test get it through
 * the SDK's usual variables (`credentialEnv`).
 */
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';

export const S3_FAKE_ACCESS_KEY = 'S3RVER';
export const S3_FAKE_SECRET_KEY = 'S3RVER';

export interface S3Request {
  method: string;
  path: string;
  query: Record<string, string>;
  /** Bytes of the request body, as its Content-Length says (the SDK sends one with each part). */
  bodyBytes: number;
}

export interface S3Fake {
  /** `http://127.0.0.1:<port>` */
  url: string;
  bucket: string;
  credentials: { accessKeyId: string; secretAccessKey: string };
  /** AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY for a server process. */
  credentialEnv: Record<string, string>;
  requests: S3Request[];
  /** Part numbers whose UploadPart answers 500 (cleared by the test). */
  failParts: Set<number>;
  /** Object keys in the bucket, as s3rver's folder holds them. */
  objectKeys(): string[];
  /** Multipart uploads started and neither completed nor aborted. */
  openUploads(): string[];
  stop(): Promise<void>;
}

/** s3rver keeps an object `a/b` as `<bucket>/a/b._S3rver_object`, and uploads under `<bucket>/._S3rver_uploads/<id>`. */
const OBJECT_SUFFIX = '._S3rver_object';
const UPLOADS_DIR = '._S3rver_uploads';

function walk(dir: string, prefix = ''): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    if (entry.name === UPLOADS_DIR) return [];
    if (entry.isDirectory()) return walk(join(dir, entry.name), `${prefix}${entry.name}/`);
    return entry.name.endsWith(OBJECT_SUFFIX) ? [`${prefix}${entry.name.slice(0, -OBJECT_SUFFIX.length)}`] : [];
  });
}

interface KoaContext {
  method: string;
  path: string;
  query: Record<string, string>;
  req: NodeJS.ReadableStream;
  status: number;
  body: unknown;
  get(name: string): string;
  set(name: string, value: string): void;
}

export async function startS3Fake(options: { bucket?: string } = {}): Promise<S3Fake> {
  const bucket = options.bucket ?? 'parley-traces';
  const directory = mkdtempSync(join(tmpdir(), 'parley-s3-'));
  const server = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory, configureBuckets: [{ name: bucket, configs: [] }] });
  const requests: S3Request[] = [];
  const failParts = new Set<number>();
  const uploadsDir = join(directory, bucket, UPLOADS_DIR);

  const front = async (ctx: KoaContext, next: () => Promise<void>) => {
    // Reading the body here would take it from s3rver: its length comes from the header.
    requests.push({ method: ctx.method, path: ctx.path, query: { ...ctx.query }, bodyBytes: Number(ctx.get('content-length') || 0) });
    const uploadId = ctx.query.uploadId;
    if (ctx.method === 'DELETE' && uploadId !== undefined) {
      if (!/^[0-9a-f]+$/.test(uploadId)) {
        ctx.status = 400;
        return;
      }
      rmSync(join(uploadsDir, uploadId), { recursive: true, force: true });
      ctx.status = 204;
      return;
    }
    if (ctx.method === 'PUT' && uploadId !== undefined && failParts.has(Number(ctx.query.partNumber))) {
      // Read the part so the client sees an answer, not a reset connection.
      for await (const _chunk of ctx.req) {
        // discarded
      }
      ctx.status = 500;
      ctx.set('Content-Type', 'application/xml');
      ctx.body = '<?xml version="1.0" encoding="UTF-8"?><Error><Code>InternalError</Code><Message>injected by the test</Message></Error>';
      return;
    }
    await next();
  };
  // Koa composes its middleware list when the server starts: put ours first.
  (server as unknown as { middleware: unknown[] }).middleware.unshift(front);
  const { port } = (await server.run()) as { port: number };

  return {
    url: `http://127.0.0.1:${port}`,
    bucket,
    credentials: { accessKeyId: S3_FAKE_ACCESS_KEY, secretAccessKey: S3_FAKE_SECRET_KEY },
    credentialEnv: { AWS_ACCESS_KEY_ID: S3_FAKE_ACCESS_KEY, AWS_SECRET_ACCESS_KEY: S3_FAKE_SECRET_KEY },
    requests,
    failParts,
    objectKeys: () => walk(join(directory, bucket)).sort(),
    openUploads: () => (existsSync(uploadsDir) ? readdirSync(uploadsDir) : []),
    async stop() {
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
