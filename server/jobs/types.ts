/**
 * The one background-job interface: trace analyses, vector runs, sweeps and outgoing mail all go
 * through a `JobQueue`. A job is named by its kind and a key (the trace id, the run id); the queue
 * runs one job per kind and key at a time, and every job publishes its events under that name.
 *
 * Events follow one rule: `type: 'progress'` while the job runs, any other type ends it (the final
 * event). Two implementations sit behind this interface: the in-process queue (./local-queue.ts,
 * SQLite, one server) and the PostgreSQL queue (./pg-queue.ts, shared by every instance).
 */

export interface JobEvent {
  type: string;
}

/** True for an event that ends its job's stream. */
export function isFinalEvent(event: JobEvent): boolean {
  return event.type !== 'progress';
}

/** A kind of job with its payload and event types; `name` is its queue name. */
export interface JobKind<Payload, Event extends JobEvent> {
  readonly name: string;
  /**
   * The payload holds something that must not stay in the queue's tables once the job is over
   * (a mail with a sign-in link): the PostgreSQL queue blanks it when the handler returns.
   */
  readonly forgetPayloadWhenDone?: boolean;
  /** Type carriers only. */
  readonly payload?: Payload;
  readonly event?: Event;
}

export function jobKind<Payload, Event extends JobEvent>(name: string, options: { forgetPayloadWhenDone?: boolean } = {}): JobKind<Payload, Event> {
  return { name, ...options };
}

/** What a running job may do besides its work. */
export interface JobContext<Event extends JobEvent> {
  key: string;
  /** Publish progress (or, last, the final event) to every subscriber on any instance. */
  publish(event: Event): void;
  /** Aborted when the process stops: the job should give up; the queue hands it to another worker. */
  signal: AbortSignal;
}

export type JobHandler<Payload, Event extends JobEvent> = (payload: Payload, job: JobContext<Event>) => Promise<void>;

/** Live events per job: the latest one, and listeners. */
export interface JobEvents {
  publish(topic: string, event: JobEvent): void;
  latest(topic: string): JobEvent | undefined;
  subscribe(topic: string, listener: (event: JobEvent) => void): () => void;
}

export interface JobQueue {
  /** `local` (in-process) or `postgres`; /api/health reports it. */
  readonly name: 'local' | 'postgres';
  /** Registers the handler of a kind; this process then works on jobs of that kind. */
  handle<P, E extends JobEvent>(kind: JobKind<P, E>, handler: JobHandler<P, E>): void;
  /**
   * Queues the job of that kind and key, or joins the one queued or running. `finished` settles
   * with its final event, from whichever process ran it.
   */
  enqueue<P, E extends JobEvent>(kind: JobKind<P, E>, key: string | number, payload: P): Promise<{ finished: Promise<E> }>;
  /** Queued or running anywhere. */
  isActive(kind: JobKind<unknown, JobEvent>, key: string | number): Promise<boolean>;
  /** The latest event of that job seen by this process (a final event stays for a few minutes). */
  latest<E extends JobEvent>(kind: JobKind<unknown, E>, key: string | number): E | undefined;
  subscribe<E extends JobEvent>(kind: JobKind<unknown, E>, key: string | number, listener: (event: E) => void): () => void;
  /** Answers for /api/health: can the queue take work? */
  check(): Promise<{ ok: boolean; message?: string }>;
  /** Stops taking work; running jobs are aborted and handed back to the queue (in-process: left for start-up to resume). */
  close(): Promise<void>;
}

export function topicOf(kind: { name: string }, key: string | number): string {
  return `${kind.name}:${String(key)}`;
}
