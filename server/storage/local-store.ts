/** The trace store in a local folder: `<dataDir>/traces/<sha256>`, its stored analysis `<sha256>.analysis`. */
import { createReadStream, existsSync, mkdirSync } from 'node:fs';
import { access, rename, rm, writeFile } from 'node:fs/promises';
import { constants } from 'node:fs';
import { join } from 'node:path';
import { assertSha256, type TraceStore } from './types.ts';

export function createLocalTraceStore(dataDir: string): TraceStore {
  const dir = join(dataDir, 'traces');
  const pathOf = (sha256: string) => join(dir, assertSha256(sha256));
  const analysisPathOf = (sha256: string) => `${pathOf(sha256)}.analysis`;
  return {
    kind: 'local',
    incomingDir: dir,
    has: async (sha256) => existsSync(pathOf(sha256)),
    async keep(tempPath, sha256) {
      const target = pathOf(sha256);
      try {
        if (!existsSync(target)) await rename(tempPath, target);
      } finally {
        // Renamed away, a duplicate, or a failed rename: the temporary file goes in every case.
        await rm(tempPath, { force: true });
      }
    },
    async put(sha256, bytes) {
      mkdirSync(dir, { recursive: true });
      if (!existsSync(pathOf(sha256))) await writeFile(pathOf(sha256), bytes, { mode: 0o600 });
    },
    async remove(sha256) {
      await rm(pathOf(sha256), { force: true });
      await rm(analysisPathOf(sha256), { force: true });
    },
    async read(sha256) {
      return createReadStream(pathOf(sha256));
    },
    async keepAnalysis(tempPath, sha256) {
      // The temporary file is in this folder, so the rename replaces the older analysis atomically.
      await rename(tempPath, analysisPathOf(sha256));
    },
    async readAnalysis(sha256) {
      return existsSync(analysisPathOf(sha256)) ? createReadStream(analysisPathOf(sha256)) : null;
    },
    async withLocalFile(sha256, use) {
      return use(pathOf(sha256));
    },
    async check() {
      try {
        mkdirSync(dir, { recursive: true });
        await access(dir, constants.W_OK);
        return { ok: true };
      } catch (error) {
        return { ok: false, message: error instanceof Error ? error.message : String(error) };
      }
    },
  };
}
