/**
 * The programmable ranges the Power Rules define, and the check that each PPS (and EPR AVS) offer
 * is one of them.
 *
 * PPS: USB PD R3.0 V2.0 / R3.1 V1.8 §10.2.3.2, SPR PPS voltage ranges table: 3.3–5.9 V, 3.3–11 V,
 * 3.3–16 V, 3.3–21 V; USB PD R3.2 V1.1 §10.2.3.2 moved the minimum to 5 V: 5–11 V, 5–16 V, 5–21 V.
 * EPR AVS: USB PD R3.1 V1.8 §10.2.3.3 and Table 10-3: 15 V up to 28, 36 or 48 V by PDP band.
 * All from memory.
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { powerRulesFor } from './power-rules.ts';

export interface DefinedRange {
  minVoltageMv: number;
  maxVoltageMv: number;
  revision: 'R3.0/R3.1' | 'R3.2';
}

export const definedPpsRanges: readonly DefinedRange[] = [
  { minVoltageMv: 3_300, maxVoltageMv: 5_900, revision: 'R3.0/R3.1' },
  { minVoltageMv: 3_300, maxVoltageMv: 11_000, revision: 'R3.0/R3.1' },
  { minVoltageMv: 3_300, maxVoltageMv: 16_000, revision: 'R3.0/R3.1' },
  { minVoltageMv: 3_300, maxVoltageMv: 21_000, revision: 'R3.0/R3.1' },
  { minVoltageMv: 5_000, maxVoltageMv: 11_000, revision: 'R3.2' },
  { minVoltageMv: 5_000, maxVoltageMv: 16_000, revision: 'R3.2' },
  { minVoltageMv: 5_000, maxVoltageMv: 21_000, revision: 'R3.2' },
];

export function isDefinedPpsRange(minVoltageMv: number, maxVoltageMv: number): boolean {
  return definedPpsRanges.some((r) => r.minVoltageMv === minVoltageMv && r.maxVoltageMv === maxVoltageMv);
}

const volts = (mv: number) => `${mv / 1_000} V`;

export function checkProgrammableRanges(pdos: readonly SourcePdo[], pdpW: number, options: { epr?: boolean } = {}): Finding[] {
  const findings: Finding[] = [];
  const avs = options.epr && pdpW > 100 ? powerRulesFor(pdpW, { epr: true }).avs : undefined;
  pdos.forEach((pdo, i) => {
    if (pdo.kind === 'pps' && !isDefinedPpsRange(pdo.minVoltageMv, pdo.maxVoltageMv)) {
      findings.push(
        makeFinding(
          'caps.pps-range',
          `Object ${i + 1} is a programmable range of ${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}, which is none of the ranges the Power Rules define (3.3–5.9, 3.3–11, 3.3–16, 3.3–21 V; since R3.2 5–11, 5–16, 5–21 V).`,
          { object: i + 1 },
        ),
      );
    }
    if (pdo.kind === 'epr-avs' && avs && (pdo.minVoltageMv !== avs.minVoltageMv || pdo.maxVoltageMv !== avs.maxVoltageMv)) {
      findings.push(
        makeFinding(
          'caps.avs-range',
          `Object ${i + 1} is an adjustable range of ${pdo.minVoltageMv / 1_000}–${volts(pdo.maxVoltageMv)}; for a ${pdpW} W EPR source the Power Rules define ${avs.minVoltageMv / 1_000}–${volts(avs.maxVoltageMv)}.`,
          { object: i + 1 },
        ),
      );
    }
  });
  return findings;
}
