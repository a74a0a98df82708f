/**
 * A team deployment in miniature for the multi-process tests (`tests/scale/`): a fresh database on
 * the `api-postgres` project's throwaway cluster, one S3 fake, and server and `parley worker`
 * processes started on them, each with its last log lines kept for a failing step's message. Also
 * the probes those tests share: the server-sent events of a job, which process holds a job's lock,
 * and the engine's own analysis of a trace file to compare the stored one with.
 */
import { createReadStream, mkdtempSync, openAsBlob, readFileSync, rmSync } from 'node:fs';
import { createHash, randomBytes } from 'node:crypto';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import pg from 'pg';
import { expect, inject } from 'vitest';
import { startChildServer, startChildWorker, type ChildProcessHandle, type ChildServer } from '../../bench/support/server-process.ts';
import { JOB_HOLDER_APPLICATION, JOB_LOCK_SPACE } from '../../server/jobs/pg-queue.ts';
import { createTraceSession } from '../../shared/trace/index.ts';
import { startS3Fake, type S3Fake } from './s3-fake.ts';

const SECRET = 'team-deployment-test-secret-0123456789abcdef';

export interface TeamDeployment {
  /** A temporary folder: each process's PARLEY_DATA is a subfolder named after it. */
  folder: string;
  databaseUrl: string;
  /** A connection to the deployment's database, for the tests' own queries. */
  admin: pg.Client;
  fake: S3Fake;
  /** The last 20,000 characters each process wrote, by name. */
  logs: Record<string, string>;
  /** `server/main.ts` as `npm start` runs it; `demo` seeds the demo organisation (the first instance). */
  startServer(name: string, options?: { demo?: boolean; env?: Record<string, string> }): Promise<ChildServer>;
  /** `parley worker`. */
  startWorker(name: string): Promise<ChildProcessHandle>;
  /** Every process started, in order. */
  processes: ChildProcessHandle[];
  /** Stops every process, the S3 fake and the connection; deletes the folder (the cluster drops with the project). */
  stop(): Promise<void>;
}

async function createDatabase(adminUrl: string, prefix: string): Promise<string> {
  const name = `${prefix}_${randomBytes(5).toString('hex')}`;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
  return adminUrl.replace(/\/postgres$/, `/${name}`);
}

/** `prefix` names the database (`<prefix>_<random>`) and the temporary folder. */
export async function startTeamDeployment(prefix: string): Promise<TeamDeployment> {
  const folder = mkdtempSync(join(tmpdir(), `${prefix.replaceAll('_', '-')}-`));
  const databaseUrl = await createDatabase(inject('postgresUrl'), prefix);
  const admin = new pg.Client({ connectionString: databaseUrl });
  await admin.connect();
  const fake = await startS3Fake();
  const logs: Record<string, string> = {};
  const processes: ChildProcessHandle[] = [];
  const environment = (name: string) => ({
    DATABASE_URL: databaseUrl,
    PARLEY_SECRET: SECRET,
    PARLEY_DATA: join(folder, name),
    S3_URL: fake.url,
    S3_BUCKET: fake.bucket,
    ...fake.credentialEnv,
  });
  const keep = <T extends ChildProcessHandle>(name: string, started: T): T => {
    processes.push(started);
    const append = (chunk: Buffer) => (logs[name] = `${logs[name] ?? ''}${chunk.toString()}`.slice(-20_000));
    started.child.stdout!.on('data', append);
    started.child.stderr!.on('data', append);
    return started;
  };
  return {
    folder,
    databaseUrl,
    admin,
    fake,
    logs,
    processes,
    startServer: async (name, options = {}) => keep(name, await startChildServer({ ...environment(name), PARLEY_DEMO: options.demo ? '1' : '0', ...options.env })),
    startWorker: async (name) => keep(name, await startChildWorker(environment(name))),
    async stop() {
      await Promise.all(processes.map((p) => p.stop()));
      await admin.end();
      await fake.stop();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

export interface SseEvent {
  type: string;
  data: Record<string, unknown>;
}

/** Reads a server-sent-events stream, calling `onEvent` for each event, until the stream ends. */
export async function followEvents(url: string, cookie: string, onEvent: (event: SseEvent) => void): Promise<SseEvent[]> {
  const res = await fetch(url, { headers: { cookie, accept: 'text/event-stream' } });
  if (res.status !== 200 || !res.body) throw new Error(`events: ${res.status} ${await res.text()}`);
  const events: SseEvent[] = [];
  const decoder = new TextDecoder();
  let buffered = '';
  for await (const chunk of res.body) {
    buffered += decoder.decode(chunk as Uint8Array, { stream: true });
    let end = buffered.indexOf('\n\n');
    while (end >= 0) {
      const block = buffered.slice(0, end);
      buffered = buffered.slice(end + 2);
      end = buffered.indexOf('\n\n');
      const type = /^event: (.*)$/m.exec(block)?.[1];
      const data = /^data: (.*)$/m.exec(block)?.[1];
      if (!type || !data) continue;
      const event = { type, data: JSON.parse(data) as Record<string, unknown> };
      events.push(event);
      onEvent(event);
    }
  }
  return events;
}

/** Progress events whose bytes read went back below the previous one's: a new attempt started from the top. */
export function restartsIn(events: readonly SseEvent[]): number {
  return events.filter((e, i) => i > 0 && e.type === 'progress' && (e.data.bytesRead as number) < (events[i - 1]!.data.bytesRead as number)).length;
}

/** True for a progress event that reports part of the file read (not none, not all). */
export function isPartWayProgress(event: SseEvent): boolean {
  const { bytesRead, totalBytes } = event.data as { bytesRead?: number; totalBytes?: number };
  return event.type === 'progress' && !!bytesRead && !!totalBytes && bytesRead < totalBytes;
}

/** The pid of the process whose job-lock connection holds a job lock now, if any. */
export async function pidRunningAJob(admin: pg.Client): Promise<number | undefined> {
  const rows = await admin.query<{ application_name: string }>(
    "select a.application_name from pg_locks l join pg_stat_activity a on a.pid = l.pid where l.locktype = 'advisory' and l.classid = $1 and l.granted and a.datname = current_database()",
    [JOB_LOCK_SPACE],
  );
  const name = rows.rows.map((r) => r.application_name).find((n) => n.startsWith(`${JOB_HOLDER_APPLICATION} `));
  return name ? Number(name.slice(JOB_HOLDER_APPLICATION.length + 1)) : undefined;
}

/** The trace-analysis job of a trace, in pg-boss's live and archived tables: one row when it ran once. */
export async function traceAnalysisJobs(admin: pg.Client, traceId: number): Promise<{ state: string; retry_count: number }[]> {
  const jobs = await admin.query<{ state: string; retry_count: number }>(
    "select state, retry_count from pgboss.job where name = 'trace-analysis' and singleton_key = $1 union all select state, retry_count from pgboss.archive where name = 'trace-analysis' and singleton_key = $1",
    [String(traceId)],
  );
  return jobs.rows;
}

export async function until<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** The engine's own analysis of the file, read the way the analysis workers read it. */
export async function referenceCounts(path: string): Promise<{ error: number; warning: number; info: number; findings: number }> {
  const session = createTraceSession({ format: 'auto' });
  for await (const chunk of createReadStream(path, { encoding: 'utf8', highWaterMark: 256 * 1024 })) session.push(chunk as string);
  const result = session.finish();
  if (!result.ok) throw new Error(result.error.message);
  return { ...result.analysis.counts, findings: result.analysis.findings.length };
}

/** Posts a trace file to `POST /api/traces?wait=false`; answers its id and the file's SHA-256 (its key in the bucket). */
export async function uploadTrace(url: string, cookie: string, path: string, title: string, log: () => string): Promise<{ traceId: number; sha256: string }> {
  const sha256 = createHash('sha256').update(readFileSync(path)).digest('hex');
  const form = new FormData();
  form.set('title', title);
  form.set('file', await openAsBlob(path), basename(path));
  const upload = await fetch(`${url}/api/traces?wait=false`, { method: 'POST', headers: { cookie }, body: form });
  if (upload.status !== 201) throw new Error(`upload: ${upload.status} ${await upload.text()}\n${log()}`);
  return { traceId: ((await upload.json()) as { trace: { id: number } }).trace.id, sha256 };
}

/**
 * What a job interrupted half-way and finished by another process must leave behind: one final
 * `done` event after progress went back to the start, the engine's own counts, one trace row, one
 * upload audit entry, one retry of the job, the file and its analysis once each in the bucket and
 * no multipart upload left open.
 */
export async function expectFinishedOnce(
  deployment: TeamDeployment,
  job: { url: string; cookie: string; traceId: number; sha256: string; events: readonly SseEvent[]; reference: ReturnType<typeof referenceCounts> },
): Promise<void> {
  const { admin, fake } = deployment;
  const { url, cookie, traceId, sha256, events } = job;
  const finals = events.filter((e) => e.type !== 'progress');
  expect(finals.map((e) => e.type)).toEqual(['done']);
  expect(restartsIn(events), 'progress went back to the start when another process took the job').toBeGreaterThanOrEqual(1);

  const view = await fetch(`${url}/api/traces/${traceId}`, { headers: { cookie } });
  const { trace } = (await view.json()) as { trace: { status: string; counts: { error: number; warning: number; info: number } } };
  expect(trace.status).toBe('done');
  const expected = await job.reference;
  expect(trace.counts).toEqual({ error: expected.error, warning: expected.warning, info: expected.info });
  expect(finals[0]!.data.counts).toEqual(trace.counts);

  const rows = await admin.query('select id from trace where sha256 = $1', [sha256]);
  expect(rows.rowCount).toBe(1);
  const audit = await admin.query("select 1 from audit_event where action = 'trace.uploaded' and target = $1", [`trace:${sha256.slice(0, 12)}`]);
  expect(audit.rowCount).toBe(1);
  expect(await traceAnalysisJobs(admin, traceId)).toEqual([{ state: 'completed', retry_count: 1 }]);
  expect(fake.objectKeys().filter((key) => key.startsWith(`traces/${sha256}`))).toEqual([`traces/${sha256}`, `traces/${sha256}.analysis`]);
  expect(fake.openUploads()).toEqual([]);
}
