/**
 * The sandboxed process that checks one property vector (bundled with esbuild into a single file
 * by ./property-sandbox.ts, then run by Node with the permission model). Protocol: one JSON
 * object `{ code, runs, seed }` on stdin; the `PropertyOutcome` of the shared checker as one JSON
 * line on stdout; then the process exits. The checker is the engine's own `checkProperty`, so the
 * verdict and counterexample are those of the CLI and the browser.
 *
 * Imports only `shared/` (bundled) and Node globals: the bundle must not need any file but itself.
 */
import { checkProperty, engine, type PropertyOutcome } from '../../shared/vectors/index.ts';

interface Job {
  code: string;
  runs: number;
  seed: number;
}

function readStdin(): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    process.stdin.on('data', (chunk: Buffer) => chunks.push(chunk));
    process.stdin.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    process.stdin.on('error', reject);
  });
}

function parseJob(text: string): Job {
  const job = JSON.parse(text) as Partial<Job>;
  if (typeof job.code !== 'string' || !Number.isInteger(job.runs) || !Number.isInteger(job.seed)) throw new Error('the job needs code, runs and seed');
  return job as Job;
}

/** Signals are outside the permission model: without a pid namespace the code could signal the server. */
function closeSignals(): void {
  const refuse = (): never => {
    throw new Error('process.kill is not available to a property');
  };
  Object.defineProperty(process, 'kill', { value: refuse, writable: false, configurable: false });
  Object.defineProperty(process, '_kill', { value: refuse, writable: false, configurable: false });
}

/**
 * Node 20's permission model does not cover sockets. Bubblewrap leaves the child no network and
 * no host socket file to reach; the fallback launcher may share both, so the child refuses every
 * connection and listener itself (the originals are out of reach: `process.binding` is closed
 * by the permission model, and the replaced methods cannot be redefined).
 */
function closeSockets(): void {
  const refuse = (): never => {
    throw new Error('sockets are not available to a property');
  };
  const seal = (target: object, key: string): void => {
    Object.defineProperty(target, key, { value: refuse, writable: false, configurable: false });
  };
  const net = process.getBuiltinModule('node:net') as typeof import('node:net');
  const dgram = process.getBuiltinModule('node:dgram') as typeof import('node:dgram');
  seal(net.Socket.prototype, 'connect');
  seal(net.Server.prototype, 'listen');
  for (const key of ['bind', 'connect', 'send']) seal(dgram.Socket.prototype, key);
}

/** stdout carries only the answer: whatever the property logs goes to stderr. */
function quietConsole(): void {
  const toStderr = (...args: unknown[]): void => {
    process.stderr.write(`${args.map(String).join(' ')}\n`);
  };
  console.log = toStderr;
  console.info = toStderr;
  console.debug = toStderr;
}

async function main(): Promise<void> {
  const job = parseJob(await readStdin());
  // The launcher sets MALLOC_ARENA_MAX for glibc and bubblewrap sets PWD: the property sees an empty environment.
  for (const key of Object.keys(process.env)) delete process.env[key];
  closeSignals();
  closeSockets();
  quietConsole();
  const outcome: PropertyOutcome = await checkProperty(job.code, { runs: job.runs, seed: job.seed }, engine);
  // A property may leave timers behind; exit once the answer is flushed.
  process.stdout.write(`${JSON.stringify(outcome)}\n`, () => process.exit(0));
}

main().catch((error: unknown) => {
  process.stderr.write(`property sandbox: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(2);
});
