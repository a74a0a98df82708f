/**
 * The one server-sent-events writer for job progress (`/api/traces/:id/events`,
 * `/api/runs/:id/events`): the latest progress first, then every event until the final one.
 * The stored row decides what "over" means, so a stream opened after the end, on another
 * instance, or after a restart gets the same final event as one that watched the whole job.
 */
import type { Request, Response } from 'express';
import { isFinalEvent, type JobEvent, type JobKind, type JobQueue } from './types.ts';

export interface JobStreamSource<E extends JobEvent> {
  /** The job's state as stored: its final event when it is over, else a progress event. */
  snapshot(): Promise<E>;
  /** Comment line sent every 15 s so proxies keep the connection. */
  heartbeat: string;
  /** Which events reach the client before the final one (default all). */
  forward?(event: E): boolean;
}

function writeEvent(res: Response, event: JobEvent): void {
  res.write(`event: ${event.type}\ndata: ${JSON.stringify(event)}\n\n`);
}

export function openEventStream(res: Response): void {
  res.status(200);
  // no-transform keeps compression from buffering the stream.
  res.set({ 'Content-Type': 'text/event-stream; charset=utf-8', 'Cache-Control': 'no-cache, no-transform', 'X-Accel-Buffering': 'no' });
  res.flushHeaders();
}

export async function streamJobEvents<E extends JobEvent>(req: Request, res: Response, jobs: JobQueue, kind: JobKind<unknown, E>, key: string | number, source: JobStreamSource<E>): Promise<void> {
  openEventStream(res);
  await new Promise<void>((resolveStream) => {
    let ended = false;
    const buffered: E[] = [];
    let live = false;
    const finish = (final: E) => {
      if (ended) return;
      writeEvent(res, final);
      stop();
    };
    const stop = () => {
      if (ended) return;
      ended = true;
      unsubscribe();
      clearInterval(heartbeat);
      if (!res.writableEnded) res.end();
      resolveStream();
    };
    const deliver = (event: E) => {
      if (ended) return;
      if (isFinalEvent(event)) finish(event);
      else if (source.forward?.(event) ?? true) writeEvent(res, event);
    };
    // Subscribe before reading the row, so an event between the two is not lost.
    const unsubscribe = jobs.subscribe(kind, key, (event: E) => (live ? deliver(event) : buffered.push(event)));
    const heartbeat = setInterval(() => res.write(`: ${source.heartbeat}\n\n`), 15_000);
    heartbeat.unref();
    req.on('close', stop);

    const begin = async () => {
      const stored = await source.snapshot();
      if (isFinalEvent(stored)) return finish(stored);
      const latest = jobs.latest(kind, key);
      if (latest && isFinalEvent(latest)) return finish(latest);
      writeEvent(res, latest ?? stored);
      live = true;
      for (const event of buffered.splice(0)) deliver(event);
      // The job may have ended between the row read and the subscription: read the row again.
      if (!ended && !(await jobs.isActive(kind, key))) {
        const again = await source.snapshot();
        if (isFinalEvent(again)) finish(again);
      }
    };
    begin().catch(() => stop());
  });
}
