/**
 * What source and sink PDOs share, bit for bit (USB PD R3.2 V1.1 §6.4.1; R3.1 V1.8 table numbers):
 * - Table 6.7 "Power Data Object": B31..30 the type — 00b Fixed, 01b Battery, 10b Variable, 11b APDO.
 * - Variable and Battery (Tables 6.11, 6.12 source; 6.18, 6.19 sink): B29..20 Maximum Voltage and
 *   B19..10 Minimum Voltage (50 mV), B9..0 a current (10 mA) or a power (250 mW). Only the low field's
 *   name differs (Maximum Current / Maximum Allowable Power offered, Operational Current / Power asked).
 * The Fixed forms are not the same layout and stay apart: the source's (Table 6.9) has B28 USB Suspend
 * Supported, B24 Unchunked Extended Messages Supported, B23 EPR Mode Capable and B21..20 Peak Current;
 * the sink's (Table 6.17) has B28 Higher Capability, B24..23 Fast Role Swap required USB Type-C
 * Current and B22..20 Reserved. The APDOs are shared in apdo.ts.
 */
import { units } from './guards.ts';

export const PDO_TYPE_FIXED = 0b00;
export const PDO_TYPE_BATTERY = 0b01;
export const PDO_TYPE_VARIABLE = 0b10;
export const PDO_TYPE_APDO = 0b11;

/** A Variable or Battery PDO's voltage range (mV). */
export function rangeVoltagesMv(raw: number): { minVoltageMv: number; maxVoltageMv: number } {
  return { minVoltageMv: ((raw >>> 10) & 0x3ff) * 50, maxVoltageMv: ((raw >>> 20) & 0x3ff) * 50 };
}

/** Writes a Variable or Battery PDO: `value` in `step` units in B9..0. Throws RangeError naming the field. */
export function encodeRangePdo(type: number, pdo: { maxVoltageMv: unknown; minVoltageMv: unknown }, value: unknown, step: number, field: string, unit: string): number {
  return ((type << 30) | (units(pdo.maxVoltageMv, 50, 10, 'maxVoltageMv', 'mV') << 20) | (units(pdo.minVoltageMv, 50, 10, 'minVoltageMv', 'mV') << 10) | units(value, step, 10, field, unit)) >>> 0;
}
