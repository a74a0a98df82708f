/**
 * Answers of the trace page's reads of an analysed trace (timeline windows, pages of findings and
 * contracts), kept serialised and, for clients that take gzip, compressed. What they are read from
 * never changes once the analysis is stored (a new analysis has a new `analysedAt`, part of the
 * key), so a repeat view of the same window costs the role check, the trace row (a deleted trace is
 * 404 before anything kept is looked at) and a copy; each answer carries an ETag, and a client that
 * already holds it gets 304. Kept per database (trace ids are only unique within one), at most
 * `KEPT_BYTES` in all, least recently used first out.
 */
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { Request, Response } from 'express';
import type { ITrace } from '../../db/trace-entities.ts';

const KEPT_BYTES = 32 * 1024 * 1024;

interface Kept {
  json: Buffer;
  gzip: Buffer;
  etag: string;
}

interface KeptAnswers {
  byKey: Map<string, Kept>;
  bytes: number;
}

const perDatabase = new WeakMap<object, KeptAnswers>();

function keptOf(em: EntityManager): KeptAnswers {
  let kept = perDatabase.get(em.config);
  if (!kept) {
    kept = { byKey: new Map(), bytes: 0 };
    perDatabase.set(em.config, kept);
  }
  return kept;
}

function keep(kept: KeptAnswers, key: string, answer: Kept): void {
  kept.byKey.set(key, answer);
  kept.bytes += answer.json.length + answer.gzip.length;
  for (const [oldest, value] of kept.byKey) {
    if (kept.bytes <= KEPT_BYTES) break;
    kept.byKey.delete(oldest);
    kept.bytes -= value.json.length + value.gzip.length;
  }
}

/**
 * Answers `compute()` for an analysed trace from what is kept under `route` and the query, computing
 * and keeping it the first time; a trace not (yet) analysed is answered afresh every time.
 */
export async function sendKeptAnswer(ctx: { req: Request; res: Response; em: EntityManager }, trace: ITrace, route: string, query: unknown, compute: () => Promise<unknown>): Promise<unknown> {
  if (trace.status !== 'done' || !trace.analysedAt) return compute();
  const kept = keptOf(ctx.em);
  const key = `${trace.id} ${trace.analysedAt.getTime()} ${route} ${JSON.stringify(query)}`;
  let answer = kept.byKey.get(key);
  if (answer) {
    kept.byKey.delete(key);
    kept.byKey.set(key, answer);
  } else {
    const json = Buffer.from(JSON.stringify(await compute()));
    answer = { json, gzip: gzipSync(json, { level: 6 }), etag: `"${createHash('sha1').update(json).digest('base64url')}"` };
    keep(kept, key, answer);
  }
  const { req, res } = ctx;
  const gzip = req.acceptsEncodings('gzip') === 'gzip';
  res.vary('Accept-Encoding');
  res.type('application/json; charset=utf-8');
  // Each encoding is its own representation, with its own tag.
  res.setHeader('ETag', gzip ? `W/${answer.etag.slice(0, -1)}-gzip"` : `W/${answer.etag}`);
  if (gzip) res.setHeader('Content-Encoding', 'gzip');
  res.send(gzip ? answer.gzip : answer.json);
  return undefined;
}
