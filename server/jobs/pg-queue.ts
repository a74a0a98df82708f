/**
 * The PostgreSQL job queue (a team deployment): jobs live in pg-boss's tables, so every server
 * instance and every `parley worker` process takes work from the same queue, and a job outlives
 * the process that queued it. What pg-boss does not do, this module adds:
 *
 * - **Events from any instance**: a job's events go out with NOTIFY on one channel; every process
 *   LISTENs and feeds its local hub, so a browser connected to any instance follows any job.
 * - **A dead worker's job is retried at once**: a process holds a PostgreSQL advisory lock (on a
 *   connection of its own) for each job it runs. PostgreSQL drops those locks the moment the
 *   process's connection dies (a crash, SIGKILL, a lost machine). Every process checks the active
 *   jobs every few seconds; one whose lock is free has lost its worker and is failed back to
 *   pg-boss, which retries it elsewhere. pg-boss's own expiry stays as the last resort.
 * - **Shutdown hands jobs back**: running handlers are aborted and their jobs failed back for retry.
 */
import pg from 'pg';
import PgBoss from 'pg-boss';
import { createJobEvents } from './events.ts';
import { isFinalEvent, topicOf, type JobEvent, type JobHandler, type JobKind, type JobQueue } from './types.ts';

const EVENTS_CHANNEL = 'parley_job_events';
/** First half of the two-int advisory lock key of a running job ("job" in ASCII). */
export const JOB_LOCK_SPACE = 0x6a6f62;
/** `application_name` of the connection holding a process's job locks, followed by its pid. */
/** The advisory-lock space in which queue creations take turns. */
const QUEUE_CREATION_LOCK_SPACE = 0x6a6f63;
export const JOB_HOLDER_APPLICATION = 'parley-jobs';
/** NOTIFY payloads must stay under 8000 bytes. */
const MAX_NOTIFY_BYTES = 7_000;

export interface PgJobQueueOptions {
  databaseUrl: string;
  /** How often to look for jobs whose worker died. */
  superviseEveryMs?: number;
  /** Jobs of one kind this process runs at once. */
  concurrency?: number;
  /** Attempts after the first (a dead worker, a shutdown). */
  retryLimit?: number;
  onError?(kind: string, key: string, cause: unknown): void;
  log?(message: string): void;
}

interface Envelope {
  payload: unknown;
}

export async function createPgJobQueue(options: PgJobQueueOptions): Promise<JobQueue> {
  const events = createJobEvents();
  const boss = new PgBoss({ connectionString: options.databaseUrl, schema: 'pgboss', max: 4, supervise: true, maintenanceIntervalSeconds: 30, monitorStateIntervalSeconds: 60 });
  boss.on('error', (error: unknown) => options.log?.(`job queue: ${error instanceof Error ? error.message : String(error)}`));
  await boss.start();

  // One connection listens for events, one holds the locks of the jobs this process runs, and the
  // pool publishes and supervises (a lock probe must not run on the connection that holds locks).
  const listener = new pg.Client({ connectionString: options.databaseUrl });
  // Named after this process, so an operator (or a test) sees in pg_stat_activity who runs which job.
  const holder = new pg.Client({ connectionString: options.databaseUrl, application_name: `${JOB_HOLDER_APPLICATION} ${process.pid}` });
  const pool = new pg.Pool({ connectionString: options.databaseUrl, max: 4 });
  await Promise.all([listener.connect(), holder.connect()]);
  listener.on('notification', (message) => {
    if (message.channel !== EVENTS_CHANNEL || !message.payload) return;
    try {
      const { topic, event } = JSON.parse(message.payload) as { topic: string; event: JobEvent };
      events.publish(topic, event);
    } catch {
      // A malformed payload is not ours.
    }
  });
  await listener.query(`listen ${EVENTS_CHANNEL}`);
  const connectionError = (error: Error) => options.log?.(`job queue connection: ${error.message}`);
  listener.on('error', connectionError);
  holder.on('error', connectionError);
  pool.on('error', connectionError);

  const stop = new AbortController();
  const kinds = new Set<string>();
  const running = new Map<string, { name: string; id: string }>();

  const publish = (topic: string, event: JobEvent) => {
    let payload = JSON.stringify({ topic, event });
    if (Buffer.byteLength(payload) > MAX_NOTIFY_BYTES) {
      // Only a long message can make it this big: cut the message, keep the numbers.
      const cut = JSON.parse(JSON.stringify(event, (key, value: unknown) => (key === 'message' && typeof value === 'string' ? value.slice(0, 500) : value))) as JobEvent;
      payload = JSON.stringify({ topic, event: cut });
    }
    pool.query('select pg_notify($1, $2)', [EVENTS_CHANNEL, payload]).catch((error: Error) => options.log?.(`job event not sent: ${error.message}`));
  };

  const supervise = async () => {
    if (kinds.size === 0) return;
    const active = await pool.query<{ id: string; name: string }>("select id, name from pgboss.job where state = 'active' and name = any($1) and started_on < now() - interval '3 seconds'", [
      [...kinds],
    ]);
    for (const job of active.rows) {
      if ([...running.values()].some((r) => r.id === job.id)) continue;
      const client = await pool.connect();
      try {
        const free = (await client.query<{ ok: boolean }>('select pg_try_advisory_lock($1, hashtext($2)) as ok', [JOB_LOCK_SPACE, job.id])).rows[0]?.ok;
        if (!free) continue;
        await client.query('select pg_advisory_unlock($1, hashtext($2))', [JOB_LOCK_SPACE, job.id]);
        options.log?.(`job ${job.name} ${job.id}: its worker is gone; handing it to another`);
        await boss.fail(job.name, job.id, { reason: 'the worker running it stopped' });
      } finally {
        client.release();
      }
    }
  };
  const supervisor = setInterval(() => {
    supervise().catch((error: Error) => options.log?.(`job supervisor: ${error.message}`));
  }, options.superviseEveryMs ?? 2_000);
  supervisor.unref();

  function finishedOf<E extends JobEvent>(topic: string): Promise<E> {
    return new Promise((resolveFinal) => {
      const unsubscribe = events.subscribe(topic, (event) => {
        if (!isFinalEvent(event)) return;
        unsubscribe();
        resolveFinal(event as E);
      });
    });
  }

  const queues = new Map<string, Promise<void>>();
  /**
   * Creating a queue alters pg-boss's tables: two instances (or two kinds in one) creating queues at
   * once deadlock in PostgreSQL, so creations take one advisory lock in turn. A failed creation is
   * forgotten, so the next job of that kind tries again instead of failing for the process's life.
   */
  async function createQueue(name: string): Promise<void> {
    const client = await pool.connect();
    try {
      await client.query('select pg_advisory_lock($1, $2)', [QUEUE_CREATION_LOCK_SPACE, 0]);
      try {
        await boss.createQueue(name, { name, policy: 'stately', retryLimit: options.retryLimit ?? 5, retryDelay: 1, expireInSeconds: 60 * 60 });
      } finally {
        await client.query('select pg_advisory_unlock($1, $2)', [QUEUE_CREATION_LOCK_SPACE, 0]);
      }
    } finally {
      client.release();
    }
  }
  /** One created and one active job per key at most (pg-boss's "stately" policy); a retry after 1 s. */
  function ensureQueue(name: string): Promise<void> {
    let ready = queues.get(name);
    if (!ready) {
      ready = createQueue(name);
      ready.catch(() => queues.delete(name));
      queues.set(name, ready);
    }
    return ready;
  }

  async function activeJob(name: string, key: string): Promise<boolean> {
    const found = await pool.query("select 1 from pgboss.job where name = $1 and singleton_key = $2 and state in ('created', 'retry', 'active') limit 1", [name, key]);
    return (found.rowCount ?? 0) > 0;
  }

  return {
    name: 'postgres',
    handle(kind, handler) {
      kinds.add(kind.name);
      const work = async () => {
        await ensureQueue(kind.name);
        for (let i = 0; i < (options.concurrency ?? 1); i++) {
          await boss.work<Envelope>(kind.name, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
            if (!job) return;
            const key = job.data && 'key' in job.data ? String((job.data as { key: unknown }).key) : '';
            const topic = topicOf(kind, key);
            await holder.query('select pg_advisory_lock($1, hashtext($2))', [JOB_LOCK_SPACE, job.id]);
            running.set(job.id, { name: kind.name, id: job.id });
            try {
              await (handler as JobHandler<unknown, JobEvent>)(job.data.payload, { key, publish: (event) => publish(topic, event), signal: stop.signal });
              if (kind.forgetPayloadWhenDone && !stop.signal.aborted) await pool.query("update pgboss.job set data = jsonb_build_object('key', data->'key') where id = $1", [job.id]);
            } catch (cause) {
              options.onError?.(kind.name, key, cause);
              throw cause;
            } finally {
              running.delete(job.id);
              await holder.query('select pg_advisory_unlock($1, hashtext($2))', [JOB_LOCK_SPACE, job.id]).catch(() => undefined);
            }
            // Stopped by a shutdown: failing the job hands it back to the queue for another worker.
            if (stop.signal.aborted) throw new Error('handed back at shutdown');
          });
        }
      };
      work().catch((error: Error) => options.log?.(`job queue: cannot work on ${kind.name}: ${error.message}`));
    },
    async enqueue<P, E extends JobEvent>(kind: JobKind<P, E>, key: string | number, payload: P) {
      if (stop.signal.aborted) throw new Error('the job queue is closed');
      const topic = topicOf(kind, key);
      const finished = finishedOf<E>(topic);
      await ensureQueue(kind.name);
      if (!(await activeJob(kind.name, String(key)))) {
        await boss.send(kind.name, { key: String(key), payload } as object, { singletonKey: String(key) });
      }
      return { finished };
    },
    isActive: (kind, key) => activeJob(kind.name, String(key)),
    latest: (kind, key) => events.latest(topicOf(kind, key)) as never,
    subscribe: (kind, key, listener) => events.subscribe(topicOf(kind, key), listener as (event: JobEvent) => void),
    async check() {
      try {
        await pool.query('select 1 from pgboss.version');
        return { ok: !stop.signal.aborted, ...(stop.signal.aborted ? { message: 'closed' } : {}) };
      } catch (error) {
        return { ok: false, message: error instanceof Error ? error.message : String(error) };
      }
    },
    async close() {
      stop.abort();
      clearInterval(supervisor);
      await boss.stop({ graceful: true, wait: true, timeout: 15_000 });
      await Promise.allSettled([listener.end(), holder.end(), pool.end()]);
    },
  };
}
