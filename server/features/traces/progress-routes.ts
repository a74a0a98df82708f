/** The analysis progress of one trace as server-sent events, ending with the outcome (server/jobs). */
import { Trace } from '../../db/trace-entities.ts';
import { streamJobEvents } from '../../jobs/sse.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { traceAnalysisJob, traceEvent } from './analyse.ts';
import { findTrace, idParams } from './lookup.ts';

export const progressRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/traces/:id/events',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, req, res, deps }) {
      const trace = await findTrace(em, params.id);
      await streamJobEvents(req, res, deps.jobs, traceAnalysisJob, trace.id, {
        heartbeat: 'still analysing',
        snapshot: async () => traceEvent(await em.fork().findOne(Trace, { id: trace.id })),
      });
      return undefined;
    },
  }),
];
