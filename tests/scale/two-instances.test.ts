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
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn } from '../../bench/support/server-process.ts';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';
import { expectFinishedOnce, followEvents, isPartWayProgress, pidRunningAJob, referenceCounts, startTeamDeployment, until, uploadTrace, type TeamDeployment } from '../support/team-deployment.ts';

const TRACE_BYTES = 40 * 1024 * 1024;

let deployment: TeamDeployment;

beforeAll(async () => {
  deployment = await startTeamDeployment('parley_two');
});

afterAll(async () => {
  await deployment?.stop();
});

describe('two instances on one PostgreSQL and one S3 bucket', () => {
  it('an analysis whose instance is SIGKILLed half-way is finished by the other, once, with its progress followed there', { timeout: 300_000 }, async () => {
    const { admin, fake, logs, folder } = deployment;
    const tracePath = join(folder, 'k65-soak.jsonl');
    writeSyntheticTrace(tracePath, TRACE_BYTES);
    const reference = referenceCounts(tracePath);

    // The first instance migrates and seeds; the second joins the same database.
    const first = await deployment.startServer('first', { demo: true });
    const second = await deployment.startServer('second');
    const cookie = await signIn(first.url, 'support@kestrel.example');
    const { traceId, sha256 } = await uploadTrace(first.url, cookie, tracePath, 'Kestrel K65 PPS soak, two-instance test', () => logs.first ?? '');
    const ofThisFile = () => fake.objectKeys().filter((key) => key.startsWith(`traces/${sha256}`));
    expect(ofThisFile()).toEqual([`traces/${sha256}`]);

    // Whichever instance took the job is the one to kill; the other follows and finishes.
    const runnerPid = await until('an instance to take the analysis', () => pidRunningAJob(admin));
    const runner = [first, second].find((s) => s.child.pid === runnerPid)!;
    expect(runner).toBeDefined();
    const survivor = runner === first ? second : first;

    let killedAt: Record<string, unknown> | undefined;
    const events = await followEvents(`${survivor.url}/api/traces/${traceId}/events`, cookie, (event) => {
      if (killedAt || !isPartWayProgress(event)) return;
      killedAt = event.data;
      runner.child.kill('SIGKILL');
    });
    expect(killedAt, 'the survivor saw the analysis half-way before it ended').toBeDefined();
    expect(runner.child.signalCode ?? (await new Promise((r) => runner.child.once('exit', (_code, signal) => r(signal))))).toBe('SIGKILL');

    // One final event, the engine's counts, and nothing done twice.
    await expectFinishedOnce(deployment, { url: survivor.url, cookie, traceId, sha256, events, reference });
    // The survivor's received upload (if it was the first) and its download for the analysis are gone.
    const incoming = join(folder, survivor === first ? 'first' : 'second', 'incoming');
    expect(existsSync(incoming) ? readdirSync(incoming) : []).toEqual([]);
  });
});
