import { startServer } from './start.ts';

/** `npm start`: the server on PORT with the environment's settings, stopped cleanly by SIGINT/SIGTERM. */
const running = await startServer().catch((error: unknown) => {
  // A bad setting or an unreachable database: one line that says which, not a stack trace.
  console.error(`Parley could not start: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    // A stuck connection must not keep the process alive forever.
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    running.close().then(
      () => process.exit(0),
      (err: unknown) => {
        console.error(err);
        process.exit(1);
      },
    );
  });
}
