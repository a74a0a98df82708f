/**
 * How the property sandbox starts its child (./property-sandbox.ts): the checker bundled into one
 * file, and the strongest isolation this machine offers, probed once.
 *
 * - `bubblewrap` (Debian's `bwrap`): every namespace (user, pid, network, mount, IPC, UTS,
 *   cgroup), an empty root with read-only binds of just the Node binary, its shared libraries and
 *   the bundle, a fresh /proc and /dev, a small private /tmp and no /run; the child dies with the
 *   server (`--die-with-parent`). No host file, socket or process is in its view.
 * - `fallback` (no bwrap, or its start-up probe failed, or `PARLEY_SANDBOX=fallback`): the
 *   launcher of before: `unshare` with user, network and pid namespaces where it works, else
 *   plain Node; `setpriv --pdeathsig KILL` makes it die with the server.
 * Both: the OS limits of ./sandbox-limits.ts set on the child itself, Node's permission model
 * inside, an almost empty environment, and a root server drops the child to `nobody`.
 */
import { spawn } from 'node:child_process';
import { existsSync, realpathSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { cpuSecondsFor, CHILD_TASKS_HEADROOM, limitPrefix, limitTool, NODE_ADDRESS_SPACE_RESERVE_MB, tasksOwnedBy, type LimitTool } from './sandbox-limits.ts';
import { makeSandboxFolder } from './sandbox-folders.ts';
import type { SandboxIsolation } from '../../shared/api/index.ts';

/** `auto`: bubblewrap when it is installed and passes the probe, else the fallback. */
export type SandboxModeSetting = 'auto' | 'bubblewrap' | 'fallback';

/** The isolation of the API's shape, and what the server alone needs to know. */
export interface SandboxInfo extends SandboxIsolation {
  limits: { tool: LimitTool; heapMb: number; addressSpaceMb: number; cpuSeconds: number; tasksHeadroom: number };
  /** The bundled checker on the host, the only file the child may read. */
  bundlePath: string;
}

export interface ChildCommand {
  file: string;
  args: string[];
  uid?: number;
  gid?: number;
  env: Record<string, string>;
  cwd: string;
}

export interface Launch {
  info: SandboxInfo;
  /** Where the child sees the bundle. */
  bundleInChild: string;
  /** The command that runs `node ...nodeArgs` in the sandbox, limits set (the process limit is counted now). */
  command(nodeArgs: readonly string[]): Promise<ChildCommand>;
}

export interface LaunchOptions {
  mode: SandboxModeSetting;
  heapMb: number;
  timeoutMs: number;
  /** `permission-only`: plain Node with the permission model and nothing else (tests use it to see that layer alone). */
  layers: 'all' | 'permission-only';
}

const childEntry = fileURLToPath(new URL('./property-child.ts', import.meta.url));
const BWRAP_CANDIDATES = ['/usr/bin/bwrap', '/bin/bwrap'];
const UNSHARE_CANDIDATES = ['/usr/bin/unshare', '/bin/unshare'];
const SETPRIV_CANDIDATES = ['/usr/bin/setpriv', '/bin/setpriv'];
const NOBODY_ID = 65_534;
const BUNDLE_NAME = 'property-child.cjs';
const BUNDLE_IN_BWRAP = `/sandbox/${BUNDLE_NAME}`;
/** The child's private /tmp: Node writes nothing there, and the permission model forbids the code to. */
const BWRAP_TMP_BYTES = 1024 * 1024;
const PROBE_TIMEOUT_MS = 15_000;
/**
 * glibc gives each busy thread its own 64 MB malloc arena (8 per core by default), which would
 * make the address-space limit depend on the machine's cores; the child removes the variable
 * from `process.env` before any property code runs.
 */
const CHILD_ENV = { MALLOC_ARENA_MAX: '2' };

const findFirst = (candidates: readonly string[]): string | undefined => candidates.find((path) => existsSync(path));

export async function bundleChecker(): Promise<{ dir: string; path: string }> {
  const { build } = await import('esbuild');
  const output = await build({ entryPoints: [childEntry], bundle: true, platform: 'node', format: 'cjs', target: 'node20', write: false, logLevel: 'silent', legalComments: 'none' });
  const text = output.outputFiles[0]?.text;
  if (text === undefined) throw new Error('esbuild wrote no bundle');
  const dir = makeSandboxFolder();
  const path = join(dir, BUNDLE_NAME);
  writeFileSync(path, text, { mode: 0o444 });
  return { dir, path };
}

function run(command: string, args: readonly string[], options: { uid?: number; gid?: number; env?: Record<string, string> } = {}): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { env: options.env ?? {}, stdio: ['ignore', 'pipe', 'pipe'], uid: options.uid, gid: options.gid, timeout: PROBE_TIMEOUT_MS, killSignal: 'SIGKILL' });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString('utf8')));
    child.stderr.on('data', (chunk: Buffer) => (stderr = (stderr + chunk.toString('utf8')).slice(-2_000)));
    child.on('error', (error) => resolve({ code: null, stdout, stderr: error.message }));
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

/** The shared libraries the Node binary loads (the dynamic loader's own list), each as the loader names it. */
async function nodeLibraries(node: string): Promise<string[]> {
  const { code, stdout } = await run(node, [], { env: { LD_TRACE_LOADED_OBJECTS: '1' } });
  if (code !== 0) return [];
  const paths = stdout.split('\n').flatMap((line) => {
    const match = /(?:=>\s*)?(\/\S+)\s+\(0x[0-9a-f]+\)/.exec(line);
    return match ? [match[1]!] : [];
  });
  return [...new Set(paths)];
}

function bwrapArgs(node: string, libraries: readonly string[], bundlePath: string): string[] {
  const binds = [node, ...libraries, ...(existsSync('/etc/ld.so.cache') ? ['/etc/ld.so.cache'] : [])].flatMap((path) => ['--ro-bind', path, path]);
  return [
    '--unshare-all',
    '--die-with-parent',
    '--new-session',
    ...binds,
    '--ro-bind',
    bundlePath,
    BUNDLE_IN_BWRAP,
    '--proc',
    '/proc',
    '--dev',
    '/dev',
    '--size',
    String(BWRAP_TMP_BYTES),
    '--tmpfs',
    '/tmp',
    '--chdir',
    '/sandbox',
    '--',
  ];
}

function ids(): { uid?: number; gid?: number } {
  return process.getuid?.() === 0 ? { uid: NOBODY_ID, gid: NOBODY_ID } : {};
}

export async function planLaunch(bundlePath: string, options: LaunchOptions): Promise<Launch> {
  const node = realpathSync(process.execPath);
  const cwd = join(bundlePath, '..');
  const tool = limitTool();
  const addressSpaceMb = options.heapMb + NODE_ADDRESS_SPACE_RESERVE_MB;
  const cpuSeconds = cpuSecondsFor(options.timeoutMs);
  const limits = { tool, heapMb: options.heapMb, addressSpaceMb, cpuSeconds, tasksHeadroom: CHILD_TASKS_HEADROOM };
  const user = ids();
  const userName = user.uid === undefined ? 'server' : 'nobody';
  const limited = async (wrapper: readonly string[], nodeArgs: readonly string[]): Promise<ChildCommand> => {
    const taskUid = user.uid ?? process.getuid?.() ?? 0;
    const prefix = limitPrefix(tool, { addressSpaceMb, cpuSeconds, processes: (await tasksOwnedBy(taskUid)) + CHILD_TASKS_HEADROOM });
    const argv = [...prefix, ...wrapper, node, ...nodeArgs];
    return { file: argv[0]!, args: argv.slice(1), ...user, env: { ...CHILD_ENV }, cwd };
  };

  if (options.layers === 'permission-only') {
    const info: SandboxInfo = {
      mode: 'fallback',
      fallbackReason: 'the permission model alone (a test setting)',
      network: 'shared',
      pidNamespace: false,
      files: 'host',
      diesWithParent: false,
      user: 'server',
      limits: { ...limits, tool: 'none' },
      bundlePath,
    };
    return { info, bundleInChild: bundlePath, command: async (nodeArgs) => ({ file: node, args: [...nodeArgs], env: { ...CHILD_ENV }, cwd }) };
  }

  let fallbackReason = 'PARLEY_SANDBOX=fallback';
  if (options.mode !== 'fallback') {
    const bwrap = findFirst(BWRAP_CANDIDATES);
    if (bwrap === undefined) fallbackReason = 'bubblewrap (bwrap) is not installed: apt-get install bubblewrap';
    else {
      const wrapper = [bwrap, ...bwrapArgs(node, await nodeLibraries(node), bundlePath)];
      const probe = await limited(wrapper, ['-e', `process.exit(require('node:fs').existsSync(${JSON.stringify(BUNDLE_IN_BWRAP)}) ? 0 : 3)`]);
      const result = await run(probe.file, probe.args, probe);
      if (result.code === 0) {
        const info: SandboxInfo = { mode: 'bubblewrap', fallbackReason: null, network: 'isolated', pidNamespace: true, files: 'minimal', diesWithParent: true, user: userName, limits, bundlePath };
        return { info, bundleInChild: BUNDLE_IN_BWRAP, command: (nodeArgs) => limited(wrapper, nodeArgs) };
      }
      const why = result.stderr.trim().split('\n').at(-1) || `exit code ${String(result.code)}`;
      fallbackReason = `bubblewrap failed its start-up probe (${why})`;
    }
    if (options.mode === 'bubblewrap') throw new Error(`PARLEY_SANDBOX=bubblewrap, but ${fallbackReason}`);
  }

  const setpriv = findFirst(SETPRIV_CANDIDATES);
  const dieWithParent = setpriv === undefined ? [] : [setpriv, '--pdeathsig', 'KILL', '--'];
  const unshare = findFirst(UNSHARE_CANDIDATES);
  if (unshare !== undefined) {
    const wrapper = [...dieWithParent, unshare, '--user', '--map-root-user', '--net', '--pid', '--fork', '--kill-child=SIGKILL', '--'];
    const probe = await limited(wrapper, ['-e', '0']);
    if ((await run(probe.file, probe.args, probe)).code === 0) {
      const info: SandboxInfo = { mode: 'fallback', fallbackReason, network: 'isolated', pidNamespace: true, files: 'host', diesWithParent: setpriv !== undefined, user: userName, limits, bundlePath };
      return { info, bundleInChild: bundlePath, command: (nodeArgs) => limited(wrapper, nodeArgs) };
    }
  }
  const info: SandboxInfo = { mode: 'fallback', fallbackReason, network: 'shared', pidNamespace: false, files: 'host', diesWithParent: setpriv !== undefined, user: userName, limits, bundlePath };
  return { info, bundleInChild: bundlePath, command: (nodeArgs) => limited(dieWithParent, nodeArgs) };
}
