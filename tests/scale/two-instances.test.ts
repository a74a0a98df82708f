/**
 * A team deployment in miniature: two server processes (`server/main.ts`, as `npm start` runs it)
 * on one PostgreSQL database and one S3 fake. A trace uploaded to the first is analysed by
 * whichever instance the queue gives it to, and its progress is followed over server-sent events
 * on the other. The instance running the analysis is killed with SIGKILL half-way; the survivor
 * notices the dead worker's job, runs it again and finishes it. Nothing is lost (the stored
 * analysis equals the engine's own analysis of the file) and nothing is done twice (one trace
 * row, one stored file, one final event, one retry).
 *
 * The trace is a 40 MB synthetic capture, big enough that the analysis takes seconds even on an
 * idle machine; the kill comes on the first progress event that reports part of the file read,
 * and the test checks that the analysis was indeed unfinished when the process died.
 *
 * Runs in the `api-postgres` project (a throwaway cluster); under CI=true nothing here may skip.
 */
import { createReadStream, existsSync, mkdtempSync, openAsBlob, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createHash, randomBytes } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { signIn, startChildServer, type ChildServer } from '../../bench/support/server-process.ts';
import { JOB_HOLDER_APPLICATION, JOB_LOCK_SPACE } from '../../server/jobs/pg-queue.ts';
import { createTraceSession } from '../../shared/trace/index.ts';
import { startS3Fake, type S3Fake } from '../support/s3-fake.ts';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';

const TRACE_BYTES = 40 * 1024 * 1024;
const SECRET = 'two-instance-test-secret-0123456789abcdef';

let folder: string;
let databaseUrl: string;
let admin: pg.Client;
let fake: S3Fake;
const servers: ChildServer[] = [];
/** The last lines each instance logged, shown when a step fails. */
const logs: Record<string, string> = {};

async function createDatabase(adminUrl: string): Promise<string> {
  const name = `parley_two_${randomBytes(5).toString('hex')}`;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
  return adminUrl.replace(/\/postgres$/, `/${name}`);
}

function startInstance(name: string, demo: boolean): Promise<ChildServer> {
  return startChildServer({
    DATABASE_URL: databaseUrl,
    PARLEY_SECRET: SECRET,
    PARLEY_DATA: join(folder, name),
    PARLEY_DEMO: demo ? '1' : '0',
    S3_URL: fake.url,
    S3_BUCKET: fake.bucket,
    ...fake.credentialEnv,
  }).then((server) => {
    servers.push(server);
    server.child.stdout!.on('data', (chunk: Buffer) => (logs[name] = `${logs[name] ?? ''}${chunk.toString()}`.slice(-20_000)));
    server.child.stderr!.on('data', (chunk: Buffer) => (logs[name] = `${logs[name] ?? ''}${chunk.toString()}`.slice(-20_000)));
    return server;
  });
}

interface SseEvent {
  type: string;
  data: Record<string, unknown>;
}

/** Reads a server-sent-events stream, calling `onEvent` for each event, until the stream ends. */
async function followEvents(url: string, cookie: string, onEvent: (event: SseEvent) => void): Promise<SseEvent[]> {
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

/** The pid of the server process whose job-lock connection holds a job lock now, if any. */
async function pidRunningAJob(): Promise<number | undefined> {
  const rows = await admin.query<{ application_name: string }>(
    "select a.application_name from pg_locks l join pg_stat_activity a on a.pid = l.pid where l.locktype = 'advisory' and l.classid = $1 and l.granted and a.datname = current_database()",
    [JOB_LOCK_SPACE],
  );
  const name = rows.rows.map((r) => r.application_name).find((n) => n.startsWith(`${JOB_HOLDER_APPLICATION} `));
  return name ? Number(name.slice(JOB_HOLDER_APPLICATION.length + 1)) : undefined;
}

async function until<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** The engine's own analysis of the file, read the way the analysis workers read it. */
async function referenceCounts(path: string): Promise<{ error: number; warning: number; info: number; findings: number }> {
  const session = createTraceSession({ format: 'auto' });
  for await (const chunk of createReadStream(path, { encoding: 'utf8', highWaterMark: 256 * 1024 })) session.push(chunk as string);
  const result = session.finish();
  if (!result.ok) throw new Error(result.error.message);
  return { ...result.analysis.counts, findings: result.analysis.findings.length };
}

beforeAll(async () => {
  const adminUrl = inject('postgresUrl');
  folder = mkdtempSync(join(tmpdir(), 'parley-two-'));
  databaseUrl = await createDatabase(adminUrl);
  admin = new pg.Client({ connectionString: databaseUrl });
  await admin.connect();
  fake = await startS3Fake();
});

afterAll(async () => {
  await Promise.all(servers.map((s) => s.stop()));
  await admin?.end();
  await fake?.stop();
  rmSync(folder, { recursive: true, force: true });
});

describe('two instances on one PostgreSQL and one S3 bucket', () => {
  it('an analysis whose instance is SIGKILLed half-way is finished by the other, once, with its progress followed there', { timeout: 300_000 }, async () => {
    const tracePath = join(folder, 'k65-soak.jsonl');
    writeSyntheticTrace(tracePath, TRACE_BYTES);
    const reference = referenceCounts(tracePath);

    // The first instance migrates and seeds; the second joins the same database.
    const first = await startInstance('first', true);
    const second = await startInstance('second', false);
    const cookie = await signIn(first.url, 'support@kestrel.example');
    const sha256 = createHash('sha256').update(readFileSync(tracePath)).digest('hex');
    const ofThisFile = () => fake.objectKeys().filter((key) => key.startsWith(`traces/${sha256}`));

    const form = new FormData();
    form.set('title', 'Kestrel K65 PPS soak, two-instance test');
    form.set('file', await openAsBlob(tracePath), 'k65-soak.jsonl');
    const upload = await fetch(`${first.url}/api/traces?wait=false`, { method: 'POST', headers: { cookie }, body: form });
    expect(upload.status, `${await upload.clone().text()}\n${logs.first}`).toBe(201);
    const traceId = ((await upload.json()) as { trace: { id: number } }).trace.id;
    expect(ofThisFile()).toEqual([`traces/${sha256}`]);

    // Whichever instance took the job is the one to kill; the other follows and finishes.
    const runnerPid = await until('an instance to take the analysis', pidRunningAJob);
    const runner = servers.find((s) => s.child.pid === runnerPid)!;
    const survivor = runner === first ? second : first;
    expect(runner).toBeDefined();

    let killedAt: Record<string, unknown> | undefined;
    const stream = followEvents(`${survivor.url}/api/traces/${traceId}/events`, cookie, (event) => {
      const { bytesRead, totalBytes } = event.data as { bytesRead?: number; totalBytes?: number };
      if (killedAt || event.type !== 'progress' || !bytesRead || !totalBytes || bytesRead >= totalBytes) return;
      killedAt = event.data;
      runner.child.kill('SIGKILL');
    });
    const events = await stream;
    expect(killedAt, 'the survivor saw the analysis half-way before it ended').toBeDefined();
    expect(runner.child.signalCode ?? (await new Promise((r) => runner.child.once('exit', (_code, signal) => r(signal))))).toBe('SIGKILL');

    // One final event, after progress from both attempts: the dead one's and the survivor's.
    const finals = events.filter((e) => e.type !== 'progress');
    expect(finals.map((e) => e.type)).toEqual(['done']);
    const restarts = events.filter((e, i) => i > 0 && e.type === 'progress' && (e.data.bytesRead as number) < (events[i - 1]!.data.bytesRead as number));
    expect(restarts.length, 'progress went back to the start once, when the survivor took the job').toBeGreaterThanOrEqual(1);

    const view = await fetch(`${survivor.url}/api/traces/${traceId}`, { headers: { cookie } });
    const { trace } = (await view.json()) as { trace: { status: string; counts: { error: number; warning: number; info: number } } };
    expect(trace.status).toBe('done');
    const expected = await reference;
    expect(trace.counts).toEqual({ error: expected.error, warning: expected.warning, info: expected.info });
    expect(finals[0]!.data.counts).toEqual(trace.counts);

    // Nothing done twice: one row, one stored file, one audit entry, one retry of the job.
    const rows = await admin.query('select id from trace where sha256 = (select sha256 from trace where id = $1)', [traceId]);
    expect(rows.rowCount).toBe(1);
    const audit = await admin.query("select 1 from audit_event where action = 'trace.uploaded'");
    expect(audit.rowCount).toBe(1);
    const jobs = await admin.query<{ state: string; retry_count: number }>(
      "select state, retry_count from pgboss.job where name = 'trace-analysis' and singleton_key = $1 union all select state, retry_count from pgboss.archive where name = 'trace-analysis' and singleton_key = $1",
      [String(traceId)],
    );
    expect(jobs.rows).toEqual([{ state: 'completed', retry_count: 1 }]);
    // The file and its stored analysis, once each.
    expect(ofThisFile()).toEqual([`traces/${sha256}`, `traces/${sha256}.analysis`]);
    expect(fake.openUploads()).toEqual([]);
    // The survivor's received upload (if it was the first) and its download for the analysis are gone.
    const incoming = join(folder, survivor === first ? 'first' : 'second', 'incoming');
    expect(existsSync(incoming) ? readdirSync(incoming) : []).toEqual([]);
  });
});
