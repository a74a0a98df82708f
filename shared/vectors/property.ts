/**
 * Property vectors: TypeScript that exports a default function `({ fc, engine }) => property`,
 * transpiled with sucrase (pure JavaScript, so the same code runs in a browser Web Worker and in
 * Node) and checked with fast-check's `fc.check(property, { numRuns, seed })`. The same code, runs
 * and seed give the same outcome wherever it runs: fast-check's generator is seeded, nothing here
 * reads the clock or `Math.random`.
 *
 * The code sees only its argument: `import` of anything but `fast-check` fails with a clear error.
 * Evaluation uses `new Function`, so a browser page that runs properties needs a CSP allowing
 * 'unsafe-eval' for its worker.
 */
import * as fcModule from 'fast-check';
import { transform } from 'sucrase';
import type { EngineError, Result } from '../core/result.ts';
import { scenarioSchema } from '../sim/scenario.ts';
import type { EngineFacade } from './engine-facade.ts';

export interface PropertyContext {
  fc: typeof fcModule;
  engine: EngineFacade;
}

export interface PropertyOutcome {
  /** True when every run passed. */
  holds: boolean;
  numRuns: number;
  seed: number;
  /** The shrunk counterexample (JSON-safe: typed arrays become plain arrays), when it failed. */
  counterexample?: unknown;
  /** fast-check's printout of the counterexample. */
  counterexampleText?: string;
  numShrinks?: number;
  /** Replays exactly this failure with `fc.check(…, { seed, path })`. */
  path?: string;
  /** Why the last run failed (the assertion's message). */
  failure?: string;
  /** The counterexample as a negotiation vector to save, when it is (or holds) a Scenario. */
  counterexampleScenario?: unknown;
  /** Time spent checking, ms (compiling and running, not waiting for a worker). */
  durationMs?: number;
  /** The code did not compile or did not give a property: not a verdict on the engine. */
  error?: EngineError;
}

type Factory = (context: PropertyContext) => unknown;

/** Transpiles and evaluates the module, returning its default export. */
export function compileProperty(code: string): Result<{ factory: Factory }> {
  let js: string;
  try {
    js = transform(code, { transforms: ['typescript', 'imports'], production: true }).code;
  } catch (error) {
    return { ok: false, error: { code: 'property.syntax', message: `the property code does not compile: ${messageOf(error)}` } };
  }
  const module: { exports: Record<string, unknown> } = { exports: {} };
  const require = (name: string): unknown => {
    if (name === 'fast-check') return fcModule;
    throw new Error(`import of "${name}" is not available in a property; use the { fc, engine } argument`);
  };
  try {
    // The property code is the user's own test, run in the user's own process or browser worker.
    const evaluate = new Function('exports', 'require', 'module', js) as (e: unknown, r: unknown, m: unknown) => void;
    evaluate(module.exports, require, module);
  } catch (error) {
    return { ok: false, error: { code: 'property.load', message: `the property code failed while loading: ${messageOf(error)}` } };
  }
  const factory = module.exports.default ?? module.exports;
  if (typeof factory !== 'function') {
    return { ok: false, error: { code: 'property.export', message: 'the property code must export a default function ({ fc, engine }) => property' } };
  }
  return { ok: true, factory: factory as Factory };
}

function messageOf(error: unknown): string {
  if (error instanceof Error) return error.message.split('\n')[0] ?? error.message;
  return String(error);
}

/** Typed arrays and other non-JSON values become JSON-safe (for the worker boundary and the UI). */
export function toJsonSafe(value: unknown): unknown {
  return JSON.parse(
    JSON.stringify(value, (_key, v: unknown) => {
      if (v instanceof Uint8Array) return Array.from(v);
      if (typeof v === 'bigint') return v.toString();
      if (typeof v === 'function' || typeof v === 'symbol') return undefined;
      return v;
    }) ?? 'null',
  );
}

function findScenario(counterexample: unknown): unknown {
  const candidates = Array.isArray(counterexample) ? counterexample : [counterexample];
  for (const candidate of candidates) {
    const parsed = scenarioSchema.safeParse(candidate);
    if (parsed.success) return candidate;
  }
  return undefined;
}

function isProperty(value: unknown): value is fcModule.IRawProperty<unknown[]> {
  return typeof value === 'object' && value !== null && typeof (value as { run?: unknown }).run === 'function' && typeof (value as { generate?: unknown }).generate === 'function';
}

/** Runs a property vector's code with the given runs and seed. Never throws. */
export async function checkProperty(code: string, options: { runs: number; seed: number }, engine: EngineFacade): Promise<PropertyOutcome> {
  const started = performance.now();
  const outcome = await check(code, options, engine);
  return { ...outcome, durationMs: performance.now() - started };
}

async function check(code: string, options: { runs: number; seed: number }, engine: EngineFacade): Promise<PropertyOutcome> {
  const { runs, seed } = options;
  const compiled = compileProperty(code);
  if (!compiled.ok) return { holds: false, numRuns: 0, seed, error: compiled.error };
  let property: unknown;
  try {
    property = compiled.factory({ fc: fcModule, engine });
  } catch (error) {
    return { holds: false, numRuns: 0, seed, error: { code: 'property.build', message: `the property function threw: ${messageOf(error)}` } };
  }
  if (!isProperty(property)) {
    return { holds: false, numRuns: 0, seed, error: { code: 'property.export', message: 'the default function must return a fast-check property (fc.property or fc.asyncProperty)' } };
  }
  try {
    const details = await fcModule.check(property, { numRuns: runs, seed });
    if (!details.failed) return { holds: true, numRuns: details.numRuns, seed };
    const counterexample = details.counterexample === null ? undefined : toJsonSafe(details.counterexample);
    const outcome: PropertyOutcome = {
      holds: false,
      numRuns: details.numRuns,
      seed,
      counterexample,
      counterexampleText: details.counterexample === null ? undefined : fcModule.stringify(details.counterexample),
      numShrinks: details.numShrinks,
      path: details.counterexamplePath ?? undefined,
      failure: details.errorInstance === null ? (details.interrupted ? 'interrupted' : 'too many skipped runs') : messageOf(details.errorInstance),
    };
    const scenario = findScenario(counterexample);
    if (scenario !== undefined) outcome.counterexampleScenario = scenario;
    return outcome;
  } catch (error) {
    return { holds: false, numRuns: 0, seed, error: { code: 'property.run', message: `the property could not be checked: ${messageOf(error)}` } };
  }
}
