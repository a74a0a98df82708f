/**
 * Sends `{ …fields, "analysis": <stored analysis> }` without parsing the stored JSON: as one gzip
 * member built around the stored compressed body when the client takes gzip (every browser does),
 * else inflated as a stream on the thread pool. Either way the event loop only copies bytes.
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request, Response } from 'express';
import { gzipEnvelope, inflatingStream, openStoredStream } from '../../analysis/deflated-json.ts';

export async function sendWithStoredAnalysis(req: Request, res: Response, fields: Record<string, unknown>, storedAnalysis: Readable | null): Promise<undefined> {
  const head = JSON.stringify(fields);
  res.type('application/json; charset=utf-8');
  res.vary('Accept-Encoding');
  if (storedAnalysis === null) {
    res.json({ ...fields, analysis: null });
    return undefined;
  }
  const stored = await openStoredStream(storedAnalysis);
  const prefix = `${head.slice(0, -1)}${head.length > 2 ? ',' : ''}"analysis":`;
  if (req.acceptsEncodings('gzip') === 'gzip') {
    res.setHeader('Content-Encoding', 'gzip');
    await pipeline(Readable.from(concatParts(gzipEnvelope(prefix, stored, stored.body, '}'))), res);
    return undefined;
  }
  await pipeline(Readable.from(concatParts([Buffer.from(prefix), inflatingStream(stored.body), Buffer.from('}')])), res);
  return undefined;
}

async function* concatParts(parts: (Buffer | Readable)[]): AsyncGenerator<Buffer> {
  for (const part of parts) {
    if (Buffer.isBuffer(part)) yield part;
    else for await (const chunk of part) yield chunk as Buffer;
  }
}
