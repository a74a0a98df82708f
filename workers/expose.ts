/**
 * Worker side of src/lib/engine-worker.ts. A worker file is:
 *
 *   import { exposeEngine } from './expose.ts';
 *   import { simulate } from '../shared/sim/index.ts';
 *   const api = { simulate };
 *   exposeEngine(api);
 *   export type SimApi = typeof api;
 *
 * Engine functions return Result values rather than throwing: a thrown error crosses the worker
 * boundary with only its name, message and stack.
 */
import { expose } from 'comlink';

export function exposeEngine<TApi extends object>(api: TApi): TApi {
  expose(api);
  return api;
}
