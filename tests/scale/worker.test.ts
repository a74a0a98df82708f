/**
 * A team deployment split into a web instance and `parley worker` processes (README, Deployment):
 * the web instance (`server/main.ts` with PARLEY_RUN_JOBS=off) serves HTTP and queues jobs but runs
 * none; `parley worker` (the package's bin) serves no HTTP and runs them. A trace uploaded to the
 * web instance is analysed by the worker, its progress followed over server-sent events on the web
 * instance (PostgreSQL NOTIFY from the worker). The worker is killed with SIGKILL half-way; a
 * second worker, started only then, notices the dead worker's job, runs it again and finishes it.
 * Nothing is lost (the stored analysis equals the engine's own analysis of the file) and nothing is
 * done twice (one trace row, one stored file, one final event, one retry), and the web instance
 * never held a job. Then a worker stopped with SIGTERM half-way hands its analysis back at once
 * (graceful shutdown) and another worker finishes it, again once.
 *
 * Runs in the `api-postgres` project (a throwaway cluster); under CI=true nothing here may skip.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, type ChildProcessHandle, type ChildServer } from '../../bench/support/server-process.ts';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';
import { expectFinishedOnce, followEvents, isPartWayProgress, pidRunningAJob, referenceCounts, startTeamDeployment, until, uploadTrace, type TeamDeployment } from '../support/team-deployment.ts';

const TRACE_BYTES = 40 * 1024 * 1024;

let deployment: TeamDeployment;
/** The web instance and a support engineer's session on it, shared by the tests below. */
let web: ChildServer;
let cookie: string;

beforeAll(async () => {
  deployment = await startTeamDeployment('parley_worker');
  web = await deployment.startServer('web', { demo: true, env: { PARLEY_RUN_JOBS: 'off' } });
  cookie = await signIn(web.url, 'support@kestrel.example');
});

afterAll(async () => {
  await deployment?.stop();
});

describe('a web instance and parley worker processes on one PostgreSQL and one S3 bucket', () => {
  it('the worker analyses what the web instance received; SIGKILLed half-way, a second worker finishes it once', { timeout: 300_000 }, async () => {
    const { admin, fake, logs, folder } = deployment;
    const tracePath = join(folder, 'k65-soak.jsonl');
    writeSyntheticTrace(tracePath, TRACE_BYTES);
    const reference = referenceCounts(tracePath);

    const first = await deployment.startWorker('first-worker');
    const health = await fetch(`${web.url}/api/health`);
    expect(await health.json()).toMatchObject({ ok: true, database: { ok: true }, storage: { ok: true }, queue: { kind: 'postgres', ok: true } });
    expect((await fetch(`${web.url}/api/health/ready`)).status).toBe(200);

    // Every process seen holding a job lock, sampled until the test ends.
    const holders = new Set<number>();
    let sampling = true;
    const sampler = (async () => {
      while (sampling) {
        const pid = await pidRunningAJob(admin);
        if (pid !== undefined) holders.add(pid);
        await new Promise((r) => setTimeout(r, 50));
      }
    })();

    const { traceId, sha256 } = await uploadTrace(web.url, cookie, tracePath, 'Kestrel K65 PPS soak, worker test', () => logs.web ?? '');
    const ofThisFile = () => fake.objectKeys().filter((key) => key.startsWith(`traces/${sha256}`));
    expect(ofThisFile()).toEqual([`traces/${sha256}`]);
    // The web instance runs no jobs, so the worker is the one to take it.
    expect(await until('the worker to take the analysis', () => pidRunningAJob(admin))).toBe(first.child.pid);

    let killedAt: Record<string, unknown> | undefined;
    let second: Promise<ChildProcessHandle> | undefined;
    const events = await followEvents(`${web.url}/api/traces/${traceId}/events`, cookie, (event) => {
      if (killedAt || !isPartWayProgress(event)) return;
      killedAt = event.data;
      first.child.kill('SIGKILL');
      second = deployment.startWorker('second-worker');
    });
    sampling = false;
    await sampler;
    expect(killedAt, 'the web instance relayed the analysis half-way before it ended').toBeDefined();
    expect(first.child.signalCode ?? (await new Promise((r) => first.child.once('exit', (_code, signal) => r(signal))))).toBe('SIGKILL');
    const secondPid = (await second!).child.pid;

    // Locks were held by the two workers only, never by the web instance.
    expect([...holders].sort()).toEqual([first.child.pid, secondPid].sort());

    // One final event, the engine's counts, and nothing done twice.
    await expectFinishedOnce(deployment, { url: web.url, cookie, traceId, sha256, events, reference });
  });

  it('SIGTERM hands the running analysis back: the worker exits at once and another worker finishes it, once', { timeout: 300_000 }, async () => {
    const { admin, logs, folder } = deployment;
    // Another file than the first test's (its title differs), so the upload is not a duplicate.
    const tracePath = join(folder, 'k65-soak-bench-3.jsonl');
    writeSyntheticTrace(tracePath, TRACE_BYTES, 'Kestrel K65 on bench 3, PPS soak');
    const reference = referenceCounts(tracePath);
    // At least one worker is up whatever the first test left running.
    await deployment.startWorker('third-worker');

    const { traceId, sha256 } = await uploadTrace(web.url, cookie, tracePath, 'Kestrel K65 PPS soak, worker shutdown test', () => logs.web ?? '');
    const runnerPid = await until('a worker to take the analysis', () => pidRunningAJob(admin));
    const runner = deployment.processes.find((p) => p.child.pid === runnerPid)!;
    expect(runner, 'a parley worker runs the job, not the web instance').toBeDefined();
    expect(runner).not.toBe(web);

    let stoppedAt: number | undefined;
    let exited: Promise<{ code: number | null; afterMs: number }> | undefined;
    let another: Promise<ChildProcessHandle> | undefined;
    const events = await followEvents(`${web.url}/api/traces/${traceId}/events`, cookie, (event) => {
      if (stoppedAt !== undefined || !isPartWayProgress(event)) return;
      stoppedAt = Date.now();
      exited = new Promise((resolveExit) => runner.child.once('exit', (code) => resolveExit({ code, afterMs: Date.now() - stoppedAt! })));
      runner.child.kill('SIGTERM');
      // Started only now, so the job cannot wait for a worker that is not there.
      another = deployment.startWorker('fourth-worker');
    });
    expect(stoppedAt, 'the web instance relayed the analysis half-way before it ended').toBeDefined();
    // A clean exit well before pg-boss's 15 s stop time-out: the job was handed back, not waited for.
    const { code, afterMs } = await exited!;
    expect(code).toBe(0);
    expect(afterMs).toBeLessThan(15_000);
    await another;

    await expectFinishedOnce(deployment, { url: web.url, cookie, traceId, sha256, events, reference });
  });
});
