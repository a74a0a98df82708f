/**
 * A stand-in for a server, for ./sandbox-escape.test.ts: makes a property sandbox in the mode
 * given as the first argument, prints its folder as one JSON line, and checks an endless
 * property, so the test can kill this process with SIGKILL and look at what remains.
 */
import { createPropertySandbox, type SandboxModeSetting } from './property-sandbox.ts';

const mode = (process.argv[2] ?? 'auto') as SandboxModeSetting;
// Long enough that only the death of this process can end the child during the test.
const sandbox = createPropertySandbox({ mode, maxConcurrent: 1, timeoutMs: 120_000 });
const info = await sandbox.info();
process.stdout.write(`${JSON.stringify({ mode: info.mode, bundlePath: info.bundlePath })}\n`);
await sandbox.check('export default ({ fc }) => fc.property(fc.constant(0), () => { for (;;) {} });', { runs: 1, seed: 1 });
