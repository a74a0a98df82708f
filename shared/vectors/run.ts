/**
 * The vector runner: one function for every kind of vector.md. Pure: a trace vector's `file` is
 * read through the injected `readFile`, and property vectors go through the injected
 * `checkProperty` (the CLI passes a worker-thread pool; the default runs them here).
 *
 * What each kind compares (partial matching, ./match.ts):
 * - decode: `{ message, error, findings }` — the decoded Message, the error code when decoding
 *   failed, and the decoder's warnings as findings;
 * - encode: `{ hex }` — lower-case hex without separators (the expected hex is normalised too);
 * - caps: `{ pdpW, pdpInferred, objects, findings }` as `parley caps` prints them;
 * - request: `{ request: { hex, rdo, objectPosition, capabilityMismatch, contract }, findings }`;
 * - negotiation: `contract` (partial or null), `sequence` (in-order subsequence of message type
 *   names; Hard_Reset / Cable_Reset events count as names too), `findings`, `contractWithinMs`
 *   (the time of the first contract, the sink's PS_RDY, in ms from the start);
 * - trace: `{ messages, contracts, findings }` of the analysis;
 * - property: `{ holds }`;
 * - negotiation `invariants`: the named fault-sweep invariants hold for the run (./run-sweep.ts);
 * - sweep: `{ holds, minRuns }` of a whole fault campaign.
 */
import type { Finding } from '../core/finding.ts';
import type { Result } from '../core/result.ts';
import type { Message, SourcePdo } from '../pd/types.ts';
import { engine as defaultEngine, type EngineFacade } from './engine-facade.ts';
import { describeMismatches, matchFindings, matchPartial, matchSequence, matchWithin, type Mismatch } from './match.ts';
import { checkProperty as checkPropertyInline, type PropertyOutcome } from './property.ts';
import { invariantMismatches, runSweepVector } from './run-sweep.ts';
import { describeZodError, vectorSchema, type Vector } from './schema.ts';

export interface VectorResult {
  id: string;
  ok: boolean;
  /** Why it failed: the first mismatch with its path, or the input error. */
  message?: string;
  durationMs: number;
  /** The vector's `expect`. */
  expected?: unknown;
  /** The actual output, in the shape `expect` is matched against. */
  actual?: unknown;
  /** Every mismatch, for the UI. */
  mismatches?: Mismatch[];
  /** For property vectors: the full outcome (counterexample, shrinks, replay path). */
  property?: PropertyOutcome;
  /** A negotiation vector built from a property's counterexample, ready to save. */
  counterexampleVector?: Record<string, unknown>;
}

export interface RunOptions {
  /** Reads a trace `file` (the path as written in the vector, relative to the vector file). */
  readFile?: (path: string) => Promise<string>;
  /** Checks a property vector; default: in this thread with `engine`. */
  checkProperty?: (code: string, options: { runs: number; seed: number }) => Promise<PropertyOutcome>;
  /** The engine a property sees; default the real one. */
  engine?: EngineFacade;
  /** A clock for `durationMs` (ms, monotonic); default `performance.now`. */
  now?: () => number;
}

interface Outcome {
  actual: unknown;
  mismatches: Mismatch[];
  /** An input error (bad hex in the vector, unreadable file): the vector fails with this. */
  inputError?: string;
  property?: PropertyOutcome;
}

/** Parses and validates a vector file's text. */
export function parseVector(text: string): Result<{ vector: Vector }> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { ok: false, error: { code: 'vector.json', message: `not valid JSON: ${error instanceof Error ? error.message : String(error)}` } };
  }
  const parsed = vectorSchema.safeParse(json);
  if (!parsed.success) return { ok: false, error: { code: 'vector.schema', message: describeZodError(parsed.error) } };
  return { ok: true, vector: parsed.data };
}

function normaliseHex(text: string): string {
  return text
    .replace(/0x/gi, '')
    .replace(/[\s:,_]/g, '')
    .toLowerCase();
}

function pdosFrom(engine: EngineFacade, input: { hex?: string; caps?: string; pdos?: string[] }): { pdos: SourcePdo[]; warnings: Finding[]; message?: Message } | { error: string } {
  if (input.pdos !== undefined) {
    return { pdos: input.pdos.map((text) => engine.codec.decodeSourcePdo(Number.parseInt(normaliseHex(text), 16) >>> 0)) as SourcePdo[], warnings: [] };
  }
  const hex = input.hex ?? input.caps ?? '';
  const bytes = engine.codec.parseHex(hex);
  if (!bytes.ok) return { error: `input caps: ${bytes.error.message}` };
  const decoded = engine.codec.decodeMessage(bytes.bytes);
  if (!decoded.ok) return { error: `input caps: ${decoded.error.message}` };
  return { pdos: decoded.message.objects as SourcePdo[], warnings: decoded.warnings, message: decoded.message };
}

function runDecode(vector: Extract<Vector, { kind: 'decode' }>, engine: EngineFacade): Outcome {
  const { input, expect } = vector;
  let caps: SourcePdo[] | undefined;
  if (input.caps !== undefined) {
    const offers = pdosFrom(engine, { caps: input.caps });
    if ('error' in offers) return { actual: undefined, mismatches: [], inputError: offers.error };
    caps = offers.pdos;
  }
  const bytes = input.words ? engine.codec.parseWords(input.hex.trim().split(/[\s,]+/)) : engine.codec.parseHex(input.hex);
  const decoded = bytes.ok ? engine.codec.decodeMessage(bytes.bytes, { sop: input.sop, caps, crc: input.crc }) : bytes;
  const mismatches: Mismatch[] = [];
  if (!decoded.ok) {
    const actual = { error: decoded.error.code, errorMessage: decoded.error.message };
    if (expect.error === undefined)
      mismatches.push({ path: 'expect.message', expected: expect.message, actual, message: `expect.message: expected a decoded message, got error ${decoded.error.code}: ${decoded.error.message}` });
    else matchPartial(expect.error, decoded.error.code, 'expect.error', mismatches);
    return { actual, mismatches };
  }
  const actual = { message: decoded.message, findings: decoded.warnings };
  if (expect.error !== undefined)
    mismatches.push({
      path: 'expect.error',
      expected: expect.error,
      actual: undefined,
      message: `expect.error: expected error "${expect.error}", got a decoded ${decoded.message.header.messageType}`,
    });
  if (expect.message !== undefined) matchPartial(expect.message, decoded.message, 'expect.message', mismatches);
  if (expect.findings !== undefined) mismatches.push(...matchFindings(expect.findings, decoded.warnings));
  return { actual, mismatches };
}

function runEncode(vector: Extract<Vector, { kind: 'encode' }>, engine: EngineFacade): Outcome {
  const encoded = engine.codec.encodeMessage(vector.input.message as unknown as Parameters<EngineFacade['codec']['encodeMessage']>[0]);
  const mismatches: Mismatch[] = [];
  const { expect } = vector;
  if (!encoded.ok) {
    const actual = { error: encoded.error.code, errorMessage: encoded.error.message };
    if (expect.error !== undefined) matchPartial(expect.error, encoded.error.code, 'expect.error', mismatches);
    else mismatches.push({ path: 'expect.hex', expected: expect.hex, actual, message: `expect.hex: expected "${expect.hex ?? ''}", got error ${encoded.error.code}: ${encoded.error.message}` });
    return { actual, mismatches };
  }
  const hex = engine.codec.toHex(encoded.bytes);
  if (expect.error !== undefined) mismatches.push({ path: 'expect.error', expected: expect.error, actual: hex, message: `expect.error: expected error "${expect.error}", got hex "${hex}"` });
  if (expect.hex !== undefined) matchPartial(normaliseHex(expect.hex), hex, 'expect.hex', mismatches);
  return { actual: { hex }, mismatches };
}

function runCaps(vector: Extract<Vector, { kind: 'caps' }>, engine: EngineFacade): Outcome {
  const { input, expect } = vector;
  const offers = pdosFrom(engine, input);
  if ('error' in offers) return { actual: undefined, mismatches: [], inputError: offers.error };
  const checked = engine.rules.checkCaps(offers.pdos, { pdpW: input.pdpW, cableMa: input.cableMa, label: input.label, epr: input.epr });
  const actual = { pdpW: checked.pdpW, pdpInferred: checked.pdpInferred, objects: offers.pdos, findings: [...offers.warnings, ...checked.findings] };
  const { findings, ...rest } = expect;
  const mismatches = matchPartial(rest, actual, 'expect');
  if (findings !== undefined) mismatches.push(...matchFindings(findings, actual.findings));
  return { actual, mismatches };
}

function runRequest(vector: Extract<Vector, { kind: 'request' }>, engine: EngineFacade): Outcome {
  const { input, expect } = vector;
  const offers = pdosFrom(engine, input);
  if ('error' in offers) return { actual: undefined, mismatches: [], inputError: offers.error };
  const chosen = engine.rules.chooseRequest(offers.pdos, input.sink, { cableMa: input.cableMa ?? 3_000 });
  const revision = offers.message?.header.specRevision === '2.0' ? '2.0' : '3.0';
  const header = { messageType: 'Request', category: 'data', numDataObjects: 1, messageId: 0, specRevision: revision, powerRole: 'sink', dataRole: 'ufp', extended: false };
  const encoded = engine.codec.encodeMessage({ sop: 'SOP', header, objects: [chosen.rdo] } as unknown as Parameters<EngineFacade['codec']['encodeMessage']>[0]);
  const request = {
    hex: encoded.ok ? engine.codec.toHex(encoded.bytes) : `error: ${encoded.error.message}`,
    rdo: `0x${(chosen.rdoRaw >>> 0).toString(16).padStart(8, '0')}`,
    objectPosition: chosen.objectPosition,
    capabilityMismatch: chosen.capabilityMismatch,
    contract: chosen.contract,
  };
  const findings = engine.rules.checkRequest(chosen.rdo, offers.pdos);
  const actual = { request, findings };
  const mismatches = expect.request === undefined ? [] : matchPartial(expect.request, request, 'expect.request');
  if (expect.findings !== undefined) mismatches.push(...matchFindings(expect.findings, findings));
  return { actual, mismatches };
}

interface TimedRecord {
  t: number;
  msg?: string;
  from?: string;
  event?: string;
  message?: { header?: { messageType?: string } };
}

/** Message type names of a simulated timeline, with reset events by their ordered-set names. */
function sequenceOf(events: readonly TimedRecord[], engine: EngineFacade): { names: string[]; contractAtMs: number | null } {
  const names: string[] = [];
  let accepted = false;
  let contractAtMs: number | null = null;
  for (const record of events) {
    let name: string | undefined;
    if (record.event === 'hard_reset') name = 'Hard_Reset';
    else if (record.event === 'cable_reset') name = 'Cable_Reset';
    else if (record.msg !== undefined) {
      name = record.message?.header?.messageType;
      if (name === undefined) {
        const bytes = engine.codec.parseHex(record.msg);
        const decoded = bytes.ok ? engine.codec.decodeMessage(bytes.bytes) : bytes;
        name = decoded.ok ? decoded.message.header.messageType : 'Unreadable';
      }
    }
    if (name === undefined) continue;
    names.push(name);
    if (record.from === 'source' && name === 'Accept') accepted = true;
    if (record.from === 'source' && name === 'PS_RDY' && accepted && contractAtMs === null) contractAtMs = record.t / 1_000;
    if (name === 'Hard_Reset') accepted = false;
  }
  return { names, contractAtMs };
}

function runNegotiation(vector: Extract<Vector, { kind: 'negotiation' }>, engine: EngineFacade): Outcome {
  const { expect } = vector;
  const result = engine.sim.simulate(vector.input.scenario);
  const sequence = sequenceOf(result.events as readonly TimedRecord[], engine);
  const { names } = sequence;
  // The simulator's own time of the first contract (the sink's PS_RDY); else the first PS_RDY after an Accept.
  const firstUs = (result as { contracts?: { t: number }[] }).contracts?.[0]?.t;
  const contractAtMs = firstUs === undefined ? sequence.contractAtMs : firstUs / 1_000;
  const actual = { contract: result.contract, sequence: names, findings: result.findings, contractAtMs };
  const mismatches: Mismatch[] = [];
  if (expect.contract === null) {
    if (result.contract !== null)
      mismatches.push({ path: 'expect.contract', expected: null, actual: result.contract, message: `expect.contract: expected no contract, got ${JSON.stringify(result.contract)}` });
  } else if (expect.contract !== undefined) {
    if (result.contract === null)
      mismatches.push({ path: 'expect.contract', expected: expect.contract, actual: null, message: `expect.contract: expected ${JSON.stringify(expect.contract)}, got no contract` });
    else matchPartial(expect.contract, result.contract, 'expect.contract', mismatches);
  }
  if (expect.sequence !== undefined) mismatches.push(...matchSequence(expect.sequence, names));
  if (expect.findings !== undefined) mismatches.push(...matchFindings(expect.findings, result.findings));
  if (expect.contractWithinMs !== undefined) mismatches.push(...matchWithin(expect.contractWithinMs, result.contract === null ? null : contractAtMs));
  if (expect.invariants !== undefined) mismatches.push(...invariantMismatches(vector.input.scenario, result, expect.invariants));
  return { actual, mismatches };
}

async function runTrace(vector: Extract<Vector, { kind: 'trace' }>, engine: EngineFacade, options: RunOptions): Promise<Outcome> {
  const { input, expect } = vector;
  let analysis: { messages: number; contracts: unknown[]; findings: Finding[] };
  if (input.trace !== undefined) {
    analysis = engine.trace.analyseRecords(input.trace);
  } else {
    const file = input.file ?? '';
    if (!options.readFile) return { actual: undefined, mismatches: [], inputError: `input.file: "${file}" cannot be read here (no file access)` };
    let text: string;
    try {
      text = await options.readFile(file);
    } catch (error) {
      return { actual: undefined, mismatches: [], inputError: `input.file: cannot read "${file}": ${error instanceof Error ? error.message : String(error)}` };
    }
    const analysed = engine.trace.analyseTrace(text, { format: input.format ?? 'auto' });
    if (!analysed.ok) return { actual: undefined, mismatches: [], inputError: `input.file: ${analysed.error.message}` };
    analysis = analysed.analysis;
  }
  const actual = { messages: analysis.messages, contracts: analysis.contracts, findings: analysis.findings };
  const { findings, ...rest } = expect;
  const mismatches = matchPartial(rest, actual, 'expect');
  if (findings !== undefined) mismatches.push(...matchFindings(findings, analysis.findings));
  return { actual, mismatches };
}

async function runPropertyVector(vector: Extract<Vector, { kind: 'property' }>, engine: EngineFacade, options: RunOptions): Promise<Outcome> {
  const { code, runs, seed } = vector.input;
  const outcome = options.checkProperty ? await options.checkProperty(code, { runs, seed }) : await checkPropertyInline(code, { runs, seed }, engine);
  if (outcome.error) return { actual: { holds: false }, mismatches: [], inputError: `input.code: ${outcome.error.message}`, property: outcome };
  const mismatches = matchPartial(vector.expect.holds, outcome.holds, 'expect.holds');
  const first = mismatches[0];
  if (first && !outcome.holds) {
    const shrinks = outcome.numShrinks === undefined ? '' : ` after ${outcome.numShrinks} shrinks`;
    first.message = `${first.message}; counterexample${shrinks} (seed ${seed}): ${outcome.counterexampleText ?? JSON.stringify(outcome.counterexample)}${outcome.failure ? `; ${outcome.failure}` : ''}`;
  }
  return { actual: { holds: outcome.holds, counterexample: outcome.counterexample }, mismatches, property: outcome };
}

/** A negotiation vector holding a property's shrunk counterexample scenario, for the user to save. */
export function counterexampleVector(vector: Vector, scenario: unknown): Record<string, unknown> {
  return {
    vector: 1,
    id: `${vector.id}/counterexample`,
    title: `Counterexample of "${vector.title}" (edit expect to what should happen)`,
    tags: ['counterexample', ...vector.tags],
    ref: `shrunk counterexample of property ${vector.id}, seed ${vector.kind === 'property' ? vector.input.seed : 0}`,
    kind: 'negotiation',
    input: { scenario },
    expect: { findings: { exclude: ['*error'] } },
  };
}

/** Runs one validated vector. Never throws: an engine crash is a failing result with its message. */
export async function runVector(vector: Vector, options: RunOptions = {}): Promise<VectorResult> {
  const now = options.now ?? (() => performance.now());
  const engine = options.engine ?? defaultEngine;
  const started = now();
  let outcome: Outcome;
  try {
    switch (vector.kind) {
      case 'decode':
        outcome = runDecode(vector, engine);
        break;
      case 'encode':
        outcome = runEncode(vector, engine);
        break;
      case 'caps':
        outcome = runCaps(vector, engine);
        break;
      case 'request':
        outcome = runRequest(vector, engine);
        break;
      case 'negotiation':
        outcome = runNegotiation(vector, engine);
        break;
      case 'trace':
        outcome = await runTrace(vector, engine, options);
        break;
      case 'property':
        outcome = await runPropertyVector(vector, engine, options);
        break;
      case 'sweep':
        outcome = runSweepVector(vector, engine);
        break;
    }
  } catch (error) {
    const text = error instanceof Error ? error.message : String(error);
    return { id: vector.id, ok: false, message: `the engine threw: ${text}`, durationMs: now() - started, expected: vector.expect };
  }
  const message = outcome.inputError ?? describeMismatches(outcome.mismatches);
  const result: VectorResult = { id: vector.id, ok: message === undefined, durationMs: now() - started, expected: vector.expect, actual: outcome.actual };
  if (message !== undefined) result.message = message;
  if (outcome.mismatches.length > 0) result.mismatches = outcome.mismatches;
  if (outcome.property) {
    result.property = outcome.property;
    // In a worker pool the wall time includes the wait for a free worker; report the check itself.
    if (outcome.property.durationMs !== undefined) result.durationMs = outcome.property.durationMs;
    if (outcome.property.counterexampleScenario !== undefined) result.counterexampleVector = counterexampleVector(vector, outcome.property.counterexampleScenario);
  }
  return result;
}

/** Parses, validates and runs a vector file; a broken file is a failing result named by `fallbackId`. */
export async function runVectorText(text: string, fallbackId: string, options: RunOptions = {}): Promise<VectorResult> {
  const parsed = parseVector(text);
  if (!parsed.ok) return { id: idOf(text) ?? fallbackId, ok: false, message: `${fallbackId}: ${parsed.error.message}`, durationMs: 0 };
  return runVector(parsed.vector, options);
}

function idOf(text: string): string | undefined {
  try {
    const json = JSON.parse(text) as { id?: unknown };
    return typeof json.id === 'string' && json.id.length > 0 ? json.id : undefined;
  } catch {
    return undefined;
  }
}
