/**
 * What VBUS must read under a contract (checked only in a steady state: after PS_RDY and before
 * the next Accept, Hard Reset or detach).
 * - Fixed 5 V: vSafe5V, 4.75–5.5 V (USB PD R3.2 V1.1 §7.1, Table 7.x "vSafe5V"; from memory).
 * - Other fixed voltages: ±5 % of the offer (§7.1.x vSrcNew; from memory).
 * - Variable and battery supplies: within the offer's minimum and maximum (§6.4.1.2.3–4; from memory).
 * - PPS and AVS: the requested voltage ±5 % (§7.1.x vPpsNew / vAvsNew; from memory); a PPS source in
 *   current limit may lower its voltage (§7.1.4.x; from memory), so a low reading while the current is
 *   within iPpsCLOperating (±150 mA, from memory) of the operating current is not out of range.
 * - Current: no more than the operating current of the Request (PPS: plus the 150 mA current-limit
 *   tolerance).
 */
import type { Contract } from '../core/contract.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { ActiveContract } from './policy-waits.ts';

export interface VbusLimits {
  minMv: number;
  maxMv: number;
  maxMa: number;
  ref: string;
  currentLimitMa: number | undefined;
}

const REF = 'USB PD R3.2 V1.1 §7.1 Source electrical parameters (vSafe5V, vSrcNew, vPpsNew; from memory)';
const PPS_CL_TOLERANCE_MA = 150;

function within5Percent(mv: number): [number, number] {
  return [Math.round(mv * 0.95), Math.round(mv * 1.05)];
}

/** The limits of a contract (computed once per contract: readings are many, contracts few). */
export function vbusLimits(active: ActiveContract): VbusLimits {
  active.limits ??= limitsOf(active);
  return active.limits;
}

function limitsOf(active: ActiveContract): VbusLimits {
  return contractVbusLimits(active.contract, active.pdo);
}

/** The limits of a contract made with an offer (also used by the fault sweep's VBUS invariant). */
export function contractVbusLimits(c: Contract, pdo: SourcePdo): VbusLimits {
  let range: [number, number];
  if (c.kind === 'fixed') range = c.voltageMv === 5_000 ? [4_750, 5_500] : within5Percent(c.voltageMv);
  else if ((c.kind === 'variable' || c.kind === 'battery') && (pdo.kind === 'variable' || pdo.kind === 'battery')) range = [pdo.minVoltageMv, pdo.maxVoltageMv];
  else range = within5Percent(c.voltageMv);
  const pps = c.kind === 'pps';
  return {
    minMv: range[0],
    maxMv: range[1],
    maxMa: c.currentMa + (pps ? PPS_CL_TOLERANCE_MA : 0),
    ref: REF,
    currentLimitMa: pps ? c.currentMa - PPS_CL_TOLERANCE_MA : undefined,
  };
}

/** Whether a reading is outside the voltage limits (a PPS source in current limit excepted). */
export function voltageOutside(limits: VbusLimits, mv: number, ma: number | undefined): boolean {
  if (mv > limits.maxMv) return true;
  if (mv >= limits.minMv) return false;
  return !(limits.currentLimitMa !== undefined && ma !== undefined && ma >= limits.currentLimitMa);
}
