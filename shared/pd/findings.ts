/**
 * The codec's findings (rule ids of docs/rules.md, plus `decode.rdo-unknown-type`
 * and `decode.object-position`, added here). shared/pd cannot import shared/rules (rules imports
 * pd), so severities and references are set here and mirrored in shared/rules/catalog.ts.
 */
import type { Finding } from '../core/finding.ts';

export const DECODE_RULES = {
  'decode.length': { severity: 'error', ref: 'USB PD R3.2 V1.1 §6.2.1.1.2 (Number of Data Objects), §6.2.1.2.5 (Data Size)' },
  'decode.reserved-type': { severity: 'warning', ref: 'USB PD R3.2 V1.1 §6.3 Table 6.5, §6.4 Table 6.6, §6.5 Table 6.53 (Message Types)' },
  'decode.reserved-bits': { severity: 'warning', ref: 'USB PD R3.2 V1.1 §1.4.2 (Reserved: Shall be set to zero)' },
  'decode.crc': { severity: 'error', ref: 'USB PD R3.2 V1.1 §5.6.2 (CRC)' },
  'decode.rdo-unknown-type': { severity: 'warning', ref: 'USB PD R3.2 V1.1 §6.4.2 (the RDO is read by the type of the PDO it references)' },
  'decode.object-position': { severity: 'warning', ref: 'USB PD R3.2 V1.1 §6.4.2, Request Data Object tables (Object Position: 1–7, 8–13 only in EPR_Request)' },
} as const satisfies Record<string, { severity: Finding['severity']; ref: string }>;

export type DecodeRule = keyof typeof DECODE_RULES;

export function decodeFinding(rule: DecodeRule, message: string, extra: { object?: number; ref?: string } = {}): Finding {
  const entry = DECODE_RULES[rule];
  const finding: Finding = { rule, severity: entry.severity, message, ref: extra.ref ?? entry.ref };
  if (extra.object !== undefined) finding.object = extra.object;
  return finding;
}
