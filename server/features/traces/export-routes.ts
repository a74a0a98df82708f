/** Files of one trace: the original upload, the JSON report and the trace as a `trace` vector. */
import { pipeline } from 'node:stream/promises';
import type { TraceFormat } from '../../../shared/trace/index.ts';
import { badRequest, notFound } from '../../errors.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { deviceMap, findTrace, idParams, loadAnalysis } from './lookup.ts';
import { presentTrace } from './present.ts';
import { buildReport } from './report.ts';
import { traceVectorText, vectorIdOf } from './vector.ts';

/** Most records a `trace` vector file may hold. */
const VECTOR_RECORD_LIMIT = 100_000;

export const exportRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/traces/:id/download',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id);
      if (!(await deps.traceStore.has(trace.sha256))) throw notFound('The stored file of this trace is missing', 'trace.file-missing');
      const stream = await deps.traceStore.read(trace.sha256);
      res.attachment(trace.fileName);
      res.type('text/plain; charset=utf-8');
      res.setHeader('Content-Length', String(trace.sizeBytes));
      await pipeline(stream, res);
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/report.json',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id);
      const analysis = await loadAnalysis(deps.traceStore, trace);
      res.attachment(`trace-${trace.id}-report.json`);
      return buildReport(presentTrace(trace, await deviceMap(em)), analysis, `${deps.publicUrl}/traces/${trace.id}`);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/vector',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id);
      const store = deps.traceStore;
      const analysis = await loadAnalysis(store, trace);
      const read = await store.withLocalFile(trace.sha256, (path) => deps.analysisPool.records(path, trace.format as TraceFormat, VECTOR_RECORD_LIMIT));
      if (!read.ok) {
        const code = read.error.code === 'trace.too-many-records' ? 'trace.too-many-records' : 'trace.unreadable';
        throw badRequest(`The trace cannot be kept as a vector: ${read.error.message}`, code, { engineCode: read.error.code });
      }
      const presented = presentTrace(trace, await deviceMap(em));
      res.attachment(`${vectorIdOf(presented).split('/').pop()}.vector.json`);
      res.type('application/json; charset=utf-8');
      res.send(traceVectorText(presented, analysis, read.records));
      return undefined;
    },
  }),
];
