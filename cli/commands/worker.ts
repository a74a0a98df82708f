/**
 * `parley worker`: works on the shared job queue of a team deployment (DATABASE_URL) without
 * serving HTTP, until SIGINT or SIGTERM, which hand its running jobs back to the queue.
 */
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { CliError, type CliIo } from '../io.ts';

/**
 * The server is not part of the command-line bundle (build/): it is loaded from the repository,
 * through tsx, by a specifier the bundler leaves alone.
 */
async function loadWorker(): Promise<typeof import('../../server/worker.ts')> {
  const root = fileURLToPath(new URL(process.env.PARLEY_BUNDLED ? '..' : '../..', import.meta.url));
  const { register } = await import('tsx/esm/api');
  register();
  const specifier = pathToFileURL(join(root, 'server', 'worker.ts')).href;
  return (await import(specifier)) as typeof import('../../server/worker.ts');
}

export async function run(args: string[], io: CliIo): Promise<number> {
  if (args.some((a) => a !== '--json')) throw new CliError('usage', `worker takes no arguments (got ${args.join(' ')}); it reads DATABASE_URL and the other server settings from the environment`);
  // Checked before the server is loaded: without a queue there is nothing to serve, and loading takes seconds.
  if (!process.env.DATABASE_URL) throw new CliError('worker.config', 'parley worker needs DATABASE_URL (a postgres:// URL): without it the server runs its jobs itself');
  const { startWorker } = await loadWorker();
  let worker: Awaited<ReturnType<typeof startWorker>>;
  try {
    worker = await startWorker();
  } catch (error) {
    throw new CliError('worker.config', error instanceof Error ? error.message : String(error));
  }
  await new Promise<void>((resolveStop) => {
    const stop = () => resolveStop();
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  });
  await worker.close();
  io.stderr('parley worker stopped\n');
  return 0;
}
