import { describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { startServer } from '../../server/start.ts';
import { openOrm } from '../../server/db/orm.ts';
import { User } from '../../server/db/entities.ts';
import { Trace } from '../../server/db/trace-entities.ts';
import { createQueuedTrace } from '../../server/features/traces/new-trace.ts';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';

const quiet = (dataDir: string) => ({ port: 0, host: '127.0.0.1', dataDir, log: false, demo: true, distDir: join(dataDir, 'no-dist') });

async function statusOf(orm: Awaited<ReturnType<typeof openOrm>>, id: number): Promise<string> {
  return (await orm.em.fork().findOneOrFail(Trace, { id })).status;
}

describe('start-up resumes unfinished traces', () => {
  it('analyses traces a stopped server left queued or analysing, without anyone opening them', async () => {
    const dataDir = join(mkdtempSync(join(tmpdir(), 'parley-resume-')), 'data');
    try {
      // First run: migrations and the demo seed, then stop.
      await (await startServer(quiet(dataDir))).close();

      // As a crash would leave them: two stored files, one row queued, one mid-analysis.
      const orm = await openOrm({ dbName: join(dataDir, 'parley.sqlite') });
      const em = orm.em.fork();
      const uploader = await em.findOneOrFail(User, { email: 'support@kestrel.example' });
      mkdirSync(join(dataDir, 'traces'), { recursive: true });
      const ids: number[] = [];
      for (const [name, status] of [
        ['k65-pps-stops.trace.jsonl', 'queued'],
        ['k65-late-ps-rdy.trace.jsonl', 'analysing'],
      ] as const) {
        // A trailing newline keeps the bytes (and so the hash) apart from the seeded copy.
        const bytes = Buffer.concat([readFileSync(join(demoTraceFolder, name)), Buffer.from('\n')]);
        const sha256 = createHash('sha256').update(bytes).digest('hex');
        writeFileSync(join(dataDir, 'traces', sha256), bytes);
        const row = createQueuedTrace(em, {
          title: '',
          fileName: `left-${name}`,
          sha256,
          sizeBytes: bytes.length,
          format: 'jsonl',
          uploaderId: uploader.id,
          uploaderName: uploader.name,
          deviceId: null,
          customerRef: '',
          notes: '',
          createdAt: new Date(),
        });
        row.status = status;
        await em.flush();
        ids.push(row.id);
      }
      await orm.close();

      // Second run: nobody requests the traces; start-up alone finishes them.
      const server = await startServer(quiet(dataDir));
      try {
        expect(await (await fetch(`${server.url}/api/health`)).json()).toMatchObject({
          ok: true,
          database: { ok: true, kind: 'sqlite' },
          storage: { ok: true, kind: 'local' },
          queue: { ok: true, kind: 'local' },
        });
        const deadline = Date.now() + 30_000;
        let statuses: string[] = [];
        while (Date.now() < deadline) {
          statuses = await Promise.all(ids.map((id) => statusOf(server.orm, id)));
          if (statuses.every((s) => s === 'done')) break;
          await new Promise((r) => setTimeout(r, 100));
        }
        expect(statuses).toEqual(['done', 'done']);
        await server.resumed;
        const rows = await server.orm.em.fork().find(Trace, { id: { $in: ids } }, { orderBy: { id: 'asc' } });
        for (const row of rows) {
          expect(row.analysisBytes).toBeGreaterThan(0);
          expect(row.messages).toBeGreaterThan(0);
          // An empty title becomes the header's title or the file name once analysed.
          expect(row.title).not.toBe('');
        }
      } finally {
        await server.close();
      }
    } finally {
      rmSync(join(dataDir, '..'), { recursive: true, force: true });
    }
  }, 60_000);
});
