/**
 * `npm run bench:analyze`: how fast `parley analyze` reads a long trace, against the floor of
 * Node reading the same file line by line and JSON.parse-ing each line, in the same run.
 *
 * The trace: 1.2 million JSON Lines of a programmable (PPS) contract kept alive once a second
 * (Request, Accept, PS_RDY and their GoodCRCs) with VBUS readings every 100 ms and a Hard Reset and
 * new negotiation every ten minutes, written to a temporary folder. Both sides run as child
 * processes; each is timed three times and the best run counts (the machine is shared).
 * Targets: the CLI within 3× the floor, and at most 300 MB peak memory.
 */
import { spawn } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, rmSync, statSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { report } from './report.ts';

const LINES = 1_200_000;
const RUNS = 3;
const RATIO_TARGET = 3;
const RSS_TARGET_MB = 300;
const ROOT = join(import.meta.dirname, '..');

/** Wire-order hex of a 16-bit header (USB PD R3.2 V1.1 Table 6.1), low byte first. */
const h16 = (v: number): string => (v & 0xff).toString(16).padStart(2, '0') + (v >> 8).toString(16).padStart(2, '0');
const CAPS = 'a1412c9101002cd102002cb104003c21dcc0';
/** PPS RDO for object 4, 8.4 V 2.5 A (0x40034832), little-endian. */
const PPS_RDO = '32480340';

function writeTrace(path: string): number {
  const fd = openSync(path, 'w');
  let buffer: string[] = [];
  let lines = 0;
  const emit = (line: string) => {
    buffer.push(line);
    lines++;
    if (buffer.length >= 10_000) flush();
  };
  const flush = () => {
    writeSync(fd, buffer.join('\n') + '\n');
    buffer = [];
  };
  emit('{"trace": 1, "title": "Kestrel K65 on bench 2, overnight PPS soak", "capturedAt": "2026-11-30T09:12:00Z"}');
  let t = 0;
  let sinkId = 0;
  let sourceId = 0;
  let cycle = 0;
  const msg = (at: number, hex: string, from: string) => emit(`{"t": ${at}, "msg": "${hex}", "from": "${from}"}`);
  const negotiateStart = () => {
    emit(`{"t": ${t}, "event": "attach", "cc": "CC1", "rp": "3.0A"}`);
    msg(t + 150_000, CAPS, 'source');
    msg(t + 151_100, h16(0x0081), 'sink');
    sinkId = 0;
    sourceId = 1;
    t += 155_000;
  };
  negotiateStart();
  while (lines < LINES) {
    // Request (sink), GoodCRC, Accept, GoodCRC, PS_RDY, GoodCRC — USB PD R3.2 V1.1 §8.3.2.2 (from memory).
    msg(t, h16(0x1082 | (sinkId << 9)) + PPS_RDO, 'sink');
    msg(t + 700, h16(0x01a1 | (sinkId << 9)), 'source');
    msg(t + 3_000, h16(0x01a3 | (sourceId << 9)), 'source');
    msg(t + 3_560, h16(0x0081 | (sourceId << 9)), 'sink');
    const next = (sourceId + 1) & 7;
    msg(t + 23_000, h16(0x01a6 | (next << 9)), 'source');
    msg(t + 23_560, h16(0x0081 | (next << 9)), 'sink');
    sinkId = (sinkId + 1) & 7;
    sourceId = (next + 1) & 7;
    for (let k = 0; k < 10; k++) emit(`{"t": ${t + 50_000 + k * 100_000}, "vbus": {"mv": ${8_380 + ((cycle * 7 + k * 13) % 50)}, "ma": ${2_100 + ((cycle + k) % 300)}}}`);
    t += 1_000_000;
    cycle++;
    if (cycle % 600 === 0) {
      emit(`{"t": ${t}, "event": "hard_reset", "from": "sink"}`);
      t += 1_000_000;
      negotiateStart();
    }
  }
  flush();
  closeSync(fd);
  return lines;
}

const FLOOR = `
import { createReadStream } from 'node:fs';
import { createInterface } from 'node:readline';
let n = 0;
const rl = createInterface({ input: createReadStream(process.argv[1], { encoding: 'utf8' }), crlfDelay: Infinity });
for await (const line of rl) { if (line.length > 0) { JSON.parse(line); n++; } }
process.stdout.write(String(n));
`;

interface RunResult {
  ms: number;
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
      resolveRun({ ms, stdout, maxRssKb: kb, code });
    });
  });
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'parley-bench-'));
  try {
    const file = join(dir, 'soak.trace.jsonl');
    const genStart = performance.now();
    const lines = writeTrace(file);
    const sizeMb = statSync(file).size / 1e6;
    console.log(`trace: ${lines.toLocaleString('en')} lines, ${sizeMb.toFixed(1)} MB (written in ${((performance.now() - genStart) / 1000).toFixed(1)} s)`);

    let floorMs = Infinity;
    let cliMs = Infinity;
    let cliRssKb = 0;
    let summary = '';
    for (let run = 0; run < RUNS; run++) {
      const floor = await timed(process.execPath, ['--input-type=module', '-e', FLOOR, file]);
      if (floor.code !== 0) throw new Error(`the floor script failed (exit ${floor.code})`);
      floorMs = Math.min(floorMs, floor.ms);
      const cli = await timed(process.execPath, [join(ROOT, 'cli/parley.js'), 'analyze', file, '--json'], { PARLEY_REPORT_RSS: '1' });
      if (cli.code !== 0) throw new Error(`parley analyze failed (exit ${cli.code}): ${cli.stdout.slice(0, 300)}`);
      cliMs = Math.min(cliMs, cli.ms);
      cliRssKb = Math.max(cliRssKb, cli.maxRssKb ?? 0);
      const out = JSON.parse(cli.stdout) as { messages: number; summary: string; counts: Record<string, number> };
      summary = `${out.messages.toLocaleString('en')} messages; ${out.summary}`;
      console.log(`run ${run + 1}: floor ${(floor.ms / 1000).toFixed(2)} s, parley analyze ${(cli.ms / 1000).toFixed(2)} s, peak ${((cli.maxRssKb ?? 0) / 1024).toFixed(0)} MB`);
    }
    const ratio = cliMs / floorMs;
    const rssMb = cliRssKb / 1024;
    console.log(`analysis: ${summary}`);
    console.log(`floor (readline + JSON.parse): ${(floorMs / 1000).toFixed(2)} s`);
    console.log(`parley analyze --json:         ${(cliMs / 1000).toFixed(2)} s`);
    console.log(`ratio: ${ratio.toFixed(2)}× (target ≤ ${RATIO_TARGET}×) ${ratio <= RATIO_TARGET ? 'met' : 'NOT met'}`);
    console.log(`peak memory: ${rssMb.toFixed(0)} MB (target ≤ ${RSS_TARGET_MB} MB) ${rssMb <= RSS_TARGET_MB ? 'met' : 'NOT met'}`);
    report('analyze', [
      { figure: `parley analyze --json, ${(lines / 1e6).toFixed(1)} M JSON Lines`, unit: 's', parley: cliMs / 1000, peer: floorMs / 1000, peerName: 'readline + JSON.parse', target: `≤ ${RATIO_TARGET}× floor`, met: ratio <= RATIO_TARGET },
      { figure: 'parley analyze, peak memory', unit: 'MB', parley: rssMb, target: `≤ ${RSS_TARGET_MB} MB`, met: rssMb <= RSS_TARGET_MB },
    ]);
    if (ratio > RATIO_TARGET || rssMb > RSS_TARGET_MB) process.exitCode = 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
