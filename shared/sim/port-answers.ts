/**
 * What a port says of itself when asked: the data blocks of Source_Capabilities_Extended, Status
 * and PPS_Status, and a sink's Sink_Capabilities. Values are those of a plain demo adapter.
 *
 * USB PD R3.2 V1.1 §6.5.1 Source_Capabilities_Extended (SCEDB, 25 bytes: VID, PID, XID, FW, HW,
 * voltage regulation, holdup time, compliance, touch current, peak current 1–3, touch temp, source
 * inputs, batteries, SPR Source PDP, EPR Source PDP); §6.5.2 Status (SDB, 7 bytes: internal temp, present input,
 * present battery input, event flags, temperature status, power status, power state change);
 * §6.5.10 PPS_Status (PPSSDB, 4 bytes: output voltage in 20 mV units, output current in 50 mA
 * units (0xFF: not supported), real-time flags). Layouts from memory.
 */
import type { Contract } from '../core/contract.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';

const KESTREL_VID = 0xfffe;

/** Bytes: VID 0–1, PID 2–3, XID 4–7, FW 8, HW 9, regulation 10, holdup 11, …, SPR PDP 23, EPR PDP 24. */
export function sourceCapsExtendedBytes(sprPdpW: number, eprPdpW: number): number[] {
  const bytes = new Array<number>(25).fill(0);
  bytes[0] = KESTREL_VID & 0xff;
  bytes[1] = KESTREL_VID >>> 8;
  bytes[2] = 0x65; // PID 0x0065 (a fictional Kestrel Devices adapter)
  bytes[11] = 3; // Holdup Time, ms
  bytes[23] = Math.min(100, Math.max(0, sprPdpW));
  bytes[24] = Math.min(255, Math.max(0, eprPdpW));
  return bytes;
}

export function statusBytes(): number[] {
  // Internal temperature 35 °C, present input: external power (bit 1), nothing else to report.
  return [35, 0b0000_0010, 0, 0, 0, 0, 0];
}

export function ppsStatusBytes(contract: Contract | null, vbusMv: number): number[] {
  const units = contract?.kind === 'pps' ? Math.round(vbusMv / 20) : 0xffff;
  return [units & 0xff, (units >>> 8) & 0xff, 0xff, 0];
}

/**
 * A sink's Sink_Capabilities when the scenario gives none: vSafe5V at what the policy draws, then
 * the policy's own voltage as a fixed object (USB PD R3.2 V1.1 §6.4.1.3 Sink PDOs: vSafe5V first).
 */
export function derivedSinkCaps(policy: SinkPolicy): number[] {
  const fixed = (voltageMv: number, currentMa: number) => (((Math.round(voltageMv / 50) & 0x3ff) << 10) | (Math.min(1_023, Math.round(currentMa / 10)) & 0x3ff)) >>> 0;
  const currentMa = 'currentMa' in policy ? policy.currentMa : 3_000;
  const words = [fixed(5_000, Math.min(currentMa, 3_000))];
  if (policy.kind === 'fixed' && policy.voltageMv !== 5_000 && policy.voltageMv <= 20_000) words.push(fixed(policy.voltageMv, currentMa));
  return words;
}
