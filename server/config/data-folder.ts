/**
 * The data folder as the server leaves it: readable by its own user only (folder 0700, files 0600,
 * the database and its journals included), and without the leftovers of a crash: temporary upload
 * files (`traces/.incoming-*`) and zips of imports that never finished (`imports/`).
 */
import { chmodSync, existsSync, mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';

export function prepareDataFolder(dataDir: string): { removed: string[] } {
  mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  chmodSync(dataDir, 0o700);
  const removed: string[] = [];
  const traces = join(dataDir, 'traces');
  if (existsSync(traces)) {
    for (const name of readdirSync(traces)) {
      if (!name.startsWith('.incoming-')) continue;
      rmSync(join(traces, name), { force: true });
      removed.push(join('traces', name));
    }
  }
  const imports = join(dataDir, 'imports');
  if (existsSync(imports)) {
    for (const name of readdirSync(imports)) {
      rmSync(join(imports, name), { force: true, recursive: true });
      removed.push(join('imports', name));
    }
  }
  return { removed };
}

/** Every file directly in the data folder (the database, its WAL and shared-memory files, the secret) to 0600, folders to 0700. */
export function restrictDataFiles(dataDir: string): void {
  for (const name of readdirSync(dataDir)) {
    const path = join(dataDir, name);
    chmodSync(path, statSync(path).isDirectory() ? 0o700 : 0o600);
  }
}
