/**
 * `parley simulate <scenario.json|-> [--trace <out.trace.jsonl>] [--samples] [--json]`
 * (docs/cli.md): runs a negotiation scenario (vector.md) and prints its timeline.
 * `--trace` writes the timeline as a JSON Lines trace (header line first); `--samples` adds
 * `[t, mv, ma, sinkMv]` every 1 ms (`--sample-every-us N` to change it). Extensions in the
 * `--json` document: `contracts`, `lanes` and `timers`. Exit 0 when it ran, 2 on bad input.
 */
import { readFile, writeFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import type { Message, Rdo, SourcePdo } from '../../shared/pd/types.ts';
import { describePdo } from '../../shared/rules/index.ts';
import { parseScenario, sampleRows, simulate, type SimulationResult } from '../../shared/sim/index.ts';
import type { TraceRecord } from '../../shared/trace/records.ts';
import { CliError, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';
import { describeFindings, parseOptions } from './caps.ts';

const USAGE = 'simulate <scenario.json|-> [--trace <out.trace.jsonl>] [--samples] [--sample-every-us N] [--json]';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseOptions(args, { values: ['--trace', '--sample-every-us'], flags: ['--json', '--samples'], usage: USAGE });
  const [file, extra] = parsed.positional;
  if (file === undefined) throw new CliError('usage', `give a scenario file (or - for stdin); usage: parley ${USAGE}`);
  if (extra !== undefined) throw new CliError('usage', `unexpected argument "${extra}"; usage: parley ${USAGE}`);
  const everyText = parsed.values['--sample-every-us'];
  const sampleEveryUs = everyText === undefined ? 1_000 : Number(everyText);
  if (!Number.isInteger(sampleEveryUs) || sampleEveryUs < 10) throw new CliError('usage', '--sample-every-us: an integer of at least 10 (µs)');

  const scenario = parseScenario(await readJson(file, io));
  if (!scenario.ok) throw CliError.from(scenario.error);
  const samples = parsed.flags.has('--samples') || everyText !== undefined;
  const result = simulate(scenario.scenario, { samples, sampleEveryUs });

  const tracePath = parsed.values['--trace'];
  if (tracePath !== undefined) await writeTrace(resolve(io.cwd, tracePath), file, scenario.scenario.seed, result.events);

  if (parsed.flags.has('--json')) {
    const { contract, contracts, events, findings, lanes, timers } = result;
    printJson(io, { ok: true, contract, contracts, events, findings, ...(result.samples ? { samples: sampleRows(result.samples) } : {}), lanes, timers });
    return EXIT_OK;
  }
  io.stdout(timeline(io, result));
  const contract = result.contract;
  io.stdout(
    `\n${paint(io, 'bold', 'Contract')}  ${contract ? `${contract.kind} ${contract.voltageMv / 1_000} V, ${contract.currentMa / 1_000} A, ${contract.powerMw / 1_000} W (object ${contract.objectPosition})` : paint(io, 'yellow', 'none at the end of the run')}\n\n`,
  );
  io.stdout(describeFindings(io, result.findings));
  if (tracePath !== undefined) io.stdout(`\nTrace written to ${tracePath} (${result.events.length} records).\n`);
  if (result.samples) io.stdout(`${result.samples.count} samples taken (use --json to see them).\n`);
  return EXIT_OK;
}

export async function readJson(file: string, io: CliIo): Promise<unknown> {
  let text: string;
  try {
    text = file === '-' ? await io.readStdin() : await readFile(resolve(io.cwd, file), 'utf8');
  } catch {
    throw new CliError('input.file', `cannot read "${file}"`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new CliError('input.json', `${file}: not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
}

async function writeTrace(path: string, file: string, seed: number, events: readonly TraceRecord[]): Promise<void> {
  // The scenario's file name, not the path it was given by: a trace travels, the folder does not.
  const header = { trace: 1, title: `Simulation of ${file === '-' ? 'standard input' : basename(file)}`, simulatedBy: 'parley simulate', seed };
  const lines = [JSON.stringify(header), ...events.map((record) => JSON.stringify(record))];
  try {
    await writeFile(path, `${lines.join('\n')}\n`);
  } catch {
    throw new CliError('output.trace', `--trace: cannot write "${path}"`);
  }
}

const ms = (tUs: number) => (tUs / 1_000).toFixed(3);
const volts = (mv: number) => `${(mv / 1_000).toFixed(2)} V`;

function describeRdo(rdo: Rdo): string {
  if (rdo.kind === 'rdo-pps' || rdo.kind === 'rdo-avs') return `object ${rdo.objectPosition}: ${volts(rdo.outputVoltageMv)}, ${rdo.operatingCurrentMa} mA`;
  if (rdo.kind === 'rdo-battery') return `object ${rdo.objectPosition}: ${rdo.operatingPowerMw} mW`;
  return `object ${rdo.objectPosition}: ${rdo.operatingCurrentMa} mA${rdo.capabilityMismatch ? ', Capability Mismatch' : ''}`;
}

function describeMessage(message: Message | undefined): string {
  if (!message) return '(undecoded)';
  const { messageType, messageId } = message.header;
  let detail = '';
  if (messageType === 'Source_Capabilities') detail = (message.objects as SourcePdo[]).map((pdo) => describePdo(pdo)).join('; ');
  else if (messageType === 'Request' && message.objects[0]) detail = describeRdo(message.objects[0] as Rdo);
  return `${messageType} #${messageId}${detail ? `  ${detail}` : ''}`;
}

/** One row a record (time, direction, what happened); the states each side enters go in the last column. */
function timeline(io: CliIo, result: SimulationResult): string {
  const rows: string[][] = [[paint(io, 'bold', 'ms'), paint(io, 'bold', 'dir'), paint(io, 'bold', 'what'), paint(io, 'bold', 'states')]];
  let lane = 0;
  let lastTUs = -1;
  const flushStates = (beforeUs: number) => {
    while (lane < result.lanes.length && result.lanes[lane]!.t < beforeUs) {
      const entry = result.lanes[lane++]!;
      const state = `${entry.side === 'source' ? 'SRC' : 'SNK'} ${entry.state.replace(/^PE_(SRC|SNK)_/, '')}`;
      const last = rows[rows.length - 1]!;
      if (entry.t === lastTUs) last[3] = last[3] ? `${last[3]}, ${state}` : state;
      else rows.push([ms(entry.t), '', '', state]);
      lastTUs = entry.t;
    }
  };
  for (const record of result.events) {
    flushStates(record.t);
    rows.push([ms(record.t), direction(record), describeRecord(io, record), '']);
    lastTUs = record.t;
  }
  flushStates(Number.POSITIVE_INFINITY);
  return formatTable(rows);
}

function direction(record: TraceRecord): string {
  const from = 'msg' in record || 'event' in record ? record.from : undefined;
  // SOP' messages go between a port and the cable plug.
  if ('msg' in record && record.sop === "SOP'") return from === 'cable' ? 'CBL→SRC' : 'SRC→CBL';
  return from === 'source' ? 'SRC→SNK' : from === 'sink' ? 'SNK→SRC' : '';
}

function describeRecord(io: CliIo, record: TraceRecord): string {
  if ('msg' in record) {
    const what = describeMessage(record.message) + (record.crcOk === false ? paint(io, 'red', '  (bad CRC)') : '');
    return record.message?.header.messageType === 'GoodCRC' ? paint(io, 'dim', what) : what;
  }
  if ('event' in record) {
    if (record.event === 'attach') return `attach ${record.cc ?? ''}, Rp ${record.rp ?? 'default'}`;
    // Collision avoidance: Rp 1.5 A is SinkTxNG, 3.0 A SinkTxOK (USB PD R3.2 V1.1 §5.7).
    if (record.event === 'rp') return `Rp ${record.rp ?? 'default'} (${record.rp === '1.5A' ? 'SinkTxNG' : record.rp === '3.0A' ? 'SinkTxOK' : 'default'})`;
    return paint(io, 'yellow', record.event === 'hard_reset' ? 'Hard Reset' : record.event);
  }
  if ('vbus' in record) return paint(io, 'dim', `VBUS ${volts(record.vbus.mv)}${record.vbus.ma === undefined ? '' : `, ${record.vbus.ma} mA`}`);
  return paint(io, 'dim', `note: ${record.note}`);
}
