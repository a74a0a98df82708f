/**
 * Answers of read routes kept serialised, under a key the route computes from what the answer is
 * read from (a route's `keep`, server/route-def.ts): the library version for lists, a trace's
 * `analysedAt` for its pages. A key never names a stale answer, so nothing here is ever
 * invalidated; old keys simply stop being asked for and age out. Each answer carries an ETag (a
 * client that holds it gets 304) and, for clients that take gzip, is compressed once. Kept per
 * database (ids are only unique within one), at most `KEPT_BYTES` in all, least recently used first
 * out. What a caller may see is decided before anything kept is looked at (the role check).
 */
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import type { Request, Response } from 'express';

/** Room for about two thousand list pages or a few hundred timeline windows. */
const KEPT_BYTES = 32 * 1024 * 1024;

export interface KeptAnswer {
  key: string;
  json: Buffer;
  /** Compressed on the first request that takes gzip. */
  gzip: Buffer | undefined;
  etag: string;
}

interface KeptAnswers {
  byKey: Map<string, KeptAnswer>;
  bytes: number;
}

const perDatabase = new WeakMap<object, KeptAnswers>();

function keptOf(database: object): KeptAnswers {
  let kept = perDatabase.get(database);
  if (!kept) {
    kept = { byKey: new Map(), bytes: 0 };
    perDatabase.set(database, kept);
  }
  return kept;
}

const sizeOf = (answer: KeptAnswer) => answer.json.length + (answer.gzip?.length ?? 0);

function trim(kept: KeptAnswers): void {
  for (const [oldest, value] of kept.byKey) {
    if (kept.bytes <= KEPT_BYTES) break;
    kept.byKey.delete(oldest);
    kept.bytes -= sizeOf(value);
  }
}

/** Where a route's answer under its own key is kept: routes never share answers. */
export function keptKey(route: { method: string; path: string }, key: string): string {
  return `${route.method} ${route.path} ${key}`;
}

/** The answer kept under `key` in this database (now the most recently used), or undefined. */
export function keptAnswer(database: object, key: string): KeptAnswer | undefined {
  const kept = keptOf(database);
  const answer = kept.byKey.get(key);
  if (answer) {
    kept.byKey.delete(key);
    kept.byKey.set(key, answer);
  }
  return answer;
}

/** Serialises `body` and keeps it under `key`. */
export function keepAnswer(database: object, key: string, body: unknown): KeptAnswer {
  const json = Buffer.from(JSON.stringify(body));
  const answer: KeptAnswer = { key, json, gzip: undefined, etag: createHash('sha1').update(json).digest('base64url') };
  const kept = keptOf(database);
  const before = kept.byKey.get(key);
  if (before) kept.bytes -= sizeOf(before);
  kept.byKey.delete(key);
  kept.byKey.set(key, answer);
  kept.bytes += json.length;
  trim(kept);
  return answer;
}

/** Answers with a kept answer: 304 when the client holds this representation, else the bytes (gzipped when taken). */
export function sendKept(req: Request, res: Response, database: object, answer: KeptAnswer): void {
  const gzip = acceptsGzip(req.headers['accept-encoding']);
  // Each encoding is its own representation, with its own tag.
  const etag = gzip ? `W/"${answer.etag}-gzip"` : `W/"${answer.etag}"`;
  res.setHeader('Vary', 'Accept-Encoding');
  res.setHeader('ETag', etag);
  if (matches(req.headers['if-none-match'], etag)) {
    res.statusCode = 304;
    res.end();
    return;
  }
  let body = answer.json;
  if (gzip) {
    if (!answer.gzip) {
      answer.gzip = gzipSync(answer.json, { level: 6 });
      const kept = keptOf(database);
      if (kept.byKey.get(answer.key) === answer) {
        kept.bytes += answer.gzip.length;
        trim(kept);
      }
    }
    body = answer.gzip;
    res.setHeader('Content-Encoding', 'gzip');
  }
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('Content-Length', body.length);
  res.statusCode = 200;
  res.end(body);
}

/** True when `Accept-Encoding` takes gzip, by name or as `*` (a q of 0 refuses it; a named entry wins over `*`). */
export function acceptsGzip(header: string | string[] | undefined): boolean {
  const value = Array.isArray(header) ? header.join(',') : header;
  if (!value) return false;
  const qOf = new Map<string, number>();
  for (const part of value.split(',')) {
    const [coding = '', ...parameters] = part.split(';');
    const q = parameters.map((p) => /^\s*q\s*=\s*([\d.]+)\s*$/i.exec(p)?.[1]).find((v) => v !== undefined);
    qOf.set(coding.trim().toLowerCase(), q === undefined ? 1 : Number(q));
  }
  return (qOf.get('gzip') ?? qOf.get('*') ?? 0) > 0;
}

/** `If-None-Match` names this tag (weak comparison, as for GET). */
function matches(header: string | undefined, etag: string): boolean {
  if (!header) return false;
  if (header.trim() === '*') return true;
  const bare = etag.replace(/^W\//, '');
  return header.split(',').some((tag) => tag.trim().replace(/^W\//, '') === bare);
}
