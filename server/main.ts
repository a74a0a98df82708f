import { startServer } from './start.ts';

/** `npm start`: the server on PORT with the environment's settings, stopped cleanly by SIGINT/SIGTERM. */
const running = await startServer();

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
