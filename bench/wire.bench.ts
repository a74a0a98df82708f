/**
 * `npm run bench:wire`: `parley wire decode --json` on CC-line captures of 20k, 80k and 320k
 * messages (growth) and 640k (the size that used to fail), each a child process whose peak memory
 * is read by /usr/bin/time. Peer in the same run: Debian's sigrok-cli with its usb_power_delivery
 * decoder and Parley on one file of 2k messages (sigrok takes minutes for 20k), when it is installed. Targets: 640k succeeds, with a
 * peak within 1.3× of the 20k peak. Also `--jsonl` at 320k.
 * The captures are Kestrel Devices demo negotiations (Source_Capabilities, Request, Accept, PS_RDY,
 * each with its GoodCRC), BMC-coded at 300 kbps with 1 ns timescale, written in pieces to a
 * temporary folder (the largest is over a gigabyte, more than one string can hold).
 */
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, rmSync, statSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseHex } from '../shared/pd/index.ts';
import { bmcEncode, packetBits, type WirePacket } from '../shared/wire/index.ts';
import { report, type BenchPoint } from './report.ts';

const ROOT = join(import.meta.dirname, '..');
const SIZES = (process.env.PARLEY_WIRE_SIZES ?? '20000,80000,320000,640000').split(',').map(Number);
const PEAK_RATIO_TARGET = 1.3;
const PEER_SIZE = 2_000;

// 5 V/9 V/15 V fixed and PPS 3.3–11 V (header 0x41a1), a fixed Request for object 2, Accept, PS_RDY, GoodCRCs.
const NEGOTIATION = ['a1412c9101002cd102002cb104003c21dcc0', '4100', '82102cb10423', '6101', 'a103', '4103', 'a605', '6105'];
const PACKETS: WirePacket[] = NEGOTIATION.map((hex) => {
  const p = parseHex(hex);
  if (!p.ok) throw new Error(p.error.message);
  return { sop: 'SOP', bytes: p.bytes };
});

function writeCapture(path: string, messages: number): number {
  const fd = openSync(path, 'w');
  writeSync(fd, '$timescale 1 ns $end\n$scope module bench $end\n$var wire 1 ! cc $end\n$upscope $end\n$enddefinitions $end\n#0\n0!\n');
  const uiUs = 1_000_000 / 300_000;
  let cursorUs = 500;
  let high = false;
  let lastNs = 0;
  let buffer: string[] = [];
  for (let m = 0; m < messages; m++) {
    const { edgesUs, endUs } = bmcEncode(packetBits(PACKETS[m % PACKETS.length]!), cursorUs, uiUs);
    for (const t of edgesUs) {
      high = !high;
      lastNs = Math.max(lastNs + 1, Math.round(t * 1000));
      buffer.push(`#${lastNs}\n${high ? '1' : '0'}!`);
    }
    cursorUs = endUs + 300;
    if (buffer.length > 50_000) {
      writeSync(fd, buffer.join('\n') + '\n');
      buffer = [];
    }
  }
  buffer.push(`#${Math.round((cursorUs + 2_000) * 1000)}`);
  writeSync(fd, buffer.join('\n') + '\n');
  closeSync(fd);
  return statSync(path).size;
}

interface Run {
  seconds: number;
  peakMb: number;
  code: number | null;
  stdoutBytes: number;
  tail: string;
}

/** Runs a command with stdout counted and dropped, timing it and reading its peak memory. */
function measure(command: string, args: string[], env: NodeJS.ProcessEnv = {}): Promise<Run> {
  const useTime = existsSync('/usr/bin/time');
  return new Promise((done, reject) => {
    const start = performance.now();
    const child = spawn(useTime ? '/usr/bin/time' : command, useTime ? ['-v', command, ...args] : args, { cwd: ROOT, env: { ...process.env, ...env } });
    let stdoutBytes = 0;
    let tail = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => {
      stdoutBytes += d.length;
      tail = (tail + d.toString()).slice(-200);
    });
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => {
      const kb = /Maximum resident set size \(kbytes\): (\d+)/.exec(stderr);
      done({ seconds: (performance.now() - start) / 1000, peakMb: kb ? Number(kb[1]) / 1024 : NaN, code, stdoutBytes, tail: code === 0 ? tail : stderr.slice(-300) });
    });
  });
}

const hasSigrok = spawnSync('sigrok-cli', ['--version'], { encoding: 'utf8' }).status === 0;
const dir = mkdtempSync(join(tmpdir(), 'parley-wire-bench-'));
const cli = join(ROOT, 'cli/parley.js');
const label = (n: number) => `${n / 1000}k`;
try {
  const peaks: BenchPoint[] = [];
  const times: BenchPoint[] = [];
  let sigrokRun: Run | undefined;
  let first: Run | undefined;
  let largest: Run | undefined;
  for (const n of SIZES) {
    const file = join(dir, `capture-${n}.vcd`);
    const bytes = writeCapture(file, n);
    const run = await measure(process.execPath, [cli, 'wire', 'decode', file, '--json']);
    const closed = run.code === 0 && /"ok": true\n\}\n$/.test(run.tail);
    console.log(
      `${label(n).padStart(5)} messages, ${(bytes / 1e6).toFixed(0)} MB VCD: wire decode --json ${run.seconds.toFixed(1)} s, peak ${run.peakMb.toFixed(0)} MB, ${(run.stdoutBytes / 1e6).toFixed(0)} MB of JSON, ${closed ? 'complete' : `FAILED (exit ${run.code}): ${run.tail}`}`,
    );
    if (!closed) process.exitCode = 1;
    peaks.push({ size: label(n), value: run.peakMb });
    times.push({ size: label(n), value: (run.seconds * 1e9) / n / 1000 });
    first ??= run;
    largest = run;
    if (n === 320_000) {
      const jsonl = await measure(process.execPath, [cli, 'wire', 'decode', file, '--jsonl']);
      console.log(`       --jsonl: ${jsonl.seconds.toFixed(1)} s, peak ${jsonl.peakMb.toFixed(0)} MB`);
    }
    rmSync(file, { force: true });
  }
  let small: Run | undefined;
  if (hasSigrok) {
    const file = join(dir, `capture-${PEER_SIZE}.vcd`);
    writeCapture(file, PEER_SIZE);
    small = await measure(process.execPath, [cli, 'wire', 'decode', file, '--json']);
    sigrokRun = await measure('sigrok-cli', ['-i', file, '-I', 'vcd', '-P', 'usb_power_delivery', '-A', 'usb_power_delivery=data']);
    console.log(
      `${label(PEER_SIZE).padStart(5)} messages: wire decode --json ${small.seconds.toFixed(1)} s, peak ${small.peakMb.toFixed(0)} MB; sigrok-cli usb_power_delivery on the same file ${sigrokRun.seconds.toFixed(1)} s, peak ${sigrokRun.peakMb.toFixed(0)} MB`,
    );
  } else console.log('sigrok-cli is not installed: no peer figure (apt-get install sigrok-cli)');
  const ratio = largest && first ? largest.peakMb / first.peakMb : NaN;
  console.log(`peak at ${label(SIZES[SIZES.length - 1]!)} / peak at ${label(SIZES[0]!)} = ${ratio.toFixed(2)}× (target ≤ ${PEAK_RATIO_TARGET}×): ${ratio <= PEAK_RATIO_TARGET ? 'met' : 'NOT met'}`);
  const n0 = SIZES[0]!;
  report('wire', [
    ...(small && sigrokRun
      ? [
          { figure: `wire decode --json, ${label(PEER_SIZE)} messages`, unit: 's', parley: small.seconds, peer: sigrokRun.seconds, peerName: 'sigrok-cli, same VCD' },
          { figure: `wire decode --json, peak memory, ${label(PEER_SIZE)} messages`, unit: 'MB', parley: small.peakMb, peer: sigrokRun.peakMb, peerName: 'sigrok-cli, same VCD' },
        ]
      : []),
    {
      figure: 'wire decode --json, peak memory by size',
      unit: 'MB',
      parley: largest?.peakMb ?? NaN,
      peer: first?.peakMb,
      peerName: `own peak at ${label(n0)}`,
      growth: peaks,
      target: `≤ ${PEAK_RATIO_TARGET}× the ${label(n0)} peak`,
      met: ratio <= PEAK_RATIO_TARGET,
    },
    { figure: 'wire decode --json, time per message by size', unit: 'µs/msg', parley: times[times.length - 1]?.value ?? NaN, growth: times },
  ]);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
