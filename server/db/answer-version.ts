import type { EntityManager } from '@mikro-orm/better-sqlite';
import { dateOrNull, sqlReads } from './reads.ts';

/**
 * The number triggers raise on every change of the tables kept answers are read from (team_vector,
 * run_result, device_under_test, trace: migrations LibraryVersion and AnswerVersion), in the same
 * transaction as the change. Read it before the data: an answer computed after reading version n is
 * at least as new as n, so keeping it under n never serves older data than n named.
 */
export async function answerVersion(em: EntityManager): Promise<number> {
  const row = await sqlReads(em).get<{ version: unknown }>('select version from library_version where id = 1');
  return Number(row?.version ?? 0);
}

/** A trace's analysis state, for the keys of its answers (one row by its key; undefined when there is no such trace). */
export async function traceAnalysisState(em: EntityManager, traceId: number): Promise<{ done: boolean; analysedAtMs: number | null } | undefined> {
  const row = await sqlReads(em).get<{ status: string; analysed_at: unknown }>('select status, analysed_at from trace where id = ?', [traceId]);
  if (!row) return undefined;
  return { done: row.status === 'done', analysedAtMs: dateOrNull(row.analysed_at)?.getTime() ?? null };
}
