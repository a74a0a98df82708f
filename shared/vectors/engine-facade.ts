/**
 * The engine as a property vector sees it: `{ fc, engine }`. A plain object of plain objects (no
 * module namespaces, no classes), so the browser's Properties page can build and pass the very same
 * facade inside its Web Worker, and a test can swap one function to plant a bug.
 */
import * as codec from '../pd/index.ts';
import * as rules from '../rules/index.ts';
import * as sim from '../sim/index.ts';
import * as trace from '../trace/index.ts';
import { arbitraries } from './arbitraries.ts';

export const engine = {
  /** Message codec: parseHex, parseWords, toHex, decodeMessage, encodeMessage, PDO/RDO packers. */
  codec: { ...codec },
  /** Capability checks, sink policies, request checks, the rule catalog. */
  rules: { ...rules },
  /** The negotiation simulator: simulate(scenario). */
  sim: { ...sim },
  /** Trace readers and the analyser. */
  trace: { ...trace },
  /** fast-check arbitraries over offers, policies and scenarios (./arbitraries.ts). */
  arbitraries: { ...arbitraries },
};

export type EngineFacade = typeof engine;
