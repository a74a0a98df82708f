/**
 * Source Power Data Objects (Source_Capabilities, EPR_Source_Capabilities, the PDO copy in an
 * EPR_Request). USB PD R3.2 V1.1 §6.4.1.2; bit layouts (R3.1 V1.8 table numbers):
 * - Table 6.7 "Power Data Object": B31..30 type — 00b Fixed, 01b Battery, 10b Variable, 11b APDO.
 *   (R3.2 V1.1's per-type tables print Battery and Variable swapped; the summary table and text
 *   give 01b Battery, 10b Variable — an erratum. We follow the summary table.)
 * - Table 6.9 Fixed: B29 Dual-Role Power, B28 USB Suspend Supported, B27 Unconstrained Power,
 *   B26 USB Communications Capable, B25 Dual-Role Data, B24 Unchunked Extended Messages Supported,
 *   B23 EPR Mode Capable, B22 Reserved, B21..20 Peak Current, B19..10 Voltage (50 mV),
 *   B9..0 Maximum Current (10 mA).
 * - Table 6.11 Variable / 6.12 Battery: B29..20 Maximum Voltage (50 mV), B19..10 Minimum Voltage
 *   (50 mV), B9..0 Maximum Current (10 mA) / Maximum Allowable Power (250 mW).
 * - APDO B29..28: 00b SPR PPS, 01b EPR AVS, 10b SPR AVS (new in R3.2), 11b Reserved.
 *   Table 6.13 PPS: B27 PPS Power Limited, B26..25 Reserved, B24..17 Maximum Voltage (100 mV),
 *   B16 Reserved, B15..8 Minimum Voltage (100 mV), B7 Reserved, B6..0 Maximum Current (50 mA).
 *   Table 6.14 EPR AVS: B27..26 Peak Current, B25..17 Maximum Voltage (100 mV), B16 Reserved,
 *   B15..8 Minimum Voltage (100 mV), B7..0 PDP (1 W).
 *   SPR AVS (R3.2 V1.1 §6.4.1.2.5): B27..26 Peak Current, B25..20 Reserved, B19..10 Maximum
 *   Current 9–15 V (10 mA), B9..0 Maximum Current 15–20 V (10 mA).
 */
import { decodeApdo, encodeApdo, SOURCE_APDO_RESERVED_MASKS } from './apdo.ts';
import { code, flag, keptReserved, units } from './guards.ts';
import { hex32 } from './hex.ts';
import { encodeRangePdo, PDO_TYPE_BATTERY, PDO_TYPE_FIXED, PDO_TYPE_VARIABLE, rangeVoltagesMv } from './pdo-layout.ts';
import type { RawObject, SourcePdo } from './types.ts';

/** Reserved bits of each source form (a set bit gives `decode.reserved-bits`). */
export const SOURCE_RESERVED_MASKS = {
  fixed: 1 << 22,
  variable: 0,
  battery: 0,
  ...SOURCE_APDO_RESERVED_MASKS,
} as const;

/** Decodes a source PDO; an APDO of the reserved type 11b gives kind `raw`. Never throws. */
export function decodeSourcePdo(raw: number): SourcePdo | RawObject {
  raw >>>= 0;
  const type = raw >>> 30;
  if (type === PDO_TYPE_FIXED) {
    return {
      kind: 'fixed',
      raw: hex32(raw),
      voltageMv: ((raw >>> 10) & 0x3ff) * 50,
      maxCurrentMa: (raw & 0x3ff) * 10,
      peakCurrent: (raw >>> 20) & 3,
      dualRolePower: (raw & (1 << 29)) !== 0,
      usbSuspendSupported: (raw & (1 << 28)) !== 0,
      unconstrainedPower: (raw & (1 << 27)) !== 0,
      usbCommunicationsCapable: (raw & (1 << 26)) !== 0,
      dualRoleData: (raw & (1 << 25)) !== 0,
      unchunkedExtendedMessages: (raw & (1 << 24)) !== 0,
      eprModeCapable: (raw & (1 << 23)) !== 0,
    };
  }
  const { minVoltageMv, maxVoltageMv } = rangeVoltagesMv(raw);
  if (type === PDO_TYPE_VARIABLE) return { kind: 'variable', raw: hex32(raw), minVoltageMv, maxVoltageMv, maxCurrentMa: (raw & 0x3ff) * 10 };
  if (type === PDO_TYPE_BATTERY) return { kind: 'battery', raw: hex32(raw), minVoltageMv, maxVoltageMv, maxPowerMw: (raw & 0x3ff) * 250 };
  return decodeApdo(raw, true) as SourcePdo | RawObject;
}

/**
 * Encodes a source PDO from its fields (`raw` ignored but for its reserved bits, which are kept).
 * Throws RangeError naming the field when a value does not fit. No allocation on the good path.
 */
export function encodeSourcePdo(pdo: SourcePdo | RawObject): number {
  switch (pdo.kind) {
    case 'fixed':
      return (
        ((flag(pdo.dualRolePower, 'dualRolePower') << 29) |
          (flag(pdo.usbSuspendSupported, 'usbSuspendSupported') << 28) |
          (flag(pdo.unconstrainedPower, 'unconstrainedPower') << 27) |
          (flag(pdo.usbCommunicationsCapable, 'usbCommunicationsCapable') << 26) |
          (flag(pdo.dualRoleData, 'dualRoleData') << 25) |
          (flag(pdo.unchunkedExtendedMessages, 'unchunkedExtendedMessages') << 24) |
          (flag(pdo.eprModeCapable, 'eprModeCapable') << 23) |
          (code(pdo.peakCurrent, 2, 'peakCurrent') << 20) |
          (units(pdo.voltageMv, 50, 10, 'voltageMv', 'mV') << 10) |
          units(pdo.maxCurrentMa, 10, 10, 'maxCurrentMa', 'mA') |
          keptReserved(pdo.raw, SOURCE_RESERVED_MASKS.fixed)) >>>
        0
      );
    case 'variable':
      return encodeRangePdo(PDO_TYPE_VARIABLE, pdo, pdo.maxCurrentMa, 10, 'maxCurrentMa', 'mA');
    case 'battery':
      return encodeRangePdo(PDO_TYPE_BATTERY, pdo, pdo.maxPowerMw, 250, 'maxPowerMw', 'mW');
    default:
      return encodeApdo(pdo, true);
  }
}
