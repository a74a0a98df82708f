/**
 * The PDP when none is declared: the largest whole number of watts the strongest fixed offer can
 * stand for (and, in EPR, the PDP an EPR AVS APDO states).
 *
 * A PDO states current in 10 mA steps, so PDP/V is rounded down when it is written (a 20 W source
 * offers 9 V at 2.22 A = 19.98 W). A PDP of P watts therefore shows as a current of at least
 * P/V − 10 mA, i.e. P ≤ V × (I + 10 mA): the largest whole P within that is the PDP. Rounding to the
 * nearest watt instead would make 5 V 1.5 A (7.5 W) an 8 W source, which needs 1.6 A at 5 V.
 * The PDP is a whole number of watts (USB PD R3.2 V1.1 §10.2.1 and the Source PDP field of
 * Source_Capabilities_Extended, §6.5.1 — from memory).
 */
import type { SourcePdo } from '../pd/types.ts';
import { isPadding } from './pdo-facts.ts';

/** The current field's unit (§6.4.1.2, Fixed Supply PDO: 10 mA). */
const CURRENT_STEP_MA = 10;

export function inferPdpW(pdos: readonly SourcePdo[]): number {
  let bestMw = 0;
  for (const pdo of pdos) {
    if (isPadding(pdo)) continue;
    if (pdo.kind === 'fixed' && pdo.maxCurrentMa > 0) bestMw = Math.max(bestMw, (pdo.voltageMv * (pdo.maxCurrentMa + CURRENT_STEP_MA)) / 1_000);
    if (pdo.kind === 'epr-avs') bestMw = Math.max(bestMw, pdo.pdpW * 1_000);
  }
  return Math.floor(bestMw / 1_000);
}
