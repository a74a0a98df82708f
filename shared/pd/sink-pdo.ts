/**
 * Sink Power Data Objects (Sink_Capabilities, EPR_Sink_Capabilities). USB PD R3.2 V1.1 §6.4.1.3
 * (R3.1 V1.8 table numbers):
 * - Table 6.17 Fixed: B29 Dual-Role Power, B28 Higher Capability, B27 Unconstrained Power,
 *   B26 USB Communications Capable, B25 Dual-Role Data, B24..23 Fast Role Swap required USB
 *   Type-C Current, B22..20 Reserved, B19..10 Voltage (50 mV), B9..0 Operational Current (10 mA).
 * - Table 6.18 Variable / 6.19 Battery: B29..20 Maximum Voltage, B19..10 Minimum Voltage (50 mV),
 *   B9..0 Operational Current (10 mA) / Operational Power (250 mW). Type codes as for sources:
 *   01b Battery, 10b Variable (see source-pdo.ts on the R3.2 erratum); what the two forms share is in
 *   pdo-layout.ts.
 * - APDOs as for sources, with Peak Current and PPS Power Limited reserved (Tables 6.20, 6.21).
 */
import { code, flag, keptReserved, units } from './guards.ts';
import { hex32 } from './hex.ts';
import { decodeApdo, encodeApdo, SINK_APDO_RESERVED_MASKS } from './apdo.ts';
import { encodeRangePdo, PDO_TYPE_BATTERY, PDO_TYPE_FIXED, PDO_TYPE_VARIABLE, rangeVoltagesMv } from './pdo-layout.ts';
import type { RawObject, SinkPdo } from './types.ts';

export const SINK_RESERVED_MASKS = {
  fixed: 0b111 << 20,
  variable: 0,
  battery: 0,
  ...SINK_APDO_RESERVED_MASKS,
} as const;

/** Decodes a sink PDO; an APDO of the reserved type 11b gives kind `raw`. Never throws. */
export function decodeSinkPdo(raw: number): SinkPdo | RawObject {
  raw >>>= 0;
  const type = raw >>> 30;
  if (type === PDO_TYPE_FIXED) {
    return {
      kind: 'fixed',
      raw: hex32(raw),
      voltageMv: ((raw >>> 10) & 0x3ff) * 50,
      operationalCurrentMa: (raw & 0x3ff) * 10,
      dualRolePower: (raw & (1 << 29)) !== 0,
      higherCapability: (raw & (1 << 28)) !== 0,
      unconstrainedPower: (raw & (1 << 27)) !== 0,
      usbCommunicationsCapable: (raw & (1 << 26)) !== 0,
      dualRoleData: (raw & (1 << 25)) !== 0,
      frSwapRequiredCurrent: (raw >>> 23) & 3,
    };
  }
  const { minVoltageMv, maxVoltageMv } = rangeVoltagesMv(raw);
  if (type === PDO_TYPE_VARIABLE) return { kind: 'variable', raw: hex32(raw), minVoltageMv, maxVoltageMv, operationalCurrentMa: (raw & 0x3ff) * 10 };
  if (type === PDO_TYPE_BATTERY) return { kind: 'battery', raw: hex32(raw), minVoltageMv, maxVoltageMv, operationalPowerMw: (raw & 0x3ff) * 250 };
  return decodeApdo(raw, false) as SinkPdo | RawObject;
}

/** Encodes a sink PDO from its fields, keeping reserved bits found in `raw`. Throws RangeError on a bad field. */
export function encodeSinkPdo(pdo: SinkPdo | RawObject): number {
  switch (pdo.kind) {
    case 'fixed':
      return (
        ((flag(pdo.dualRolePower, 'dualRolePower') << 29) |
          (flag(pdo.higherCapability, 'higherCapability') << 28) |
          (flag(pdo.unconstrainedPower, 'unconstrainedPower') << 27) |
          (flag(pdo.usbCommunicationsCapable, 'usbCommunicationsCapable') << 26) |
          (flag(pdo.dualRoleData, 'dualRoleData') << 25) |
          (code(pdo.frSwapRequiredCurrent, 2, 'frSwapRequiredCurrent') << 23) |
          (units(pdo.voltageMv, 50, 10, 'voltageMv', 'mV') << 10) |
          units(pdo.operationalCurrentMa, 10, 10, 'operationalCurrentMa', 'mA') |
          keptReserved(pdo.raw, SINK_RESERVED_MASKS.fixed)) >>>
        0
      );
    case 'variable':
      return encodeRangePdo(PDO_TYPE_VARIABLE, pdo, pdo.operationalCurrentMa, 10, 'operationalCurrentMa', 'mA');
    case 'battery':
      return encodeRangePdo(PDO_TYPE_BATTERY, pdo, pdo.operationalPowerMw, 250, 'operationalPowerMw', 'mW');
    default:
      return encodeApdo(pdo, false);
  }
}
