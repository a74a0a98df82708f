/**
 * Stores the demo traces of this folder (manifest.json) in a new demo database, uploaded by the
 * demo support account, and analyses them through the same worker pool as uploads.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { DeviceUnderTest, User } from '../entities.ts';
import { Trace } from '../trace-entities.ts';
import type { Clock } from '../../context.ts';
import type { TraceStore } from '../../storage/types.ts';
import { sniffTrace, SNIFF_BYTES } from '../../features/traces/sniff.ts';
import { traceAnalysisHandler } from '../../features/traces/analyse.ts';
import { createAnalysisPool } from '../../analysis/pool.ts';
import type { AnalysisEvent } from '../../../shared/api/index.ts';
import { createQueuedTrace } from '../../features/traces/new-trace.ts';
import { demoTraceFolder, readDemoManifest } from './manifest.ts';

/** Uploads a day apart, the newest an hour before the seed. */
const DAY_MS = 86_400_000;

export async function seedDemoTraces(em: EntityManager, clock: Clock, store: TraceStore, folder = demoTraceFolder): Promise<number> {
  if ((await em.count(Trace)) > 0) return 0;
  const uploader = await em.findOneOrFail(User, { email: 'support@kestrel.example' });
  const devices = await em.find(DeviceUnderTest, {});
  const manifest = readDemoManifest(folder);
  const files = manifest.map((entry) => {
    const bytes = readFileSync(join(folder, entry.fileName));
    return { bytes, sha256: createHash('sha256').update(bytes).digest('hex') };
  });
  for (const { bytes, sha256 } of files) await store.put(sha256, bytes);
  const rows = manifest.map((entry, index) => {
    const { bytes, sha256 } = files[index]!;
    const sniffed = sniffTrace(bytes.subarray(0, SNIFF_BYTES), bytes.length <= SNIFF_BYTES);
    if (!sniffed.ok) throw new Error(`demo trace ${entry.fileName}: ${sniffed.error.message}`);
    return createQueuedTrace(em, {
      title: entry.title,
      fileName: entry.fileName,
      sha256,
      sizeBytes: bytes.length,
      format: sniffed.format,
      uploaderId: uploader.id,
      uploaderName: uploader.name,
      deviceId: devices.find((d) => d.model === entry.deviceModel)?.id ?? null,
      customerRef: entry.customerRef,
      notes: entry.notes,
      createdAt: new Date(clock.now().getTime() - 3_600_000 - (manifest.length - 1 - index) * DAY_MS),
    });
  });
  await em.flush();
  // The seed runs before the server takes requests, so it analyses here with a pool of its own.
  const pool = createAnalysisPool({ maxThreads: 1 });
  try {
    const analyse = traceAnalysisHandler({ fork: () => em.fork(), clock, store, pool });
    for (const row of rows) {
      let final: AnalysisEvent | undefined;
      await analyse({ traceId: row.id }, { key: String(row.id), publish: (event) => (final = event), signal: new AbortController().signal });
      if (final?.type !== 'done') throw new Error(`demo trace ${row.fileName}: ${final?.type === 'failed' ? final.error.message : 'not analysed'}`);
    }
  } finally {
    await pool.close();
  }
  return rows.length;
}
