/**
 * The PDP when none is declared: the power of the strongest fixed offer (and, in EPR, the PDP an
 * EPR AVS APDO states), rounded to whole watts.
 *
 * Why rounded rather than truncated: a PDO states current in 10 mA steps, so PDP/V is rounded down
 * when it is written (a 20 W source offers 9 V at 2.22 A = 19.98 W); rounding to the nearest watt
 * undoes that. The PDP is a whole number of watts (USB PD R3.1 V1.8 §10.2.1 and the Source PDP
 * field of Source_Capabilities_Extended, §6.5.1 — from memory).
 */
import type { SourcePdo } from '../pd/types.ts';
import { isPadding } from './pdo-facts.ts';

export function inferPdpW(pdos: readonly SourcePdo[]): number {
  let bestMw = 0;
  for (const pdo of pdos) {
    if (isPadding(pdo)) continue;
    if (pdo.kind === 'fixed') bestMw = Math.max(bestMw, (pdo.voltageMv * pdo.maxCurrentMa) / 1_000);
    if (pdo.kind === 'epr-avs') bestMw = Math.max(bestMw, pdo.pdpW * 1_000);
  }
  return Math.round(bestMw / 1_000);
}
