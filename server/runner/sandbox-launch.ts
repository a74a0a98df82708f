/**
 * How the property sandbox starts its child (./property-sandbox.ts): the checker bundled into one
 * file, and the strongest isolation this machine offers, probed once. `unshare` with user, network
 * and pid namespaces takes the network and the view of other processes away (Node 20's permission
 * model covers neither); a root server drops the child to `nobody`.
 */
import { spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export interface SandboxInfo {
  /** `isolated`: a network namespace with no interfaces up; `shared`: the server's network. */
  network: 'isolated' | 'shared';
  /** The child sees only its own process (pid namespace). */
  pidNamespace: boolean;
  /** `nobody` when the server runs as root; else the server's own user. */
  user: 'nobody' | 'server';
  /** The bundled checker, the only file the child may read. */
  bundlePath: string;
}

const childEntry = fileURLToPath(new URL('./property-child.ts', import.meta.url));
const UNSHARE_CANDIDATES = ['/usr/bin/unshare', '/bin/unshare'];
const NOBODY_ID = 65_534;

export interface Launch {
  command: string;
  prefix: string[];
  uid?: number;
  gid?: number;
  info: SandboxInfo;
}

export async function bundleChecker(): Promise<{ dir: string; path: string }> {
  const { build } = await import('esbuild');
  const output = await build({ entryPoints: [childEntry], bundle: true, platform: 'node', format: 'cjs', target: 'node20', write: false, logLevel: 'silent', legalComments: 'none' });
  const text = output.outputFiles[0]?.text;
  if (text === undefined) throw new Error('esbuild wrote no bundle');
  // mkdtemp: a fresh folder no other user can have prepared; readable (not writable) by `nobody`.
  const dir = mkdtempSync(join(tmpdir(), 'parley-property-'));
  const path = join(dir, 'property-child.cjs');
  writeFileSync(path, text, { mode: 0o444 });
  chmodSync(dir, 0o755);
  return { dir, path };
}

function exitOf(command: string, args: string[], ids: { uid?: number; gid?: number }): Promise<number | null> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { env: {}, stdio: 'ignore', ...ids });
    child.on('error', () => resolve(null));
    child.on('close', (code) => resolve(code));
  });
}

export async function planLaunch(bundlePath: string, layers: 'all' | 'permission-only'): Promise<Launch> {
  if (layers === 'permission-only') return { command: process.execPath, prefix: [], info: { network: 'shared', pidNamespace: false, user: 'server', bundlePath } };
  const ids = process.getuid?.() === 0 ? { uid: NOBODY_ID, gid: NOBODY_ID } : {};
  const user = ids.uid === undefined ? 'server' : 'nobody';
  const unshare = UNSHARE_CANDIDATES.find((candidate) => existsSync(candidate));
  if (unshare !== undefined) {
    const prefix = ['--user', '--map-root-user', '--net', '--pid', '--fork', '--kill-child=SIGKILL', '--'];
    if ((await exitOf(unshare, [...prefix, process.execPath, '-e', '0'], ids)) === 0) {
      return { command: unshare, prefix: [...prefix, process.execPath], ...ids, info: { network: 'isolated', pidNamespace: true, user, bundlePath } };
    }
  }
  return { command: process.execPath, prefix: [], ...ids, info: { network: 'shared', pidNamespace: false, user, bundlePath } };
}
