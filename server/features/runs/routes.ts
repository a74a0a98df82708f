import express, { type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { MAX_REPORT_BYTES, MAX_SERVER_SWEEP_RUNS, roleGroups, type Run, type RunResult as PresentedResult, type SweepRunOptions } from '../../../shared/api/index.ts';
import { parseScenario } from '../../../shared/sim/index.ts';
import { DEFAULT_FAULT_KINDS, planSweep, SWEEP_FAULT_KINDS } from '../../../shared/sweep/index.ts';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { RunResult, TeamVector, TestRun, type IRunResult, type ITestRun } from '../../db/library-entities.ts';
import { badRequest, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { VECTOR_ID_PATTERN } from '../../../shared/vectors/index.ts';
import { tokenOf } from '../tokens/verify.ts';
import { describeFilter, matchingVectorIds, vectorFilterSchema } from '../vectors/query.ts';
import { finishRun, runEvent, vectorRunJob } from './job.ts';
import { SWEEP_INVARIANTS, sweepRunJob } from './sweep-job.ts';
import { streamJobEvents } from '../../jobs/sse.ts';
import { buildName, LIBRARY_PROJECT, projectName } from './project.ts';
import { readJsonReport, readReportText, type ReportRead } from './report.ts';
import { zodMessage } from '../../../shared/core/zod-message.ts';
import { fail } from '../../../shared/core/result.ts';

/** api.md: engineers and QA run vectors (CI posts with a token, which acts with the qa role). */
const runStarters = roleGroups.editors;

const runIdParams = z.object({ id: z.coerce.number().int().positive() });

const startBody = z
  .object({
    ids: z.array(z.string().regex(VECTOR_ID_PATTERN, 'must be vector ids')).min(1, 'select at least one vector').max(10_000).optional(),
    filter: vectorFilterSchema.optional(),
    all: z.literal(true, { error: 'all must be true when given' }).optional(),
    project: projectName.default(LIBRARY_PROJECT),
    build: buildName.optional(),
    /** Answer when the run is done, with its results (for "Run this vector"). */
    wait: z.boolean().default(false),
  })
  .strict()
  .refine((b) => [b.ids, b.filter, b.all].filter((x) => x !== undefined).length === 1, { message: 'give exactly one of ids, filter or all: true', path: ['ids'] });

/** A fault sweep for the team: the scenario (vector.md) and the campaign's options, as `parley sweep` takes them. */
const sweepBody = z
  .object({
    scenario: z.unknown().refine((v) => v !== undefined, 'give the scenario to sweep (vector.md, Scenario)'),
    kinds: z
      .array(z.enum(SWEEP_FAULT_KINDS))
      .min(1, 'choose at least one fault kind')
      .max(SWEEP_FAULT_KINDS.length)
      .refine((kinds) => new Set(kinds).size === kinds.length, 'name each fault kind once')
      .optional(),
    pairs: z.boolean().default(false),
    timerEdges: z.boolean().default(false),
    max: z.number().int().min(1).max(MAX_SERVER_SWEEP_RUNS).optional(),
    seed: z.number().int().min(0).max(0xffff_ffff).optional(),
    project: projectName.default(LIBRARY_PROJECT),
    build: buildName.optional(),
    wait: z.boolean().default(false),
  })
  .strict();

function describeSweep(options: SweepRunOptions): string {
  const extras = [options.pairs ? 'pairs' : undefined, options.timerEdges ? 'timer edges' : undefined, options.max !== undefined ? `at most ${options.max} runs` : undefined].filter(Boolean);
  return `fault sweep: ${options.kinds.join(', ')}${extras.length > 0 ? `; ${extras.join(', ')}` : ''}`;
}

const listQuery = z.object({
  project: projectName.optional(),
  source: z.enum(['ui', 'ci']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

const ciFields = z.object({ project: projectName.optional(), build: buildName.optional() });

/** A new run's row: running from now, nothing counted yet. */
function createRunRow(
  em: EntityManager,
  createdAt: Date,
  fields: Pick<ITestRun, 'kind' | 'project' | 'build' | 'source' | 'selection' | 'total' | 'startedById' | 'startedByName' | 'tokenId'> & { sweep?: ITestRun['sweep'] },
) {
  return em.create(TestRun, { ...fields, status: 'running', done: 0, passed: 0, failed: 0, newFailures: 0, errorMessage: null, createdAt, finishedAt: null });
}

export function presentRun(run: ITestRun): Run {
  return {
    id: run.id,
    kind: run.kind,
    project: run.project,
    build: run.build ?? null,
    source: run.source,
    status: run.status,
    selection: run.selection,
    total: run.total,
    done: run.done,
    passed: run.passed,
    failed: run.failed,
    newFailures: run.newFailures,
    startedBy: run.startedByName,
    error: run.errorMessage ?? null,
    createdAt: run.createdAt.toISOString(),
    finishedAt: run.finishedAt?.toISOString() ?? null,
    ...(run.kind === 'sweep' && run.sweep ? { sweep: run.sweep } : {}),
  };
}

function presentResult(result: IRunResult): Omit<PresentedResult, 'inLibrary'> {
  return {
    id: result.id,
    vectorId: result.vectorId,
    title: result.title ?? null,
    kind: result.kind ?? null,
    revision: result.vectorRevision ?? null,
    ok: result.ok,
    message: result.message ?? null,
    durationMs: result.durationMs,
    newFailure: result.newFailure,
    ...(result.ok ? {} : { expected: result.detail?.expected, actual: result.detail?.actual, mismatches: result.detail?.mismatches, counterexampleVector: result.detail?.counterexampleVector }),
  };
}

async function findRun(em: EntityManager, id: number): Promise<ITestRun> {
  const run = await em.findOne(TestRun, { id });
  if (!run) throw notFound('No such run', 'run.not-found');
  return run;
}

/** Those of `ids` that are in the library, in id order, read as plain rows. */
async function libraryIdsAmong(em: EntityManager, ids: readonly string[]): Promise<string[]> {
  const rows = await em
    .createQueryBuilder(TeamVector)
    .select('vectorId')
    .where({ vectorId: { $in: [...new Set(ids)] } })
    .orderBy({ vectorId: 'asc' })
    .execute('all');
  return rows.map((r) => r.vectorId);
}

async function runWithResults(em: EntityManager, run: ITestRun) {
  const results = await em.find(RunResult, { runId: run.id }, { orderBy: [{ ok: 'asc' }, { vectorId: 'asc' }] });
  // Library vectors still in the library can be opened; CI ids may name vectors kept elsewhere.
  const known = new Set((await em.find(TeamVector, { vectorId: { $in: results.map((r) => r.vectorId) } }, { fields: ['vectorId'] })).map((v) => v.vectorId));
  return { run: presentRun(run), results: results.map((r) => ({ ...presentResult(r), inLibrary: known.has(r.vectorId) })) };
}

/** CI posts multipart (field `file` plus `project`, `build`), raw `application/xml`, or JSON. */
function reportUpload(): RequestHandler[] {
  const multipart = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: MAX_REPORT_BYTES, files: 1, fields: 10, fieldSize: 8 * 1024 } }).single('file');
  const xml = express.text({ type: ['application/xml', 'text/xml', 'application/junit+xml'], limit: MAX_REPORT_BYTES });
  return [xml, multipart];
}

function readPosted(req: express.Request): ReportRead {
  if (req.file) return readReportText(req.file.buffer.toString('utf8'));
  if (typeof req.body === 'string') return readReportText(req.body);
  if (req.body && typeof req.body === 'object' && 'results' in req.body) return readJsonReport(req.body);
  return fail('run.bad-report', 'file: post a JUnit XML file (multipart field "file", or the body as application/xml) or a parley run --json result');
}

export const runsRoutes: RouteDef[] = [
  route({
    method: 'post',
    path: '/api/runs/start',
    access: runStarters,
    body: startBody,
    async handler(ctx) {
      const { em, body, res, deps } = ctx;
      const me = currentUser(ctx);
      // Ids only, as plain rows: the job reads each batch's texts as it goes, and no entity is
      // loaded for the flush below to walk (5,000 of them held the request thread for 0.2 s).
      const vectorIds = body.ids ? await libraryIdsAmong(em, body.ids) : await matchingVectorIds(em, body.all ? {} : (body.filter ?? {}));
      if (body.ids) {
        const found = new Set(vectorIds);
        const missing = body.ids.filter((id) => !found.has(id));
        if (missing.length > 0) throw badRequest(`ids: not in the library: ${missing.slice(0, 5).join(', ')}${missing.length > 5 ? ` and ${missing.length - 5} more` : ''}`, 'input.invalid');
      }
      if (vectorIds.length === 0) throw badRequest('filter: no vector in the library matches; nothing to run', 'run.nothing');
      const selection = body.all ? 'all' : body.ids ? (body.ids.length === 1 ? body.ids[0]! : `${body.ids.length} selected`) : describeFilter(body.filter ?? {});
      const run = createRunRow(em, deps.clock.now(), {
        kind: 'vectors',
        project: body.project,
        build: body.build ?? null,
        source: 'ui',
        selection,
        total: vectorIds.length,
        startedById: me.id,
        startedByName: me.name,
        tokenId: null,
      });
      await em.flush();
      const job = await deps.jobs.enqueue(vectorRunJob, run.id, { runId: run.id, vectorIds });
      if (body.wait) {
        await job.finished;
        res.status(201);
        return runWithResults(em.fork(), await findRun(em.fork(), run.id));
      }
      res.status(202);
      return { run: presentRun(run) };
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/sweep',
    access: runStarters,
    body: sweepBody,
    async handler(ctx) {
      const { em, body, res, deps } = ctx;
      const me = currentUser(ctx);
      const parsed = parseScenario(body.scenario);
      if (!parsed.ok) throw badRequest(`scenario: ${parsed.error.message}`, 'input.invalid');
      const options: SweepRunOptions = { kinds: body.kinds ?? [...DEFAULT_FAULT_KINDS], pairs: body.pairs, timerEdges: body.timerEdges };
      if (body.max !== undefined) options.max = body.max;
      if (body.seed !== undefined) options.seed = body.seed;
      // The plan runs the scenario once, fault-free: its messages give the campaign's size, which is
      // checked before any placement is built (a sampled campaign may draw from at most five times the limit).
      const limit = body.max === undefined ? MAX_SERVER_SWEEP_RUNS : 5 * MAX_SERVER_SWEEP_RUNS;
      const planned = planSweep(parsed.scenario, { ...options, maxPlacements: limit });
      if (!planned.ok && planned.error.code === 'sweep.too-many-runs')
        throw badRequest(
          `${body.max === undefined ? 'max' : 'pairs'}: ${planned.error.message.replace(/: drop pairs.*$/, '')}; the server runs at most ${MAX_SERVER_SWEEP_RUNS.toLocaleString('en-US')} a sweep${body.max === undefined ? ' (set max to sample that many with the seed)' : ''}, or split it in CI with parley sweep --shard`,
          'sweep.too-many-runs',
        );
      if (!planned.ok) throw badRequest(`scenario: ${planned.error.message}`, 'sweep.unplannable');
      const runs = planned.plan.campaignRuns;
      const run = createRunRow(em, deps.clock.now(), {
        kind: 'sweep',
        project: body.project,
        build: body.build ?? null,
        source: 'ui',
        selection: describeSweep(options),
        total: runs,
        startedById: me.id,
        startedByName: me.name,
        tokenId: null,
        sweep: { scenario: body.scenario, options, messages: planned.plan.messages.length, outcomes: [], invariants: SWEEP_INVARIANTS, broken: 0 },
      });
      await em.flush();
      const job = await deps.jobs.enqueue(sweepRunJob, run.id, { runId: run.id, scenario: body.scenario, options });
      if (body.wait) {
        await job.finished;
        res.status(201);
        return runWithResults(em.fork(), await findRun(em.fork(), run.id));
      }
      res.status(202);
      return { run: presentRun(run) };
    },
  }),
  route({
    method: 'post',
    path: '/api/runs',
    access: runStarters,
    middleware: reportUpload,
    query: ciFields,
    async handler(ctx) {
      const { req, em, query, res, deps } = ctx;
      const me = currentUser(ctx);
      const token = tokenOf(req);
      const fields = ciFields.safeParse({
        project: query.project ?? (typeof req.body === 'object' && req.body ? (req.body as Record<string, unknown>).project : undefined),
        build: query.build ?? (typeof req.body === 'object' && req.body ? (req.body as Record<string, unknown>).build : undefined),
      });
      if (!fields.success) {
        throw badRequest(zodMessage(fields.error, { where: 'body', limit: 1 }), 'input.invalid');
      }
      const { build } = fields.data;
      let project = fields.data.project;
      if (token) {
        if (project !== undefined && project !== token.project) throw badRequest(`project: this token posts to "${token.project}", not "${project}"`, 'input.invalid');
        project = token.project;
      }
      if (project === undefined) throw badRequest('project: say which project these results belong to', 'input.invalid');
      const report = readPosted(req);
      if (!report.ok) throw badRequest(report.error.message, 'run.bad-report');

      // A vector id reported twice counts once: the last report of it wins.
      const results = [...new Map(report.results.map((r) => [r.id, r])).values()];
      const titles = new Map((await em.find(TeamVector, { vectorId: { $in: results.map((r) => r.id) } }, { fields: ['vectorId', 'title', 'kind'] })).map((v) => [v.vectorId, v]));
      const now = deps.clock.now();
      const run = createRunRow(em, now, {
        kind: 'vectors',
        project,
        build: build ?? null,
        source: 'ci',
        selection: `${report.format === 'junit' ? 'JUnit' : 'parley run --json'} report`,
        total: results.length,
        startedById: token ? null : me.id,
        startedByName: token ? `token "${token.name}"` : me.name,
        tokenId: token?.id ?? null,
      });
      await em.flush();
      for (const r of results) {
        const known = titles.get(r.id);
        em.create(RunResult, {
          runId: run.id,
          vectorId: r.id.slice(0, 300),
          title: known?.title ?? null,
          kind: known?.kind ?? null,
          vectorRevision: null,
          ok: r.ok,
          message: r.ok ? null : (r.message ?? 'failed').slice(0, 20_000),
          durationMs: r.durationMs,
          newFailure: false,
          detail: null,
          createdAt: now,
        });
      }
      await em.flush();
      const finished = await finishRun(em.fork(), deps, run.id);
      res.status(201);
      return { run: presentRun(finished) };
    },
  }),
  route({
    method: 'get',
    path: '/api/runs',
    access: 'signed-in',
    query: listQuery,
    async handler({ em, query }) {
      const where = { ...(query.project ? { project: query.project } : {}), ...(query.source ? { source: query.source } : {}) };
      const [runs, total] = await em.findAndCount(TestRun, where, { orderBy: { id: 'desc' }, limit: query.pageSize, offset: (query.page - 1) * query.pageSize });
      const projects = await em.getConnection().execute<{ project: string }[]>('select distinct project from test_run order by project');
      return { items: runs.map(presentRun), total, page: query.page, pageSize: query.pageSize, projects: projects.map((p) => String(p.project)) };
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id',
    access: 'signed-in',
    params: runIdParams,
    async handler({ em, params }) {
      return runWithResults(em, await findRun(em, params.id));
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/events',
    access: 'signed-in',
    params: runIdParams,
    async handler({ em, params, req, res, deps }) {
      const run = await findRun(em, params.id);
      await streamJobEvents(req, res, deps.jobs, run.kind === 'sweep' ? sweepRunJob : vectorRunJob, run.id, {
        heartbeat: 'still running',
        snapshot: async () => runEvent(await findRun(em.fork(), run.id)),
      });
      return undefined;
    },
  }),
];
