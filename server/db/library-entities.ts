import type { Mismatch, RunKind, SweepRunSummary } from '../../shared/api/index.ts';
import { defineEntity, type InferEntity } from '@mikro-orm/core';

/**
 * The team library (vectors with their revisions), test runs with their results, and the API
 * tokens CI posts results with. A vector's file text is stored exactly as `formatVector` writes
 * it, so export gives back the bytes that were saved.
 */

export const TeamVector = defineEntity({
  name: 'TeamVector',
  properties: (p) => ({
    id: p.integer().primary(),
    /** The vector file's own id, e.g. `caps/power-rules/45w-without-9v`. */
    vectorId: p.string().unique(),
    title: p.string().index(),
    kind: p.string().index(),
    /** The file's tags, space-separated with a space at each end, for `like '% tag %'`; indexed on SQLite for the tag counts. */
    tags: p.text().index(),
    /** The current revision's file text (formatted, final newline). */
    text: p.text(),
    revision: p.integer().index(),
    /** The device under test this vector belongs to (server metadata, not part of the file). */
    deviceId: p.integer().nullable().index(),
    authorId: p.integer().index(),
    /** Copied when written so lists need no join and survive a rename. */
    authorName: p.string(),
    updatedById: p.integer(),
    updatedByName: p.string(),
    createdAt: p.datetime(),
    updatedAt: p.datetime().index(),
  }),
});
export type ITeamVector = InferEntity<typeof TeamVector>;

/** Every save of a vector: the file text as it was, who wrote it, when and why. */
export const VectorRevision = defineEntity({
  name: 'VectorRevision',
  uniques: [{ properties: ['vectorRowId', 'revision'] }],
  properties: (p) => ({
    id: p.integer().primary(),
    vectorRowId: p.integer().index(),
    revision: p.integer(),
    text: p.text(),
    message: p.string(),
    authorId: p.integer(),
    authorName: p.string(),
    createdAt: p.datetime(),
  }),
});
export type IVectorRevision = InferEntity<typeof VectorRevision>;

export const runSources = ['ui', 'ci'] as const;
export type RunSource = (typeof runSources)[number];
export const runStatuses = ['running', 'done', 'failed'] as const;
export type RunStatus = (typeof runStatuses)[number];

export const TestRun = defineEntity({
  name: 'TestRun',
  properties: (p) => ({
    id: p.integer().primary(),
    /** `vectors` (library or CI) or `sweep` (a fault sweep campaign). */
    kind: p.string().$type<RunKind>().default('vectors'),
    project: p.string().index(),
    /** The firmware build CI tested; null for runs started in the UI without one. */
    build: p.string().nullable(),
    source: p.string().$type<RunSource>(),
    status: p.string().$type<RunStatus>(),
    /** What was run, in words: "all", "3 selected", "kind caps, tag power-rules". */
    selection: p.string(),
    total: p.integer(),
    done: p.integer(),
    passed: p.integer(),
    failed: p.integer(),
    /** Failures the project's previous run did not have. */
    newFailures: p.integer(),
    startedById: p.integer().nullable(),
    startedByName: p.string(),
    tokenId: p.integer().nullable(),
    errorMessage: p.text().nullable(),
    createdAt: p.datetime(),
    finishedAt: p.datetime().nullable(),
    /** A sweep's campaign and outcome classes; null for vector runs. */
    sweep: p.json<SweepRunSummary>().nullable(),
  }),
});
export type ITestRun = InferEntity<typeof TestRun>;

/** Expected and actual output of a failing vector, with the runner's mismatch list. */
export interface RunResultDetail {
  expected?: unknown;
  actual?: unknown;
  mismatches?: Mismatch[];
  counterexampleVector?: unknown;
}

export const RunResult = defineEntity({
  name: 'RunResult',
  indexes: [{ properties: ['vectorId', 'id'] }],
  properties: (p) => ({
    id: p.integer().primary(),
    runId: p.integer().index(),
    vectorId: p.string().index(),
    title: p.string().nullable(),
    kind: p.string().nullable(),
    /** The library revision that ran (UI runs); null for CI results. */
    vectorRevision: p.integer().nullable(),
    ok: p.boolean(),
    message: p.text().nullable(),
    durationMs: p.float(),
    newFailure: p.boolean(),
    /** Only for failures: passing vectors need no evidence. */
    detail: p.json<RunResultDetail>().nullable(),
    createdAt: p.datetime(),
  }),
});
export type IRunResult = InferEntity<typeof RunResult>;

/** A CI token for one project. Only the SHA-256 of the token is stored; it is shown once. */
export const ApiToken = defineEntity({
  name: 'ApiToken',
  properties: (p) => ({
    id: p.integer().primary(),
    project: p.string().index(),
    name: p.string(),
    tokenHash: p.string().unique(),
    /** The first characters, to recognise a token in the list. */
    tokenPrefix: p.string(),
    createdById: p.integer(),
    createdByName: p.string(),
    createdAt: p.datetime(),
    lastUsedAt: p.datetime().nullable(),
    revokedAt: p.datetime().nullable(),
  }),
});
export type IApiToken = InferEntity<typeof ApiToken>;

export const libraryEntities = [TeamVector, VectorRevision, TestRun, RunResult, ApiToken];
