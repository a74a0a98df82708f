/**
 * `parley caps <hex>…` / `--pdos 0x…,0x…` (docs/cli.md): checks a Source_Capabilities
 * (or EPR_Source_Capabilities) message against the structural rules and the Power Rules.
 * `--pdp W` declares the PDP (else inferred and said so), `--cable 3000|5000` the cable's rating,
 * `--label "…"` a printed rating to compare, `--epr` reads a `--pdos` list as EPR_Source_Capabilities.
 * Exit 0 when the command ran (findings or not), 2 on bad input.
 */
import type { Finding } from '../../shared/core/finding.ts';
import type { Result } from '../../shared/core/result.ts';
import { checkCaps, parseLabel, readCapsHex, readPdoList, type ReadCaps } from '../../shared/rules/index.ts';
import { CliError, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';

const USAGE = 'caps <hex>… | --pdos 0x…,0x… [--pdp W] [--cable 3000|5000] [--label "…"] [--epr] [--json]';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseOptions(args, { values: ['--pdos', '--pdp', '--cable', '--label'], flags: ['--json', '--epr'], usage: USAGE });
  const offers = readOffers(parsed);
  if (!offers.ok) throw CliError.from(offers.error);
  const pdpW = parsePdp(parsed.values['--pdp']);
  const cableMa = parseCable(parsed.values['--cable']);
  const label = parsed.values['--label'];
  if (label !== undefined) {
    const readable = parseLabel(label);
    if (!readable.ok) throw CliError.from(readable.error);
  }
  const report = checkCaps(offers.pdos, { pdpW, cableMa, label, epr: offers.epr });
  const findings = [...offers.warnings, ...report.findings];
  if (parsed.flags.has('--json')) {
    printJson(io, { ok: true, pdpW: report.pdpW, pdpInferred: report.pdpInferred, objects: offers.pdos, findings });
    return EXIT_OK;
  }
  io.stdout(describeOffers(io, offers, report.pdpW, report.pdpInferred, cableMa));
  io.stdout(describeFindings(io, findings));
  return EXIT_OK;
}

function readOffers(parsed: ParsedOptions): Result<ReadCaps> {
  const list = parsed.values['--pdos'];
  if (list !== undefined && parsed.positional.length > 0) throw new CliError('usage', 'give either the message hex or --pdos, not both');
  if (list !== undefined) return readPdoList(list.split(/[\s,]+/).filter(Boolean), { epr: parsed.flags.has('--epr'), field: '--pdos' });
  if (parsed.positional.length === 0) throw new CliError('usage', `give a Source_Capabilities message in hex or --pdos; usage: parley ${USAGE}`);
  return readCapsHex(parsed.positional.join(''), 'caps');
}

function parsePdp(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text.replace(/w$/i, ''));
  if (!Number.isInteger(value) || value < 1 || value > 240) throw new CliError('input.pdp', `--pdp: "${text}" is not a whole number of watts from 1 to 240`);
  return value;
}

const volts = (mv: number) => `${mv / 1_000} V`;
const amps = (ma: number) => `${ma / 1_000} A`;
const watts = (mw: number) => `${Math.round(mw / 100) / 10} W`;

function offerColumns(pdo: ReadCaps['pdos'][number]): [string, string, string] {
  switch (pdo.kind) {
    case 'fixed':
      return [volts(pdo.voltageMv), amps(pdo.maxCurrentMa), watts((pdo.voltageMv * pdo.maxCurrentMa) / 1_000)];
    case 'variable':
      return [`${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}`, amps(pdo.maxCurrentMa), ''];
    case 'battery':
      return [`${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}`, '', watts(pdo.maxPowerMw)];
    case 'pps':
      return [`${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}`, amps(pdo.maxCurrentMa), pdo.powerLimited ? 'limited' : ''];
    case 'epr-avs':
      return [`${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}`, '', `${pdo.pdpW} W`];
    case 'spr-avs':
      return ['9–20 V', `${amps(pdo.maxCurrent15vMa)} / ${amps(pdo.maxCurrent20vMa)}`, ''];
  }
}

function describeOffers(io: CliIo, offers: ReadCaps, pdpW: number, pdpInferred: boolean, cableMa: number | undefined): string {
  const title = offers.message?.header.messageType ?? (offers.epr ? 'EPR offers' : 'Offers');
  const rows = [['#', 'kind', 'voltage', 'current', 'power', 'raw'].map((h) => paint(io, 'dim', h))];
  offers.pdos.forEach((pdo, i) => {
    const padding = Number.parseInt(pdo.raw, 16) === 0;
    rows.push([String(i + 1), padding ? '(empty)' : pdo.kind, ...(padding ? ['', '', ''] : offerColumns(pdo)), pdo.raw]);
  });
  const cable = cableMa === undefined ? 'cable not given' : `${cableMa / 1_000} A cable`;
  return `${paint(io, 'bold', title)}: ${offers.pdos.length} ${offers.pdos.length === 1 ? 'object' : 'objects'}, PDP ${pdpW} W${pdpInferred ? ' (inferred)' : ''}, ${cable}\n${formatTable(rows)}\n`;
}

export function describeFindings(io: CliIo, findings: readonly Finding[]): string {
  if (findings.length === 0) return `${paint(io, 'green', 'No findings.')}\n`;
  const colour = { error: 'red', warning: 'yellow', info: 'dim' } as const;
  const rows = findings.map((f) => [paint(io, colour[f.severity], f.severity), f.rule, f.object === undefined ? '' : `#${f.object}`, f.message]);
  const count = (s: Finding['severity']) => findings.filter((f) => f.severity === s).length;
  const summary = `${findings.length} finding${findings.length === 1 ? '' : 's'}: ${count('error')} error${count('error') === 1 ? '' : 's'}, ${count('warning')} warning${count('warning') === 1 ? '' : 's'}, ${count('info')} info`;
  return `${formatTable(rows)}${summary}\n`;
}

// ---- option parsing, shared with `request` (`--name value` or `--name=value`) ----------------

export interface ParsedOptions {
  values: Record<string, string | undefined>;
  flags: Set<string>;
  positional: string[];
}

export function parseOptions(args: string[], spec: { values: string[]; flags: string[]; usage: string }): ParsedOptions {
  const parsed: ParsedOptions = { values: {}, flags: new Set(), positional: [] };
  for (let i = 0; i < args.length; i += 1) {
    const arg = args[i]!;
    const eq = arg.indexOf('=');
    const name = arg.startsWith('--') && eq > 0 ? arg.slice(0, eq) : arg;
    if (spec.flags.includes(arg)) parsed.flags.add(arg);
    else if (spec.values.includes(name)) {
      let value: string | undefined;
      if (name !== arg) value = arg.slice(eq + 1);
      else {
        value = args[i + 1];
        if (value === undefined || (value.startsWith('--') && value.length > 2)) throw new CliError('usage', `${arg} needs a value; usage: parley ${spec.usage}`);
        i += 1;
      }
      parsed.values[name] = value;
    } else if (arg.startsWith('--')) throw new CliError('usage', `unknown option ${arg}; usage: parley ${spec.usage}`);
    else parsed.positional.push(arg);
  }
  return parsed;
}

/** `--cable 3000|5000` (mA); `3A`/`5A` are read too. */
export function parseCable(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const normalised = text.trim().toLowerCase();
  const value = normalised === '3a' ? 3_000 : normalised === '5a' ? 5_000 : Number(normalised);
  if (value !== 3_000 && value !== 5_000) throw new CliError('input.cable', `--cable: "${text}" is not a cable rating; give 3000 or 5000 (mA)`);
  return value;
}
