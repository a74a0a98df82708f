/**
 * The `parley` command line (docs/cli.md). Each command lives in `commands/<name>.ts`
 * and exports `run(args, io)` returning the exit code; this file only dispatches and maps errors.
 */
import { readFileSync } from 'node:fs';
import { CliError, EXIT_BAD_INPUT, printJson, type CliIo } from './io.ts';

type CommandModule = { run(args: string[], io: CliIo): Promise<number> };

/** Command name → summary and lazy loader (lazy so `parley decode` does not load the simulator). */
export const commands: Record<string, { summary: string; load: () => Promise<CommandModule> }> = {
  // One line per command, in the order of docs/cli.md; each module is `commands/<name>.ts`.
  decode: { summary: "decode one message: decode <hex>… [--words] [--crc] [--sop SOP|SOP'|SOP''] [--caps <hex>]", load: () => import('./commands/decode.ts') },
  encode: { summary: 'encode a Message (JSON file, or - for stdin) to wire hex', load: () => import('./commands/encode.ts') },
  wire: { summary: 'CC-line waveforms: wire encode <hex>… --vcd <out.vcd>, wire decode <in.vcd> [--signal NAME]', load: () => import('./commands/wire.ts') },
  caps: { summary: 'check Source_Capabilities: caps <hex>… | --pdos 0x…,0x… [--pdp W] [--cable 3000|5000] [--label "…"]', load: () => import('./commands/caps.ts') },
  request: { summary: 'the Request a sink policy sends: request --caps <hex> --sink <json|file> [--cable 3000|5000]', load: () => import('./commands/request.ts') },
  simulate: { summary: 'run a negotiation scenario: simulate <scenario.json|-> [--trace <out.trace.jsonl>] [--samples] [--json]', load: () => import('./commands/simulate.ts') },
  analyze: { summary: 'decode and check a trace: analyze <file> [--format auto|jsonl|text|vcd] [--fail-on error|warning] [--json]', load: () => import('./commands/analyze.ts') },
  sweep: {
    summary: 'fault campaign over a scenario: sweep <scenario.json|-> [--faults drop,corrupt,delay] [--pairs] [--timers edges] [--max N] [--shard i/n] [--junit <file>] [--out <dir>]',
    load: () => import('./commands/sweep.ts'),
  },
  run: { summary: 'run vector files or folders of them (--filter <glob>, --junit <file>)', load: () => import('./commands/run.ts') },
  schema: { summary: 'print the JSON Schema of vector, scenario or trace', load: () => import('./commands/schema.ts') },
  worker: { summary: 'work on the shared job queue of a team deployment (DATABASE_URL), serving no HTTP', load: () => import('./commands/worker.ts') },
};

export function version(): string {
  const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };
  return pkg.version;
}

function helpText(): string {
  const width = Math.max(...Object.keys(commands).map((name) => name.length));
  const lines = Object.entries(commands).map(([name, c]) => `  ${name.padEnd(width)}  ${c.summary}`);
  return [
    'parley — USB Power Delivery codec, rules, simulator, trace analysis and test vectors',
    '',
    'Usage: parley <command> [options]   (from the repository: npm run -s parley -- <command> …)',
    '',
    'Commands:',
    ...lines,
    '',
    'Options for every command: --json (one JSON document on stdout), --help',
    'Exit codes: 0 ran, 1 checks failed (run, --fail-on), 2 bad input or usage.',
    '',
  ].join('\n');
}

/** Runs one command line; never throws, never prints a stack trace. */
export async function runCli(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  const json = rest.includes('--json');
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout(helpText());
    return 0;
  }
  if (name === '--version' || name === '-v') {
    io.stdout(`${version()}\n`);
    return 0;
  }
  try {
    // Own keys only, so `parley toString` is an unknown command rather than Object.prototype's.
    const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
    if (!command) throw new CliError('usage', `unknown command "${name}"; run "parley --help" for the list`);
    const module = await command.load();
    return await module.run(rest, io);
  } catch (error) {
    // Anything but a CliError is a bug of ours that slipped through: say so, still in one line.
    const cliError = error instanceof CliError ? error : new CliError('cli.internal', `internal error: ${error instanceof Error ? error.message : String(error)}`);
    const { code, where } = cliError;
    const message = oneLine(cliError.message);
    io.stderr(`parley ${name}: ${message}\n`);
    if (json) printJson(io, { ok: false, error: { code, message, ...where } });
    return EXIT_BAD_INPUT;
  }
}

const MESSAGE_MAX_CHARS = 400;

/** Messages echo the user's input: keep them to one line of readable length. */
function oneLine(message: string): string {
  const flat = message.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim();
  return flat.length > MESSAGE_MAX_CHARS ? `${flat.slice(0, MESSAGE_MAX_CHARS)}… (${flat.length} characters)` : flat;
}

const isEntry = process.argv[1] !== undefined && import.meta.url.endsWith(process.argv[1].replace(/\\/g, '/'));
if (isEntry || process.env.PARLEY_CLI_ENTRY === '1') {
  // A reader that closes early (`parley … | head`) is not an error of ours: stop quietly.
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw error;
  });
  const io: CliIo = {
    stdout: (text) => process.stdout.write(text),
    drain: () => (process.stdout.writableNeedDrain ? new Promise<void>((resolve) => process.stdout.once('drain', () => resolve())) : Promise.resolve()),
    stderr: (text) => process.stderr.write(text),
    isTty: Boolean(process.stdout.isTTY),
    cwd: process.cwd(),
    readStdin: async () => {
      const chunks: Buffer[] = [];
      for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
      return Buffer.concat(chunks).toString('utf8');
    },
  };
  runCli(process.argv.slice(2), io).then((code) => {
    process.exitCode = code;
  });
}
