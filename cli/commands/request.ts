/**
 * `parley request --caps <hex> --sink <json|file> [--cable 3000|5000]` (docs/cli.md):
 * the Request a sink with the given policy (vector.md "Sink policies") sends for those offers.
 * The cable defaults to 3000 mA. Extensions: `--pdos 0x…,0x…` instead of `--caps`, and `--epr`
 * to let the sink take EPR offers (positions 8 and up). Exit 0 when it ran, 2 on bad input.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { ZodError } from 'zod';
import { checkRequest, chooseRequest, describePdo, readCapsHex, readPdoList, requestMessageHex, sinkPolicySchema, type SinkPolicy } from '../../shared/rules/index.ts';
import { CliError, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';
import { describeFindings, parseCable, parseOptions } from './caps.ts';
import { zodMessage } from '../../shared/core/zod-message.ts';

const USAGE = 'request --caps <hex> | --pdos 0x…,0x… --sink <json|file> [--cable 3000|5000] [--epr] [--json]';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseOptions(args, { values: ['--caps', '--pdos', '--sink', '--cable'], flags: ['--json', '--epr'], usage: USAGE });
  if (parsed.positional.length > 0) throw new CliError('usage', `unexpected argument "${parsed.positional[0]}"; usage: parley ${USAGE}`);
  const capsHex = parsed.values['--caps'];
  const pdoList = parsed.values['--pdos'];
  if ((capsHex === undefined) === (pdoList === undefined)) throw new CliError('usage', `give the offers with --caps <hex> (or --pdos); usage: parley ${USAGE}`);
  const offers = capsHex !== undefined ? readCapsHex(capsHex, '--caps') : readPdoList((pdoList ?? '').split(/[\s,]+/).filter(Boolean), { field: '--pdos' });
  if (!offers.ok) throw CliError.from(offers.error);
  const sinkText = parsed.values['--sink'];
  if (sinkText === undefined) throw new CliError('usage', `give the sink policy with --sink '{"kind":"max-power"}' or a JSON file; usage: parley ${USAGE}`);
  const policy = await readPolicy(sinkText, io);
  const cableMa = parseCable(parsed.values['--cable']) ?? 3_000;

  const chosen = chooseRequest(offers.pdos, policy, { cableMa, epr: parsed.flags.has('--epr') || undefined });
  const pdo = offers.pdos[chosen.objectPosition - 1];
  const message = pdo ? requestMessageHex(chosen.rdo, pdo, { specRevision: offers.message?.header.specRevision === '2.0' ? '2.0' : '3.0' }) : undefined;
  if (!message?.ok) throw new CliError('input.caps', '--caps: the offers leave nothing a sink could request');
  const findings = checkRequest(chosen.rdo, offers.pdos);
  const request = { hex: message.hex, rdo: chosen.rdo.raw, objectPosition: chosen.objectPosition, capabilityMismatch: chosen.capabilityMismatch, contract: chosen.contract };

  if (parsed.flags.has('--json')) {
    printJson(io, { ok: true, request, findings });
    return EXIT_OK;
  }
  const { contract } = chosen;
  const rows = [
    ['policy', JSON.stringify(policy)],
    ['cable', `${cableMa / 1_000} A`],
    ['object', `${chosen.objectPosition} (${pdo ? describePdo(pdo) : '?'})`],
    ['RDO', chosen.rdo.raw],
    ['message', message.hex],
    ['contract', `${contract.kind} ${contract.voltageMv / 1_000} V, ${contract.currentMa / 1_000} A, ${contract.powerMw / 1_000} W`],
    ['Capability Mismatch', chosen.capabilityMismatch ? paint(io, 'yellow', 'set') : 'not set'],
  ];
  io.stdout(`${paint(io, 'bold', 'Request')}\n${formatTable(rows.map(([k, v]) => [paint(io, 'dim', k ?? ''), v ?? '']))}`);
  if (findings.length > 0) io.stdout(`\n${describeFindings(io, findings)}`);
  return EXIT_OK;
}

/** `--sink` is JSON text when it starts with `{`, else a file path (relative to the working folder). */
async function readPolicy(text: string, io: CliIo): Promise<SinkPolicy> {
  let source = text;
  if (!text.trim().startsWith('{')) {
    try {
      source = await readFile(resolve(io.cwd, text), 'utf8');
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const why = code === 'EISDIR' ? `"${text}" is a folder` : code === 'ENOENT' ? `no such file "${text}"` : `cannot read "${text}"`;
      throw new CliError('input.sink', `--sink: ${why} (give a JSON policy like '{"kind":"max-power"}' or a file holding one)`);
    }
  }
  let json: unknown;
  try {
    json = JSON.parse(source);
  } catch (error) {
    throw new CliError('input.sink', `--sink: not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  const parsed = sinkPolicySchema.safeParse(json);
  if (!parsed.success) throw new CliError('input.sink', `--sink: ${describeIssues(parsed.error)}`);
  return parsed.data;
}

function describeIssues(error: ZodError): string {
  return zodMessage(error, { where: 'policy', limit: 3 });
}
