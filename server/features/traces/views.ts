/**
 * The trace page's reads: the analysis summary, a page of findings or contracts, and one window of
 * the timeline. Each reads only the rows it answers with (trace_item, trace_chunk) in plain SQL
 * that SQLite and PostgreSQL both take; parsed chunks are kept in a small cache bounded by items.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { Finding } from '../../../shared/core/finding.ts';
import type { AnalysisSummary, FindingPin, MessageRange, Page, StoredTimelineMessage, TimelineWindow } from '../../../shared/trace/views.ts';
import { CHUNK_ITEMS, REPORT_FINDINGS_WITH_MESSAGES, REPORT_MESSAGES_AROUND, type MessagesAroundFindings } from '../../../shared/trace/views.ts';
import type { Analysis, TimelineContract, TimelineEvent, TimelineMeasurement } from '../../../shared/trace/index.ts';
import { sqlReads } from '../../db/reads.ts';
import { decodeChunkBody } from '../../analysis/message-chunks.ts';

/**
 * Parsed chunk items kept across requests, per database (chunk ids are only unique within one), at
 * most this many items in all (a chunk never changes once written; ids are not reused).
 */
const CACHE_ITEMS = 200_000;
interface ChunkCache {
  chunks: Map<number, unknown[]>;
  items: number;
}
const caches = new WeakMap<object, ChunkCache>();

function chunkCacheOf(em: EntityManager): ChunkCache {
  let cache = caches.get(em.config);
  if (!cache) {
    cache = { chunks: new Map(), items: 0 };
    caches.set(em.config, cache);
  }
  return cache;
}

function parsedChunk(em: EntityManager, id: number, body: string): unknown[] {
  const cache = chunkCacheOf(em);
  const hit = cache.chunks.get(id);
  if (hit) {
    cache.chunks.delete(id);
    cache.chunks.set(id, hit);
    return hit;
  }
  const items = decodeChunkBody(body);
  cache.chunks.set(id, items);
  cache.items += items.length;
  for (const [oldest, value] of cache.chunks) {
    if (cache.items <= CACHE_ITEMS) break;
    cache.chunks.delete(oldest);
    cache.items -= value.length;
  }
  return items;
}

/** A chunk's items: from the cache, else its body read now (window reads list chunks without their bodies). */
async function chunkItems(em: EntityManager, id: number): Promise<unknown[]> {
  const hit = chunkCacheOf(em).chunks.get(id);
  if (hit) return parsedChunk(em, id, '');
  const row = await sqlReads(em).get<{ body: string }>('select body from trace_chunk where id = ?', [id]);
  return parsedChunk(em, id, row?.body ?? '[]');
}

type Sql = { execute<T>(sql: string, params: unknown[]): Promise<T> };
/** The reads of this file: prepared, on the read connection (server/db/reads.ts). */
const sqlOf = (em: EntityManager): Sql => ({ execute: async <T>(sql: string, params: unknown[]) => (await sqlReads(em).all(sql, params)) as T });

export async function analysisSummary(em: EntityManager, traceId: number): Promise<AnalysisSummary | null> {
  const rows = await sqlOf(em).execute<{ body: string }[]>("select body from trace_item where trace_id = ? and kind = 'summary'", [traceId]);
  return rows[0] ? (JSON.parse(rows[0].body) as AnalysisSummary) : null;
}

export async function itemPage<T>(
  em: EntityManager,
  traceId: number,
  kind: 'finding' | 'contract',
  options: { page: number; pageSize: number; severity?: string | undefined },
): Promise<Page<T & { index: number }>> {
  const filter = options.severity === undefined ? '' : ' and severity = ?';
  const params: unknown[] = options.severity === undefined ? [traceId, kind] : [traceId, kind, options.severity];
  const sql = sqlOf(em);
  const [counted] = await sql.execute<{ total: number }[]>(`select count(*) as total from trace_item where trace_id = ? and kind = ?${filter}`, params);
  const rows = await sql.execute<{ item_index: number; body: string }[]>(`select item_index, body from trace_item where trace_id = ? and kind = ?${filter} order by item_index limit ? offset ?`, [
    ...params,
    options.pageSize,
    (options.page - 1) * options.pageSize,
  ]);
  return {
    items: rows.map((row) => ({ ...(JSON.parse(row.body) as T), index: Number(row.item_index) })),
    total: Number(counted?.total ?? 0),
    page: options.page,
    pageSize: options.pageSize,
  };
}

export type FindingPage = Page<Finding & { index: number }>;
export type ContractPage = Page<Analysis['contracts'][number] & { index: number }>;

export interface WindowQuery {
  startUs: number;
  endUs: number;
  /** Most VBUS readings wanted (the level is the finest that stays near this). */
  points: number;
  /** Most messages, events, contract spans and finding pins each. */
  limit: number;
}

interface ChunkRow {
  id: number;
  level: number;
  first_index: number;
  count: number;
  body: string;
}

/** The chunks that overlap the window, without their bodies (read only for the chunks used, when not cached). */
async function overlapping(em: EntityManager, traceId: number, kind: string, level: number, q: WindowQuery): Promise<Omit<ChunkRow, 'body'>[]> {
  return sqlOf(em).execute<Omit<ChunkRow, 'body'>[]>(
    'select id, level, first_index, count from trace_chunk where trace_id = ? and kind = ? and level = ? and end_us >= ? and start_us <= ? order by start_us',
    [traceId, kind, level, q.startUs, q.endUs],
  );
}

/** Items of the chunks that fall in the window, at most `limit`; the rest are counted (chunks past the limit are counted, not read). */
async function collect<T>(em: EntityManager, rows: Omit<ChunkRow, 'body'>[], inWindow: (item: T) => boolean, limit: number, withIndex: boolean): Promise<{ items: T[]; omitted: number }> {
  const items: T[] = [];
  let omitted = 0;
  for (const row of rows) {
    if (items.length >= limit) {
      omitted += Number(row.count);
      continue;
    }
    const parsed = (await chunkItems(em, Number(row.id))) as T[];
    parsed.forEach((item, offset) => {
      if (!inWindow(item)) return;
      if (items.length >= limit) omitted++;
      else items.push(withIndex ? ({ ...item, index: Number(row.first_index) + offset } as T) : item);
    });
  }
  return { items, omitted };
}

/**
 * The reading just before the window and the one just after it, at `level`: from the last chunk
 * that starts before the window and the first that ends after it (a chunk's readings are in time
 * order, so the one wanted is the last, or first, of its side in that chunk).
 */
async function readingsBeside(em: EntityManager, traceId: number, level: number, q: WindowQuery): Promise<[TimelineMeasurement | null, TimelineMeasurement | null]> {
  const sql = sqlOf(em);
  const [before] = await sql.execute<{ id: number }[]>("select id from trace_chunk where trace_id = ? and kind = 'measurement' and level = ? and start_us < ? order by start_us desc limit 1", [
    traceId,
    level,
    q.startUs,
  ]);
  const [after] = await sql.execute<{ id: number }[]>("select id from trace_chunk where trace_id = ? and kind = 'measurement' and level = ? and end_us > ? order by start_us limit 1", [
    traceId,
    level,
    q.endUs,
  ]);
  const beforeItems = before ? ((await chunkItems(em, Number(before.id))) as TimelineMeasurement[]) : [];
  const afterItems = after ? ((await chunkItems(em, Number(after.id))) as TimelineMeasurement[]) : [];
  return [beforeItems.findLast((m) => m.t < q.startUs) ?? null, afterItems.find((m) => m.t > q.endUs) ?? null];
}

export async function timelineWindow(em: EntityManager, traceId: number, q: WindowQuery): Promise<TimelineWindow> {
  const sql = sqlOf(em);
  // The finest level whose chunks in the window hold about `points` readings (partial chunks at the edges allowed for).
  const levels = await sql.execute<{ level: number; total: number; chunks: number }[]>(
    "select level, sum(count) as total, count(*) as chunks from trace_chunk where trace_id = ? and kind = 'measurement' and end_us >= ? and start_us <= ? group by level order by level",
    [traceId, q.startUs, q.endUs],
  );
  const fitting = levels.find((l) => Number(l.total) <= q.points * 1.5 + 2 * 500) ?? levels[levels.length - 1];
  const measurementLevel = fitting ? Number(fitting.level) : 0;
  const inWindow = (t: number) => t >= q.startUs && t <= q.endUs;
  const measurements = fitting
    ? (await collect<TimelineMeasurement>(em, await overlapping(em, traceId, 'measurement', measurementLevel, q), (m) => inWindow(m.t), Number.POSITIVE_INFINITY, false)).items
    : [];
  const [readingBefore, readingAfter] = await readingsBeside(em, traceId, measurementLevel, q);
  const messages = await collect<StoredTimelineMessage & { index: number }>(
    em,
    await overlapping(em, traceId, 'message', 0, q),
    (m) => m.t + m.durationUs >= q.startUs && m.t <= q.endUs,
    q.limit,
    true,
  );
  const events = await collect<TimelineEvent>(em, await overlapping(em, traceId, 'event', 0, q), (e) => inWindow(e.t), q.limit, false);
  const contracts = await collect<TimelineContract>(
    em,
    await overlapping(em, traceId, 'contract', 0, q),
    (c) => (c.endUs ?? Number.POSITIVE_INFINITY) >= q.startUs && c.startUs <= q.endUs,
    q.limit,
    false,
  );
  const [pinCount] = await sql.execute<{ total: number }[]>("select count(*) as total from trace_item where trace_id = ? and kind = 'finding' and t >= ? and t <= ?", [traceId, q.startUs, q.endUs]);
  const pins = await sql.execute<{ item_index: number; t: number; severity: FindingPin['severity']; rule: string }[]>(
    "select item_index, t, severity, rule from trace_item where trace_id = ? and kind = 'finding' and t >= ? and t <= ? order by item_index limit ?",
    [traceId, q.startUs, q.endUs, q.limit],
  );
  return {
    startUs: q.startUs,
    endUs: q.endUs,
    measurementLevel,
    measurements,
    readingBefore,
    readingAfter,
    messages: messages.items,
    messagesOmitted: messages.omitted,
    events: events.items,
    eventsOmitted: events.omitted,
    contracts: contracts.items,
    findings: pins.map((p) => ({ index: Number(p.item_index), t: Number(p.t), severity: p.severity, rule: p.rule })),
    findingsOmitted: Math.max(0, Number(pinCount?.total ?? 0) - pins.length),
  };
}

type IndexedMessage = StoredTimelineMessage & { index: number };

/** The stored messages `first` … `first + count - 1` (level-0 chunks hold `CHUNK_ITEMS` each, in order). */
async function messagesByIndex(em: EntityManager, traceId: number, first: number, count: number): Promise<IndexedMessage[]> {
  const rows = await sqlOf(em).execute<ChunkRow[]>(
    "select id, level, first_index, count, body from trace_chunk where trace_id = ? and kind = 'message' and level = 0 and first_index < ? and first_index + count > ? order by first_index",
    [traceId, first + count, first],
  );
  const out: IndexedMessage[] = [];
  for (const row of rows) {
    const items = parsedChunk(em, Number(row.id), row.body) as StoredTimelineMessage[];
    const base = Number(row.first_index);
    for (let offset = Math.max(0, first - base); offset < items.length && base + offset < first + count; offset++) out.push({ ...items[offset]!, index: base + offset });
  }
  return out;
}

/** Index of the first message at or after `atUs` (the total when none is). */
async function messageIndexAt(em: EntityManager, traceId: number, atUs: number, total: number): Promise<number> {
  const [row] = await sqlOf(em).execute<ChunkRow[]>(
    "select id, level, first_index, count, body from trace_chunk where trace_id = ? and kind = 'message' and level = 0 and end_us >= ? order by first_index limit 1",
    [traceId, atUs],
  );
  if (!row) return total;
  const items = parsedChunk(em, Number(row.id), row.body) as StoredTimelineMessage[];
  const offset = items.findIndex((m) => m.t >= atUs);
  return Number(row.first_index) + (offset === -1 ? items.length : offset);
}

/**
 * Rows of a list without GoodCRCs, per message chunk: `firstIndex[c]` and `rowsBefore[c]` (rows in
 * the chunks before it; one more entry: all rows). Each chunk row says how many it holds, so no
 * chunk is opened; kept per trace by its first chunk's id (chunks are rewritten with new ids).
 */
type FoldedRows = { firstIndex: number[]; rowsBefore: number[] };
const foldedRowsCache = new Map<number, FoldedRows>();
const FOLDED_ROWS_TRACES = 64;

async function foldedRows(em: EntityManager, traceId: number): Promise<FoldedRows> {
  const sql = sqlOf(em);
  const [head] = await sql.execute<{ id: number }[]>("select id from trace_chunk where trace_id = ? and kind = 'message' and level = 0 order by first_index limit 1", [traceId]);
  const key = Number(head?.id ?? -traceId);
  const hit = foldedRowsCache.get(key);
  if (hit) return hit;
  const chunks = await sql.execute<{ first_index: number; folded_rows: number }[]>(
    "select first_index, folded_rows from trace_chunk where trace_id = ? and kind = 'message' and level = 0 order by first_index",
    [traceId],
  );
  const rows: FoldedRows = { firstIndex: [], rowsBefore: [0] };
  for (const c of chunks) {
    rows.firstIndex.push(Number(c.first_index));
    rows.rowsBefore.push(rows.rowsBefore[rows.rowsBefore.length - 1]! + Number(c.folded_rows));
  }
  if (foldedRowsCache.size >= FOLDED_ROWS_TRACES) foldedRowsCache.delete(foldedRowsCache.keys().next().value!);
  foldedRowsCache.set(key, rows);
  return rows;
}

/** Index of the message that is row `row` of the folded list (the total when past the end). */
async function indexOfFoldedRow(em: EntityManager, traceId: number, folded: FoldedRows, row: number, total: number): Promise<number> {
  let chunk = 0;
  while (chunk < folded.firstIndex.length && folded.rowsBefore[chunk + 1]! <= row) chunk++;
  if (chunk >= folded.firstIndex.length) return total;
  const first = folded.firstIndex[chunk]!;
  const items = await messagesByIndex(em, traceId, first, CHUNK_ITEMS);
  let seen = folded.rowsBefore[chunk]!;
  for (const m of items) {
    if (m.messageType === 'GoodCRC') continue;
    if (seen === row) return m.index;
    seen++;
  }
  return total;
}

/** Row of the folded list at message `index` (GoodCRCs before it not counted). */
async function foldedRowOfIndex(em: EntityManager, traceId: number, folded: FoldedRows, index: number): Promise<number> {
  let chunk = 0;
  while (chunk + 1 < folded.firstIndex.length && folded.firstIndex[chunk + 1]! <= index) chunk++;
  if (folded.firstIndex.length === 0) return 0;
  const first = folded.firstIndex[chunk]!;
  const items = await messagesByIndex(em, traceId, first, Math.max(0, index - first));
  return folded.rowsBefore[chunk]! + items.filter((m) => m.messageType !== 'GoodCRC').length;
}

/** The last Source_Capabilities with a good CRC before message `before` (a Request's objects are read against it). */
async function capabilitiesBefore(em: EntityManager, traceId: number, before: number): Promise<IndexedMessage | null> {
  // Each chunk row names its last good Source_Capabilities: the newest one before `before` is found
  // in SQL; only the chunk that holds `before` may have one later in it and an earlier one too.
  const [row] = await sqlOf(em).execute<{ caps_index: number }[]>(
    "select caps_index from trace_chunk where trace_id = ? and kind = 'message' and level = 0 and first_index < ? and caps_index is not null order by first_index desc limit 1",
    [traceId, before],
  );
  if (!row) return null;
  const capsIndex = Number(row.caps_index);
  if (capsIndex < before) return (await messagesByIndex(em, traceId, capsIndex, 1))[0] ?? null;
  const first = capsIndex - (capsIndex % CHUNK_ITEMS);
  const items = await messagesByIndex(em, traceId, first, before - first);
  const found = items.findLast((m) => m.messageType === 'Source_Capabilities' && m.crcOk);
  return found ?? capabilitiesBefore(em, traceId, first);
}

/**
 * A run of the whole trace's messages for the message list: `limit` rows from row `offset` (or
 * from the first message at `atUs`), with the offer in force before them. With `fold`, rows are
 * the messages other than GoodCRC (`offset` and `total` count those), and `items` still holds
 * every message from the first row's up to the next row's, so each row's GoodCRC is there.
 */
export async function messageRange(
  em: EntityManager,
  traceId: number,
  total: number,
  q: { offset?: number | undefined; atUs?: number | undefined; limit: number; fold?: boolean | undefined },
): Promise<MessageRange> {
  if (!q.fold) {
    const offset = Math.min(total, q.atUs === undefined ? (q.offset ?? 0) : await messageIndexAt(em, traceId, q.atUs, total));
    const items = await messagesByIndex(em, traceId, offset, q.limit);
    return { offset, total, items, capabilities: offset > 0 ? await capabilitiesBefore(em, traceId, offset) : null };
  }
  const folded = await foldedRows(em, traceId);
  const rows = folded.rowsBefore[folded.rowsBefore.length - 1]!;
  const offset = Math.min(rows, q.atUs === undefined ? (q.offset ?? 0) : await foldedRowOfIndex(em, traceId, folded, await messageIndexAt(em, traceId, q.atUs, total)));
  const from = await indexOfFoldedRow(em, traceId, folded, offset, total);
  const to = await indexOfFoldedRow(em, traceId, folded, offset + q.limit, total);
  const items = await messagesByIndex(em, traceId, from, to - from);
  return { offset, total: rows, items, capabilities: from > 0 ? await capabilitiesBefore(em, traceId, from) : null };
}

/**
 * The messages around each of the first timed findings, as a report lists them: the
 * `REPORT_MESSAGES_AROUND` rows (GoodCRC folded away) before the finding's time and as many from it on,
 * found among every stored message of the trace.
 */
export async function messagesAroundFindings(em: EntityManager, traceId: number, findings: readonly { t?: number | undefined }[]): Promise<MessagesAroundFindings> {
  const summary = await analysisSummary(em, traceId);
  if (!summary) return { items: [] };
  const total = summary.timeline.messages;
  const times = findings.flatMap((f) => (f.t === undefined ? [] : [f.t])).slice(0, REPORT_FINDINGS_WITH_MESSAGES);
  const items: MessagesAroundFindings['items'] = [];
  for (const t of times) {
    const at = await messageRange(em, traceId, total, { atUs: t, limit: 0, fold: true });
    const offset = Math.max(0, at.offset - REPORT_MESSAGES_AROUND);
    const range = await messageRange(em, traceId, total, { offset, limit: at.offset - offset + REPORT_MESSAGES_AROUND, fold: true });
    items.push({ t, messages: range.items.filter((m) => m.messageType !== 'GoodCRC') });
  }
  return { items };
}
