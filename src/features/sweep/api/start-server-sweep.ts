import { api } from '../../../lib/api-client.ts';
import type { RunResponse, SweepRunOptions } from '../../../../shared/api/index.ts';

/** `POST /api/runs/sweep`: the campaign runs on the server for the team; the answer is the new run (202). */
export function startServerSweep(scenario: unknown, options: SweepRunOptions): Promise<RunResponse> {
  return api.post<RunResponse>('/runs/sweep', { scenario, kinds: options.kinds, pairs: options.pairs, timerEdges: options.timerEdges });
}
