/**
 * `npm run bench:analyze`: how fast `parley analyze` reads a long trace, against the floor of
 * Node reading the same file line by line and JSON.parse-ing each line, in the same run.
 *
 * The trace: 1.2 million JSON Lines of a programmable (PPS) contract kept alive once a second
 * (Request, Accept, PS_RDY and their GoodCRCs) with VBUS readings every 100 ms and a Hard Reset and
 * new negotiation every ten minutes, written to a temporary folder. Both sides run as child
 * processes; each is timed three times and the best run counts (the machine is shared).
 * Targets: the CLI within 3× the floor, and at most 300 MB peak memory.
 *
 * The same trace as a plain-text log (docs/trace.md "Plain text": `0.152000 SRC a1 61 …`,
 * `0.181 VBUS 5030mV 410mA`), against its own floor: reading the file line by line and splitting each
 * line into its whitespace-separated tokens, the least any reader of that format does. Target ≤ 2×.
 *
 * Both formats at three sizes (PARLEY_BENCH_SIZES, default 0.3, 0.6 and 1.2 M lines) for the growth;
 * the targets are judged at the largest. The CLI is bundled afresh first, as `npm test` does.
 */
import { execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeSynthetic } from '../tests/support/synthetic-trace.ts';
import { report } from './report.ts';

const SIZES = (process.env.PARLEY_BENCH_SIZES ?? process.env.PARLEY_BENCH_LINES ?? '300000,600000,1200000')
  .split(',')
  .map(Number)
  .filter((n) => n > 0)
  .sort((a, b) => a - b);
const RUNS = Number(process.env.PARLEY_BENCH_RUNS ?? 3);
const RATIO_TARGET = 3;
const RSS_TARGET_MB = 300;
const TEXT_RATIO_TARGET = 2;
const ROOT = join(import.meta.dirname, '..');
const TITLE = 'Kestrel K65 on bench 2, overnight PPS soak';

const FLOOR = `
import { createReadStream } from 'node:fs';
import { createInterface } from 'node:readline';
let n = 0;
const rl = createInterface({ input: createReadStream(process.argv[1], { encoding: 'utf8' }), crlfDelay: Infinity });
for await (const line of rl) { if (line.length > 0) { JSON.parse(line); n++; } }
process.stdout.write(String(n));
`;

const TEXT_FLOOR = `
import { createReadStream } from 'node:fs';
import { createInterface } from 'node:readline';
let n = 0;
const rl = createInterface({ input: createReadStream(process.argv[1], { encoding: 'utf8' }), crlfDelay: Infinity });
for await (const line of rl) { if (line.length > 0) n += line.split(/\\s+/).length; }
process.stdout.write(String(n));
`;

interface RunResult {
  ms: number;
  /** User + system CPU time from /usr/bin/time (undefined without it): steadier than wall time on a shared machine. */
  cpuMs: number | undefined;
  stdout: string;
  maxRssKb: number | undefined;
  code: number | null;
}

function timed(command: string, args: string[], env: NodeJS.ProcessEnv = {}): Promise<RunResult> {
  const useTime = existsSync('/usr/bin/time');
  const file = useTime ? '/usr/bin/time' : command;
  const argv = useTime ? ['-v', command, ...args] : args;
  return new Promise((resolveRun, reject) => {
    const start = process.hrtime.bigint();
    const child = spawn(file, argv, { cwd: ROOT, env: { ...process.env, ...env } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => {
      const ms = Number(process.hrtime.bigint() - start) / 1e6;
      const fromTime = /Maximum resident set size \(kbytes\): (\d+)/.exec(stderr);
      const fromChild = /maxRSS (\d+) KiB/.exec(stderr);
      const kb = fromTime ? Number(fromTime[1]) : fromChild ? Number(fromChild[1]) : undefined;
      const user = /User time \(seconds\): ([\d.]+)/.exec(stderr);
      const system = /System time \(seconds\): ([\d.]+)/.exec(stderr);
      const cpuMs = user && system ? (Number(user[1]) + Number(system[1])) * 1_000 : undefined;
      resolveRun({ ms, cpuMs, stdout, maxRssKb: kb, code });
    });
  });
}

interface Measured {
  floorMs: number;
  cliMs: number;
  cliRssKb: number;
  summary: string;
}

/**
 * Best of RUNS for the floor script and `parley analyze --json` on one file. The time compared is
 * CPU time (user + system) when /usr/bin/time gives it — wall time swings with the load of a
 * shared machine, CPU time much less — else wall time; both are printed.
 */
async function measure(file: string, floorScript: string, label: string): Promise<Measured> {
  const m: Measured = { floorMs: Infinity, cliMs: Infinity, cliRssKb: 0, summary: '' };
  for (let run = 0; run < RUNS; run++) {
    const floor = await timed(process.execPath, ['--input-type=module', '-e', floorScript, file]);
    if (floor.code !== 0) throw new Error(`the floor script failed (exit ${floor.code})`);
    m.floorMs = Math.min(m.floorMs, floor.cpuMs ?? floor.ms);
    const cli = await timed(process.execPath, [join(ROOT, 'cli/parley.js'), 'analyze', file, '--json'], { PARLEY_REPORT_RSS: '1' });
    if (cli.code !== 0) throw new Error(`parley analyze failed (exit ${cli.code}): ${cli.stdout.slice(0, 300)}`);
    m.cliMs = Math.min(m.cliMs, cli.cpuMs ?? cli.ms);
    m.cliRssKb = Math.max(m.cliRssKb, cli.maxRssKb ?? 0);
    const out = JSON.parse(cli.stdout) as { messages: number; summary: string; counts: Record<string, number> };
    m.summary = `${out.messages.toLocaleString('en')} messages; ${out.summary}`;
    const cpu = (r: RunResult) => (r.cpuMs === undefined ? '' : ` (CPU ${(r.cpuMs / 1000).toFixed(2)} s)`);
    console.log(
      `${label} run ${run + 1}: floor ${(floor.ms / 1000).toFixed(2)} s${cpu(floor)}, parley analyze ${(cli.ms / 1000).toFixed(2)} s${cpu(cli)}, peak ${((cli.maxRssKb ?? 0) / 1024).toFixed(0)} MB`,
    );
  }
  return m;
}

interface SizeResult {
  lines: number;
  jsonl: Measured;
  text: Measured;
}

const millions = (lines: number) => `${(lines / 1e6).toFixed(1)} M`;

async function main(): Promise<void> {
  execFileSync(process.execPath, [join(ROOT, 'cli', 'build.mjs')], { stdio: 'inherit' });
  const dir = mkdtempSync(join(tmpdir(), 'parley-bench-'));
  try {
    const results: SizeResult[] = [];
    for (const size of SIZES) {
      const file = join(dir, `soak-${size}.trace.jsonl`);
      const textFile = join(dir, `soak-${size}.log`);
      const genStart = performance.now();
      const { lines } = writeSynthetic(file, { format: 'jsonl', until: { lines: size }, title: TITLE });
      writeSynthetic(textFile, { format: 'text', until: { lines: size }, title: TITLE });
      console.log(
        `trace: ${lines.toLocaleString('en')} lines, ${(statSync(file).size / 1e6).toFixed(1)} MB as JSON Lines, ${(statSync(textFile).size / 1e6).toFixed(1)} MB as text (written in ${((performance.now() - genStart) / 1000).toFixed(1)} s)`,
      );
      const jsonl = await measure(file, FLOOR, `JSON Lines ${millions(lines)}`);
      const text = await measure(textFile, TEXT_FLOOR, `text ${millions(lines)}`);
      results.push({ lines, jsonl, text });
      rmSync(file);
      rmSync(textFile);
    }
    const largest = results[results.length - 1]!;
    const { lines, jsonl, text } = largest;
    const ratio = jsonl.cliMs / jsonl.floorMs;
    const textRatio = text.cliMs / text.floorMs;
    const rssMb = Math.max(jsonl.cliRssKb, text.cliRssKb) / 1024;
    console.log(`analysis (JSON Lines): ${jsonl.summary}`);
    console.log(`analysis (text):       ${text.summary}`);
    for (const r of results) {
      console.log(
        `${millions(r.lines)} lines: JSON Lines ${(r.jsonl.cliMs / 1000).toFixed(2)} s vs floor ${(r.jsonl.floorMs / 1000).toFixed(2)} s (${(r.jsonl.cliMs / r.jsonl.floorMs).toFixed(2)}×); text ${(r.text.cliMs / 1000).toFixed(2)} s vs floor ${(r.text.floorMs / 1000).toFixed(2)} s (${(r.text.cliMs / r.text.floorMs).toFixed(2)}×); peak ${(Math.max(r.jsonl.cliRssKb, r.text.cliRssKb) / 1024).toFixed(0)} MB`,
      );
    }
    console.log(`JSON Lines floor (readline + JSON.parse): ${(jsonl.floorMs / 1000).toFixed(2)} s; parley analyze --json: ${(jsonl.cliMs / 1000).toFixed(2)} s`);
    console.log(`ratio: ${ratio.toFixed(2)}× (target ≤ ${RATIO_TARGET}×) ${ratio <= RATIO_TARGET ? 'met' : 'NOT met'}`);
    console.log(`text floor (readline + split into tokens): ${(text.floorMs / 1000).toFixed(2)} s; parley analyze --json: ${(text.cliMs / 1000).toFixed(2)} s`);
    console.log(`text ratio: ${textRatio.toFixed(2)}× (target ≤ ${TEXT_RATIO_TARGET}×) ${textRatio <= TEXT_RATIO_TARGET ? 'met' : 'NOT met'}`);
    console.log(`peak memory: ${rssMb.toFixed(0)} MB (target ≤ ${RSS_TARGET_MB} MB) ${rssMb <= RSS_TARGET_MB ? 'met' : 'NOT met'}`);
    const growth = (value: (r: SizeResult) => number) => results.map((r) => ({ size: `${millions(r.lines)} lines`, value: value(r) }));
    report('analyze', [
      {
        figure: `parley analyze --json, ${millions(lines)} JSON Lines (CPU time)`,
        unit: 's',
        parley: jsonl.cliMs / 1000,
        peer: jsonl.floorMs / 1000,
        peerName: 'readline + JSON.parse',
        growth: growth((r) => r.jsonl.cliMs / 1000),
        target: `≤ ${RATIO_TARGET}× floor`,
        met: ratio <= RATIO_TARGET,
      },
      {
        figure: `parley analyze --json, ${millions(lines)} text lines (CPU time)`,
        unit: 's',
        parley: text.cliMs / 1000,
        peer: text.floorMs / 1000,
        peerName: 'readline + split',
        growth: growth((r) => r.text.cliMs / 1000),
        target: `≤ ${TEXT_RATIO_TARGET}× floor`,
        met: textRatio <= TEXT_RATIO_TARGET,
      },
      {
        figure: 'parley analyze, peak memory',
        unit: 'MB',
        parley: rssMb,
        growth: growth((r) => Math.max(r.jsonl.cliRssKb, r.text.cliRssKb) / 1024),
        target: `≤ ${RSS_TARGET_MB} MB`,
        met: rssMb <= RSS_TARGET_MB,
      },
    ]);
    if (ratio > RATIO_TARGET || textRatio > TEXT_RATIO_TARGET || rssMb > RSS_TARGET_MB) process.exitCode = 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
