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
import { config as zodConfig } from 'zod/v4/core';

export function exposeEngine<TApi extends object>(api: TApi): TApi {
  // Workers run under the page's CSP, which forbids eval: keep zod from compiling parsers.
  zodConfig({ jitless: true });
  expose(api);
  return api;
}
