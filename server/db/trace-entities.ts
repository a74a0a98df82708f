import { defineEntity, type InferEntity } from '@mikro-orm/core';
import type { Analysis } from '../../shared/trace/index.ts';

/**
 * Uploaded traces and their comments (the Traces product). The file itself lives in
 * `PARLEY_DATA/traces/<sha256>`; a row holds its metadata, the analysis status and, once done,
 * the analysis (a lazy JSON column, so lists never load it) with counts for filtering.
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
    analysis: p.json<Analysis>().nullable().lazy(true, false),
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
