import type { EngineError } from '../shared/core/result.ts';

/** Where a command writes; injected so tests run commands in-process. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /** True when stdout is a terminal (colours and tables for people). */
  isTty: boolean;
  cwd: string;
  readStdin(): Promise<string>;
  /** Resolves once stdout has taken what was written (so a long stream does not pile up in memory). */
  drain?(): Promise<void>;
}

/** Bad input or usage: exit code 2, one line on stderr, and the JSON error on stdout under --json. */
export class CliError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly where: { offset?: number; line?: number } = {},
  ) {
    super(message);
  }

  static from(error: EngineError): CliError {
    return new CliError(error.code, error.message, { offset: error.offset, line: error.line });
  }
}

export const EXIT_OK = 0;
export const EXIT_CHECKS_FAILED = 1;
export const EXIT_BAD_INPUT = 2;

/** Prints one JSON document (two-space indent) on stdout. */
export function printJson(io: CliIo, value: unknown): void {
  io.stdout(JSON.stringify(value, null, 2) + '\n');
}

/** Pads columns for a people-readable table. */
export function formatTable(rows: string[][]): string {
  const widths: number[] = [];
  for (const row of rows) {
    for (const [i, cell] of row.entries()) widths[i] = Math.max(widths[i] ?? 0, cell.length);
  }
  return rows.map((row) => row.map((cell, i) => (i === row.length - 1 ? cell : cell.padEnd(widths[i] ?? 0))).join('  ')).join('\n') + '\n';
}

/** Colours only on a TTY. */
export function paint(io: CliIo, colour: 'red' | 'yellow' | 'green' | 'dim' | 'bold', text: string): string {
  if (!io.isTty) return text;
  const codes = { red: 31, yellow: 33, green: 32, dim: 2, bold: 1 } as const;
  return `\u001b[${codes[colour]}m${text}\u001b[0m`;
}
