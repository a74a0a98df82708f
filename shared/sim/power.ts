/**
 * The power path as pure functions: VBUS at the source as a slew-limited ramp, the sink's draw,
 * a programmable supply's current limit (fold-back), and the cable's IR drop.
 */
import type { SinkMode } from './pe-types.ts';

/** vSafe5V is 4.75–5.50 V: USB PD R3.2 V1.1 §7.1, Table 7.x "Source Electrical Parameters" (vSafe5V). */
export const VSAFE5V_MIN_MV = 4_750;
/** vSafe0V is 0–0.8 V: same table (vSafe0V). */
export const VSAFE0V_MAX_MV = 800;
/** vSrcSlewPos: at most 30 mV/µs (USB PD R3.2 V1.1 §7.1.4.1, same table). */
export const SLEW_MAX_MV_PER_US = 30;
/** Discharge towards vSafe0V after a Hard Reset: 100 mV/ms reaches vSafe0V from 20 V in 192 ms, inside tSafe0V (common practice). */
export const DISCHARGE_MV_PER_US = 0.1;
/** pSnkStdby 2.5 W: a sink's draw during a transition (USB PD R3.2 V1.1 §7.2.3, from memory). */
export const SINK_STANDBY_MW = 2_500;
/** Before an explicit contract a sink draws little: 100 mA (common practice), never above the Rp advertisement. */
export const SINK_DEFAULT_MA = 100;
/** Below this VBUS the sink's converter is off and draws nothing (common practice). */
export const SINK_UVLO_MV = 3_000;

export interface VbusRamp {
  startUs: number;
  fromMv: number;
  toMv: number;
  /** Magnitude of the slope, mV per µs. */
  mvPerUs: number;
}

export function rampEndUs(ramp: VbusRamp): number {
  if (ramp.toMv === ramp.fromMv) return ramp.startUs;
  return ramp.startUs + Math.ceil(Math.abs(ramp.toMv - ramp.fromMv) / ramp.mvPerUs);
}

/** VBUS at the source's connector at `tUs`, mV (integer). */
export function vbusAtUs(ramp: VbusRamp, tUs: number): number {
  const endUs = rampEndUs(ramp);
  if (tUs >= endUs) return ramp.toMv;
  if (tUs <= ramp.startUs) return ramp.fromMv;
  const direction = ramp.toMv > ramp.fromMv ? 1 : -1;
  return Math.round(ramp.fromMv + direction * ramp.mvPerUs * (tUs - ramp.startUs));
}

/** When the ramp first reaches `thresholdMv` in its own direction, or null if it never does. */
export function crossingUs(ramp: VbusRamp, thresholdMv: number): number | null {
  const rising = ramp.toMv > ramp.fromMv;
  if (rising ? !(ramp.fromMv < thresholdMv && ramp.toMv >= thresholdMv) : !(ramp.fromMv > thresholdMv && ramp.toMv <= thresholdMv)) return null;
  return ramp.startUs + Math.ceil(Math.abs(thresholdMv - ramp.fromMv) / ramp.mvPerUs);
}

/** What the sink wants to draw (mA) in a mode, before any current limit. */
export function sinkDrawMa(mode: SinkMode, operatingMa: number, vbusMv: number, rpMa: number): number {
  if (mode === 'off' || vbusMv < SINK_UVLO_MV) return 0;
  if (mode === 'default') return Math.min(SINK_DEFAULT_MA, rpMa);
  if (mode === 'standby') return Math.min(operatingMa, Math.floor((SINK_STANDBY_MW * 1_000) / vbusMv));
  return operatingMa;
}

/**
 * A programmable supply in current limit holds IBUS at the requested operating current and lets the
 * voltage fall (USB PD R3.2 V1.1 §7.1.4.4 PPS current limit): for a resistive load the voltage falls
 * in proportion, V = Vset × Ilimit / Iload.
 */
export function foldBack(setMv: number, limitMa: number | null, drawMa: number): { voltageMv: number; currentMa: number } {
  if (limitMa === null || drawMa <= limitMa || drawMa === 0) return { voltageMv: setMv, currentMa: drawMa };
  return { voltageMv: Math.round((setMv * limitMa) / drawMa), currentMa: limitMa };
}

/** VBUS at the sink after the cable's IR drop: mV − mA × mΩ / 1000. */
export function sinkSideMv(sourceMv: number, currentMa: number, resistanceMohm: number): number {
  return Math.max(0, sourceMv - Math.round((currentMa * resistanceMohm) / 1_000));
}

export function rpCurrentMa(rp: 'default' | '1.5A' | '3.0A'): number {
  // USB Type-C R2.3 §4.6.2.1: Default USB Power (500/900 mA), 1.5 A, 3.0 A.
  return rp === '3.0A' ? 3_000 : rp === '1.5A' ? 1_500 : 900;
}
