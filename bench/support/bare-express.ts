/**
 * The floor of the server benchmarks: a bare Express app with one JSON route, in a process of its
 * own, on a random loopback port. It prints the line `startChildServer` waits for.
 */
import express from 'express';
import type { AddressInfo } from 'node:net';

const app = express();
app.get('/bare', (_req, res) => {
  res.json({ ok: true });
});
const listening = app.listen(0, '127.0.0.1', () => {
  const { port } = listening.address() as AddressInfo;
  console.log(`Parley listening on http://127.0.0.1:${port} (bare Express floor)`);
});
process.on('SIGTERM', () => listening.close(() => process.exit(0)));
