import { defineEntity, type InferEntity } from '@mikro-orm/core';
/**
 * Uploaded traces and their comments (the Traces product). The file itself lives in
 * `PARLEY_DATA/traces/<sha256>` and its analysis, compressed, beside it (`<sha256>.analysis`);
 * a row holds the metadata, the analysis status and counts for filtering. What the trace page
 * reads is cut into rows of its own (TraceItem, TraceChunk), so no listed row carries an analysis.
 */

export const traceStatuses = ['queued', 'analysing', 'done', 'failed'] as const;
export type TraceStatus = (typeof traceStatuses)[number];

export const Trace = defineEntity({
  name: 'Trace',
  properties: (p) => ({
    id: p.integer().primary(),
    title: p.string(),
    fileName: p.string(),
    /** Lower-case hex SHA-256 of the file: its name in the store, and unique (one row per file). */
    sha256: p.string().unique(),
    sizeBytes: p.integer(),
    /** `jsonl`, `text` or `vcd`, sniffed from the content. */
    format: p.string(),
    uploaderId: p.integer().index(),
    /** Copied at upload so the list needs no join and survives a rename. */
    uploaderName: p.string(),
    deviceId: p.integer().nullable().index(),
    customerRef: p.string(),
    notes: p.text(),
    status: p.string().$type<TraceStatus>(),
    errorCode: p.string().nullable(),
    errorMessage: p.text().nullable(),
    summary: p.text().nullable(),
    messages: p.integer(),
    errorCount: p.integer(),
    warningCount: p.integer(),
    infoCount: p.integer(),
    /** The rule ids found, space-separated with a space at each end, for `like '% rule %'` search. */
    rules: p.text(),
    /** Bytes of the stored (compressed) analysis file. */
    analysisBytes: p.integer().nullable(),
    createdAt: p.datetime(),
    analysedAt: p.datetime().nullable(),
  }),
});
export type ITrace = InferEntity<typeof Trace>;

export const TraceComment = defineEntity({
  name: 'TraceComment',
  properties: (p) => ({
    id: p.integer().primary(),
    traceId: p.integer().index(),
    authorId: p.integer(),
    authorName: p.string(),
    authorRole: p.string(),
    body: p.text(),
    createdAt: p.datetime(),
  }),
});
export type ITraceComment = InferEntity<typeof TraceComment>;

export const traceItemKinds = ['summary', 'finding', 'contract'] as const;

/** The analysis summary (one row), each finding and each contract of a trace, as JSON text. */
export const TraceItem = defineEntity({
  name: 'TraceItem',
  indexes: [{ properties: ['traceId', 'kind', 'index'] }, { properties: ['traceId', 'kind', 'severity', 'index'] }],
  properties: (p) => ({
    id: p.integer().primary(),
    traceId: p.integer(),
    kind: p.string().$type<(typeof traceItemKinds)[number]>(),
    /** Place in its list (0-based). */
    index: p.integer().fieldName('item_index'),
    t: p.bigint('number').nullable(),
    severity: p.string().nullable(),
    rule: p.string().nullable(),
    body: p.text(),
  }),
});
export type ITraceItem = InferEntity<typeof TraceItem>;

/**
 * A run of timeline items (shared/trace/views.ts): messages, events, contract spans or VBUS readings
 * at a level. Message chunks hold every message of the trace, compressed (server/analysis/message-chunks.ts),
 * with the two facts the message list asks of a chunk without opening it.
 */
export const TraceChunk = defineEntity({
  name: 'TraceChunk',
  indexes: [{ properties: ['traceId', 'kind', 'level', 'startUs'] }],
  properties: (p) => ({
    id: p.integer().primary(),
    traceId: p.integer(),
    kind: p.string(),
    level: p.integer(),
    seq: p.integer(),
    firstIndex: p.integer(),
    startUs: p.bigint('number'),
    endUs: p.bigint('number'),
    count: p.integer(),
    /** Messages other than GoodCRC (rows of the folded message list); 0 for other kinds. */
    foldedRows: p.integer().default(0),
    /** Index of the chunk's last Source_Capabilities with a good CRC, if it has one. */
    capsIndex: p.integer().nullable(),
    body: p.text(),
  }),
});
export type ITraceChunk = InferEntity<typeof TraceChunk>;
