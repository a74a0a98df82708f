/**
 * Every kind of background job and its handler, registered on the app's queue. A process that
 * registers a kind works on its jobs: every server, and `parley worker`.
 */
import type { AppDeps } from '../context.ts';
import { traceAnalysisHandler, traceAnalysisJob } from '../features/traces/analyse.ts';
import { vectorRunHandler, vectorRunJob } from '../features/runs/job.ts';
import { vectorImportHandler, vectorImportJob } from '../features/vectors/import-job.ts';
import { mailHandler, mailJob } from '../mail/mail-job.ts';
import type { Mailer } from '../mail/mailer.ts';
import { sweepRunHandler, sweepRunJob } from '../features/runs/sweep-job.ts';

export type JobDeps = Pick<AppDeps, 'orm' | 'clock' | 'mailer' | 'publicUrl' | 'logger' | 'jobs' | 'traceStore' | 'analysisPool' | 'runPool'>;

/** `deps.mailer` is the queued mailer (`server/mail/mail-job.ts`); `transport` is what the mail job sends through (SMTP). */
export function registerJobKinds(deps: JobDeps, transport: Mailer): void {
  deps.jobs.handle(mailJob, mailHandler(transport));
  deps.jobs.handle(traceAnalysisJob, traceAnalysisHandler({ fork: () => deps.orm.em.fork(), clock: deps.clock, store: deps.traceStore, pool: deps.analysisPool }));
  deps.jobs.handle(vectorRunJob, vectorRunHandler(deps));
  deps.jobs.handle(vectorImportJob, vectorImportHandler({ fork: () => deps.orm.em.fork(), clock: deps.clock, logger: deps.logger }));
  deps.jobs.handle(sweepRunJob, sweepRunHandler(deps));
}
