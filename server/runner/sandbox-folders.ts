/**
 * The property sandbox's folder on the host: one fresh temp folder per sandbox that holds the
 * bundled checker, named `parley-property-*`, with an `owner.json` saying which process made it.
 * A server that exits normally removes its folder; one killed with SIGKILL cannot, so every start
 * removes the folders whose owner is gone (`removeStaleSandboxFolders`). A folder of a live
 * process (another server, a parallel test) or of another user is left alone.
 */
import { chmodSync, lstatSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const SANDBOX_FOLDER_PREFIX = 'parley-property-';
const OWNER_FILE = 'owner.json';

interface Owner {
  pid: number;
  /** The process's start time in clock ticks since boot (`/proc/<pid>/stat` field 22), against pid reuse; null off Linux. */
  startTicks: number | null;
}

/** State (`R`, `S`, `Z`, …) and start time of a process from `/proc`, or null where there is none. */
function procStat(pid: number): { state: string; startTicks: number } | null {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) may hold spaces and parentheses: count from the last ')'.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const startTicks = Number(fields[19]);
    return Number.isFinite(startTicks) ? { state: fields[0] ?? '', startTicks } : null;
  } catch {
    return null;
  }
}

function startTicksOf(pid: number): number | null {
  return procStat(pid)?.startTicks ?? null;
}

/** Running, with the same start time (not a reused pid), and not a zombie its parent has yet to collect. */
function isAlive(owner: Owner): boolean {
  if (owner.startTicks !== null) {
    const stat = procStat(owner.pid);
    return stat !== null && stat.startTicks === owner.startTicks && stat.state !== 'Z';
  }
  try {
    process.kill(owner.pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function readOwner(folder: string): Owner | null {
  try {
    const owner = JSON.parse(readFileSync(join(folder, OWNER_FILE), 'utf8')) as Partial<Owner>;
    if (!Number.isInteger(owner.pid) || (owner.startTicks !== null && !Number.isInteger(owner.startTicks))) return null;
    return { pid: owner.pid!, startTicks: owner.startTicks ?? null };
  } catch {
    return null;
  }
}

/**
 * A fresh folder for this process's sandbox (mkdtemp: no other user can have prepared it), readable
 * but not writable by others so a child dropped to `nobody` can read the bundle.
 */
export function makeSandboxFolder(root = tmpdir()): string {
  const folder = mkdtempSync(join(root, SANDBOX_FOLDER_PREFIX));
  writeFileSync(join(folder, OWNER_FILE), JSON.stringify({ pid: process.pid, startTicks: startTicksOf(process.pid) } satisfies Owner), { mode: 0o444 });
  chmodSync(folder, 0o755);
  return folder;
}

/**
 * A folder without an owner file is from a start that died before writing it, or from a version
 * before owner files, which may still be running (a rolling upgrade): removed only once a day old.
 */
const UNOWNED_GRACE_MS = 24 * 60 * 60 * 1_000;

/**
 * Removes sandbox folders left by processes that are gone; returns their paths. Only folders
 * owned by this process's user, never through a symbolic link.
 */
export function removeStaleSandboxFolders(root = tmpdir(), nowMs = Date.now()): string[] {
  const uid = process.getuid?.();
  const removed: string[] = [];
  let names: string[];
  try {
    names = readdirSync(root).filter((name) => name.startsWith(SANDBOX_FOLDER_PREFIX));
  } catch {
    return removed;
  }
  for (const name of names) {
    const folder = join(root, name);
    try {
      const stat = lstatSync(folder);
      if (!stat.isDirectory() || (uid !== undefined && stat.uid !== uid)) continue;
      const owner = readOwner(folder);
      const stale = owner === null ? nowMs - stat.mtimeMs > UNOWNED_GRACE_MS : !isAlive(owner);
      if (!stale) continue;
      rmSync(folder, { recursive: true, force: true });
      removed.push(folder);
    } catch {
      // Removed meanwhile by another start, or not ours to remove: nothing to do.
    }
  }
  return removed;
}
