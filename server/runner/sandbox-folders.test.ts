import { spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { makeSandboxFolder, removeStaleSandboxFolders, SANDBOX_FOLDER_PREFIX } from './sandbox-folders.ts';

const root = mkdtempSync(join(tmpdir(), 'parley-folders-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

/** A pid that existed and is gone: a child that has exited. */
function deadPid(): number {
  return Number(spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout);
}

describe('stale sandbox folders', () => {
  it("removes a dead server's folder and keeps a live one's, another process's with a reused pid, and another user's", () => {
    const mine = makeSandboxFolder(root);
    const dead = join(root, `${SANDBOX_FOLDER_PREFIX}dead`);
    mkdirSync(dead);
    writeFileSync(join(dead, 'owner.json'), JSON.stringify({ pid: deadPid(), startTicks: 1 }));
    writeFileSync(join(dead, 'property-child.cjs'), 'bundle');
    // This process's pid with another start time: the pid was reused, the owner is gone.
    const reused = join(root, `${SANDBOX_FOLDER_PREFIX}reused`);
    mkdirSync(reused);
    writeFileSync(join(reused, 'owner.json'), JSON.stringify({ pid: process.pid, startTicks: 1 }));
    const unownedFresh = join(root, `${SANDBOX_FOLDER_PREFIX}fresh`);
    mkdirSync(unownedFresh);
    const unownedOld = join(root, `${SANDBOX_FOLDER_PREFIX}old`);
    mkdirSync(unownedOld);
    const dayAgo = (Date.now() - 25 * 60 * 60 * 1_000) / 1_000;
    utimesSync(unownedOld, dayAgo, dayAgo);
    const unrelated = join(root, 'parley-data-x');
    mkdirSync(unrelated);
    // Another user's folder is theirs to remove (checked where the test can give one away: as root).
    const others = join(root, `${SANDBOX_FOLDER_PREFIX}others`);
    mkdirSync(others);
    writeFileSync(join(others, 'owner.json'), JSON.stringify({ pid: deadPid(), startTicks: 1 }));
    if (process.getuid?.() === 0) chownSync(others, 65_534, 65_534);
    else rmSync(others, { recursive: true });

    const removed = removeStaleSandboxFolders(root);
    expect(removed.sort()).toEqual([dead, unownedOld, reused].sort());
    for (const kept of [mine, unownedFresh, unrelated]) expect(existsSync(kept)).toBe(true);
    if (process.getuid?.() === 0) expect(existsSync(others)).toBe(true);
  });
});
