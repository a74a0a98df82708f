/**
 * The server under test for `npm run bench:api`, in a process of its own so that the load generator
 * does not share its event loop: Parley on a random loopback port and, beside it in the same
 * process, a bare Express app with one JSON route (the floor every route is compared with).
 */
import express from 'express';
import type { AddressInfo } from 'node:net';
import { startServer } from '../server/start.ts';

const dataDir = process.argv[2];
if (!dataDir) throw new Error('usage: api-server.ts <data folder>');
const server = await startServer({ port: 0, host: '127.0.0.1', dataDir, demo: false, log: false });
const bare = express();
bare.get('/bare', (_req, res) => {
  res.json({ ok: true });
});
const listening = bare.listen(0, '127.0.0.1', () => {
  const { port } = listening.address() as AddressInfo;
  process.stdout.write(`${JSON.stringify({ url: server.url, bare: `http://127.0.0.1:${port}` })}\n`);
});
process.on('SIGTERM', () => {
  listening.close();
  void server.close().then(() => process.exit(0));
});
