/**
 * Reading one trace. The trace page reads the summary, pages of findings and contracts and windows
 * of the timeline, each costing what it shows; `GET /api/traces/:id` (api.md) still answers the
 * whole stored analysis, sent as stored. GETs never start work (start-up resumes unfinished analyses).
 */
import { z } from 'zod';
import type { Finding } from '../../../shared/core/finding.ts';
import type { Analysis } from '../../../shared/trace/index.ts';
import type { ITrace } from '../../db/trace-entities.ts';
import { badRequest } from '../../errors.ts';
import { route, type KeepContext, type RouteDef } from '../../route-def.ts';
import { deviceMap, idParams, readTrace } from './lookup.ts';
import { presentTrace } from './present.ts';
import { traceAnalysisJob } from './analyse.ts';
import { sendWithStoredAnalysis } from './send-analysis.ts';
import type { AppDeps } from '../../context.ts';
import { answerVersion, traceAnalysisState } from '../../db/answer-version.ts';
import { analysisSummary, itemPage, messageRange, messagesAroundFindings, timelineWindow } from './views.ts';

const pageQuery = (maxPageSize: number, defaultPageSize: number) =>
  z.object({
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(maxPageSize).default(defaultPageSize),
  });

const findingsQuery = pageQuery(500, 100).extend({ severity: z.enum(['error', 'warning', 'info']).optional() });
const contractsQuery = pageQuery(500, 100);

const microseconds = z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER);
const windowQuery = z.object({
  startUs: microseconds.optional(),
  endUs: microseconds.optional(),
  points: z.coerce.number().int().min(10).max(10_000).default(1_000),
  limit: z.coerce.number().int().min(1).max(5_000).default(1_000),
});

const messagesQuery = z.object({
  offset: z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER).optional(),
  atUs: microseconds.optional(),
  limit: z.coerce.number().int().min(1).max(1_000).default(200),
  fold: z.enum(['goodcrc']).optional(),
});

function progressOf(deps: AppDeps, trace: ITrace) {
  const progress = trace.status === 'queued' || trace.status === 'analysing' ? deps.jobs.latest(traceAnalysisJob, trace.id) : undefined;
  return progress?.type === 'progress' ? { bytesRead: progress.bytesRead, totalBytes: progress.totalBytes } : null;
}

/**
 * The key of an answer read from a stored analysis alone (findings, contracts, timeline windows),
 * which never changes once stored: a new analysis has a new `analysedAt`. Nothing kept before then.
 */
async function analysedTraceKey<Q>({ em, params, query }: KeepContext<Q, { id: number }>): Promise<string | null> {
  const state = await traceAnalysisState(em, params.id);
  return state?.done && state.analysedAtMs !== null ? `${params.id} ${state.analysedAtMs} ${JSON.stringify(query)}` : null;
}

export const viewRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/traces/:id',
    access: 'signed-in',
    params: idParams,
    async handler({ req, res, em, params, deps }) {
      const trace = await readTrace(em, params.id);
      const fields = { trace: presentTrace(trace, await deviceMap(em)), progress: progressOf(deps, trace) };
      return sendWithStoredAnalysis(req, res, fields, trace.status === 'done' ? await deps.traceStore.readAnalysis(trace.sha256) : null);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/summary',
    access: 'signed-in',
    params: idParams,
    // Kept once analysed (no progress left to show): the trace row and device names raise the answer version.
    keep: async ({ em, params }) => ((await traceAnalysisState(em, params.id))?.done ? `${await answerVersion(em)} ${params.id}` : null),
    async handler({ em, params, deps }) {
      const trace = await readTrace(em, params.id);
      return {
        trace: presentTrace(trace, await deviceMap(em)),
        analysis: trace.status === 'done' ? await analysisSummary(em, trace.id) : null,
        progress: progressOf(deps, trace),
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/findings',
    access: 'signed-in',
    params: idParams,
    query: findingsQuery,
    keep: analysedTraceKey,
    async handler({ em, params, query }) {
      await readTrace(em, params.id);
      return itemPage<Finding>(em, params.id, 'finding', query);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/contracts',
    access: 'signed-in',
    params: idParams,
    query: contractsQuery,
    keep: analysedTraceKey,
    async handler({ em, params, query }) {
      await readTrace(em, params.id);
      return itemPage<Analysis['contracts'][number]>(em, params.id, 'contract', query);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/timeline',
    access: 'signed-in',
    params: idParams,
    query: windowQuery,
    keep: analysedTraceKey,
    async handler({ em, params, query }) {
      const trace = await readTrace(em, params.id);
      if (query.startUs !== undefined && query.endUs !== undefined && query.endUs < query.startUs) throw badRequest('endUs: must not be before startUs', 'input.invalid');
      const summary = trace.status === 'done' ? await analysisSummary(em, trace.id) : null;
      const startUs = query.startUs ?? 0;
      const endUs = query.endUs ?? summary?.endUs ?? 1;
      if (endUs < startUs) throw badRequest('endUs: must not be before startUs', 'input.invalid');
      return timelineWindow(em, trace.id, { startUs, endUs, points: query.points, limit: query.limit });
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/messages',
    access: 'signed-in',
    params: idParams,
    query: messagesQuery,
    async handler({ em, params, query }) {
      const trace = await readTrace(em, params.id);
      const summary = trace.status === 'done' ? await analysisSummary(em, trace.id) : null;
      if (!summary) return { offset: 0, total: 0, items: [], capabilities: null };
      return messageRange(em, trace.id, summary.timeline.messages, { ...query, fold: query.fold === 'goodcrc' });
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/messages-around-findings',
    access: 'signed-in',
    params: idParams,
    keep: analysedTraceKey,
    async handler({ em, params }) {
      const trace = await readTrace(em, params.id);
      if (trace.status !== 'done') return { items: [] };
      // The report's first timed findings are among the first listed ones (a page of the largest size).
      const findings = await itemPage<Finding>(em, trace.id, 'finding', { page: 1, pageSize: 500 });
      return messagesAroundFindings(em, trace.id, findings.items);
    },
  }),
];
