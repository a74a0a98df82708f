/**
 * The command tests' harness: `parley` run in-process through `runCli` with an io that collects
 * what the command prints, so a test asserts the exit code and the output as a user sees them.
 */
import type { CliIo } from './io.ts';
import { runCli } from './main.ts';

export type CapturedOutput = { stdout: string; stderr: string };

/** An io that collects stdout and stderr; `stdin` is what the command reads from `-`. */
export function captureIo(options: { cwd?: string; stdin?: string } = {}): { io: CliIo; out: CapturedOutput } {
  const out: CapturedOutput = { stdout: '', stderr: '' };
  const io: CliIo = {
    stdout: (text) => {
      out.stdout += text;
    },
    stderr: (text) => {
      out.stderr += text;
    },
    isTty: false,
    cwd: options.cwd ?? process.cwd(),
    readStdin: async () => options.stdin ?? '',
  };
  return { io, out };
}

/** `parley <argv>`: its exit code, what it printed, and its stdout read as JSON (for `--json`). */
export async function runCaptured<Json = Record<string, unknown>>(argv: string[], options: { cwd?: string; stdin?: string } = {}) {
  const { io, out } = captureIo(options);
  const code = await runCli(argv, io);
  return { code, stdout: out.stdout, stderr: out.stderr, json: () => JSON.parse(out.stdout) as Json };
}
