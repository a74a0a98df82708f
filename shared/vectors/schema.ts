/**
 * The zod schema of a vector file (docs/vector.md), composed from the engine's own
 * schemas (sink policy, scenario, trace record), and the JSON Schemas generated from it for
 * `parley schema vector|scenario|trace` and the web UI's editors.
 */
import { z } from 'zod';
import { sinkPolicySchema } from '../rules/sink-policy.ts';
import { scenarioSchema } from '../sim/scenario.ts';
import { INVARIANT_IDS } from '../sweep/invariants.ts';
import { SWEEP_FAULT_KINDS } from '../sweep/placements.ts';
import { traceHeaderSchema, traceRecordSchema } from '../trace/record-schema.ts';
import { zodMessage } from '../core/zod-message.ts';

/** Lower-case words of `a-z`, `0-9`, `.`, `_`, `-`, joined by `/`: `caps/power-rules/45w-without-9v`. */
export const VECTOR_ID_PATTERN = /^[a-z0-9][a-z0-9._-]*(?:\/[a-z0-9][a-z0-9._-]*)*$/;

const hexText = z.string().min(1, 'must not be empty');
const pdoText = z.string().regex(/^(?:0x)?[0-9a-fA-F]{1,8}$/, 'a 32-bit PDO as hex, e.g. "0x0001912c"');
const ruleId = z.string().regex(/^(?:\*error|[a-z]+\.[a-z0-9-]+)$/, 'a rule id such as "caps.order", or "*error"');

export const findingsExpectSchema = z
  .object({ include: z.array(ruleId).optional(), exclude: z.array(ruleId).optional() })
  .strict()
  .describe('Rule ids that must appear (include) and must not (exclude); "*error" in exclude: no error at all.');

/** A partial object: any JSON object, matched key by key. */
const partial = z.record(z.string(), z.unknown());

const base = {
  vector: z.literal(1).describe('The file format version: 1.'),
  id: z.string().regex(VECTOR_ID_PATTERN, 'lower-case words separated by "/", e.g. "caps/power-rules/45w-without-9v"'),
  title: z.string().min(1, 'must not be empty'),
  tags: z.array(z.string().min(1)).default([]),
  ref: z.string().min(1, 'say where the expected value comes from: a specification section, "common practice" or "from memory: …"'),
};

const pdosOrHex = {
  hex: hexText.optional().describe('A Source_Capabilities message, wire-order hex.'),
  pdos: z.array(pdoText).optional().describe('The PDOs as 32-bit hex numbers.'),
};

const needsCaps = (input: { hex?: string; pdos?: string[]; caps?: string }) => input.hex !== undefined || input.pdos !== undefined || input.caps !== undefined;

export const decodeVectorSchema = z
  .object({
    ...base,
    kind: z.literal('decode'),
    input: z
      .object({
        hex: hexText.describe('The message: wire-order bytes, or with words: true a 16-bit header then 32-bit objects as numbers.'),
        sop: z.enum(['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"]).optional(),
        words: z.boolean().optional(),
        crc: z.boolean().optional().describe('The last 4 bytes are the CRC-32 and are checked.'),
        caps: hexText.optional().describe('The Source_Capabilities message a Request refers to.'),
      })
      .strict(),
    expect: z.object({ message: partial.optional(), error: z.string().optional().describe('The error code when decoding must fail.'), findings: findingsExpectSchema.optional() }).strict(),
  })
  .strict();

export const encodeVectorSchema = z
  .object({
    ...base,
    kind: z.literal('encode'),
    input: z.object({ message: partial.describe('A Message as decode prints it; raw fields may be left out.') }).strict(),
    expect: z.object({ hex: hexText.optional(), error: z.string().optional() }).strict(),
  })
  .strict();

export const capsVectorSchema = z
  .object({
    ...base,
    kind: z.literal('caps'),
    input: z
      .object({
        ...pdosOrHex,
        pdpW: z.number().int().min(0).max(240).optional(),
        cableMa: z.number().int().min(0).max(5_000).optional(),
        label: z.string().optional(),
        epr: z.boolean().optional(),
      })
      .strict()
      .refine(needsCaps, { message: 'give hex or pdos', path: ['pdos'] }),
    expect: z.object({ findings: findingsExpectSchema.optional(), pdpW: z.number().int().optional(), pdpInferred: z.boolean().optional(), objects: z.array(partial).optional() }).strict(),
  })
  .strict();

export const requestVectorSchema = z
  .object({
    ...base,
    kind: z.literal('request'),
    input: z
      .object({
        caps: hexText.optional().describe('A Source_Capabilities message, wire-order hex.'),
        pdos: z.array(pdoText).optional(),
        sink: sinkPolicySchema,
        cableMa: z.number().int().min(0).max(5_000).optional(),
      })
      .strict()
      .refine(needsCaps, { message: 'give caps or pdos', path: ['caps'] }),
    expect: z.object({ request: partial.optional(), findings: findingsExpectSchema.optional() }).strict(),
  })
  .strict();

export const negotiationVectorSchema = z
  .object({
    ...base,
    kind: z.literal('negotiation'),
    input: z.object({ scenario: scenarioSchema }).strict(),
    expect: z
      .object({
        contract: partial.nullable().optional().describe('The contract at the end (partial), or null for none.'),
        sequence: z.array(z.string().min(1)).optional().describe('Message types that must appear in this order; others may come between.'),
        findings: findingsExpectSchema.optional(),
        contractWithinMs: z.number().int().min(0).optional(),
        invariants: z
          .array(z.enum(INVARIANT_IDS as [string, ...string[]]))
          .optional()
          .describe('Fault-sweep invariants that must hold for this run (e.g. "contract.agreement"); docs/vector.md lists them.'),
      })
      .strict(),
  })
  .strict();

export const sweepVectorSchema = z
  .object({
    ...base,
    kind: z.literal('sweep'),
    input: z
      .object({
        scenario: scenarioSchema,
        faults: z.array(z.enum(SWEEP_FAULT_KINDS)).min(1).optional().describe('Fault kinds placed on every message (default drop, corrupt, delay).'),
        pairs: z.boolean().optional().describe('Also every pair of placements.'),
        timers: z.enum(['edges', 'jitter']).optional().describe('edges: also each timer at its minimum and maximum.'),
        max: z.number().int().min(1).max(1_000_000).optional().describe('At most this many runs, sampled with the seed.'),
        seed: z.number().int().optional(),
      })
      .strict(),
    expect: z
      .object({
        holds: z.boolean().describe('Every run holds every invariant.'),
        minRuns: z.number().int().min(0).optional().describe('The campaign has at least this many runs.'),
      })
      .strict(),
  })
  .strict();

export const traceVectorSchema = z
  .object({
    ...base,
    kind: z.literal('trace'),
    input: z
      .object({
        trace: z.array(traceRecordSchema).optional().describe('The records, inline.'),
        file: z.string().min(1).optional().describe('A trace file, relative to the vector file.'),
        format: z.enum(['auto', 'jsonl', 'text', 'vcd']).optional(),
      })
      .strict()
      .refine((input) => (input.trace === undefined) !== (input.file === undefined), { message: 'give either trace or file', path: ['trace'] }),
    expect: z.object({ findings: findingsExpectSchema.optional(), contracts: z.array(partial).optional(), messages: z.number().int().min(0).optional() }).strict(),
  })
  .strict();

export const propertyVectorSchema = z
  .object({
    ...base,
    kind: z.literal('property'),
    input: z
      .object({
        code: z.string().min(1).describe('TypeScript: export default ({ fc, engine }) => fc.property(…).'),
        runs: z.number().int().min(1).max(1_000_000).default(100),
        seed: z.number().int().default(1),
      })
      .strict(),
    expect: z.object({ holds: z.boolean() }).strict(),
  })
  .strict();

export const vectorSchema = z.discriminatedUnion('kind', [
  decodeVectorSchema,
  encodeVectorSchema,
  capsVectorSchema,
  requestVectorSchema,
  negotiationVectorSchema,
  traceVectorSchema,
  propertyVectorSchema,
  sweepVectorSchema,
]);

export type Vector = z.infer<typeof vectorSchema>;
export type VectorInput = z.input<typeof vectorSchema>;
export type VectorKind = Vector['kind'];
export const VECTOR_KINDS: readonly VectorKind[] = ['decode', 'encode', 'caps', 'request', 'negotiation', 'trace', 'property', 'sweep'];

const jsonSchemaOptions = { target: 'draft-2020-12', io: 'input', unrepresentable: 'any' } as const;

/** The JSON Schema of a vector file (for `parley schema vector` and the editors). */
export function vectorJsonSchema(): Record<string, unknown> {
  return {
    ...z.toJSONSchema(vectorSchema, jsonSchemaOptions),
    $id: 'urn:parley:schema:vector',
    title: 'Parley test vector (*.vector.json)',
  };
}

/** The JSON Schema of a negotiation scenario. */
export function scenarioJsonSchema(): Record<string, unknown> {
  return {
    ...z.toJSONSchema(scenarioSchema, jsonSchemaOptions),
    $id: 'urn:parley:schema:scenario',
    title: 'Parley negotiation scenario',
  };
}

/**
 * The JSON Schema of one trace record, the lines of a `.trace.jsonl` file after the first. The
 * first line is the header (`$defs.header`), which the description documents.
 */
export function traceJsonSchema(): Record<string, unknown> {
  const record = z.toJSONSchema(traceRecordSchema, jsonSchemaOptions);
  const header = z.toJSONSchema(traceHeaderSchema.describe('The first line of a .trace.jsonl file: {"trace": 1, …}; fields other than trace are free metadata.'), jsonSchemaOptions);
  const { $schema, ...headerBody } = header;
  void $schema;
  const defs = (record.$defs as Record<string, unknown> | undefined) ?? {};
  return {
    ...record,
    $id: 'urn:parley:schema:trace-record',
    title: 'Parley trace record (one line of a .trace.jsonl file)',
    description:
      'A .trace.jsonl file is JSON Lines: the first line is a header {"trace": 1, "title"?, "capturedAt"?, …free metadata} (see $defs.header), then one record a line (this schema): a message {t, msg, from, sop?, crc?, crcOk?}, an event {t, event, from?, cc?, rp?}, a measurement {t, vbus: {mv, ma?}} or a note {t, note}. t is microseconds from the start, non-decreasing. Blank lines are ignored.',
    $defs: { ...defs, header: headerBody },
  };
}

/** "field: message" for the first few issues of a failed vector parse (shared/core/zod-message.ts). */
export function describeZodError(error: z.ZodError, limit = 3): string {
  return zodMessage(error, { where: '(file)', limit });
}
