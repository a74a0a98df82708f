/**
 * Request Data Objects. USB PD R3.2 V1.1 §6.4.2 (R3.1 V1.8 Tables 6.22–6.26):
 * - common: B31..28 Object Position (4 bits; 0000b reserved; 1–7 SPR, 8–13 only in an
 *   EPR_Request), B26 Capability Mismatch, B25 USB Communications Capable, B24 No USB Suspend,
 *   B23 Unchunked Extended Messages Supported, B22 EPR Mode Capable.
 * - Fixed/Variable: B27 GiveBack (deprecated in R3.x), B21..20 Reserved, B19..10 Operating
 *   Current (10 mA), B9..0 Maximum Operating Current (10 mA).
 * - Battery: as Fixed with B19..10 Operating Power, B9..0 Maximum Operating Power (250 mW).
 * - PPS: B27 Reserved, B21 Reserved, B20..9 Output Voltage (20 mV), B8..7 Reserved,
 *   B6..0 Operating Current (50 mA).
 * - AVS: as PPS with B20..9 Output Voltage in 25 mV units (the two lowest bits zero: 100 mV steps).
 * The RDO does not say its own type: it is read by the type of the PDO it references.
 */
import { code, flag, keptReserved, units } from './guards.ts';
import { hex32 } from './hex.ts';
import type { Rdo, SourcePdo } from './types.ts';

export const RDO_POSITION_SHIFT = 28;
export const RDO_RESERVED_MASKS = {
  fixed: 0b11 << 20,
  programmable: (1 << 27) | (1 << 21) | (0b11 << 7),
} as const;

/** The RDO's 4-bit Object Position (1-based). */
export function rdoObjectPosition(raw: number): number {
  return (raw >>> RDO_POSITION_SHIFT) & 0xf;
}

/** The bits every RDO form shares (B26..22), in the order the decoded form lists them. */
function commonFlags(raw: number): Pick<Rdo, 'capabilityMismatch' | 'usbCommunicationsCapable' | 'noUsbSuspend' | 'unchunkedExtendedMessages' | 'eprModeCapable'> {
  return {
    capabilityMismatch: (raw & (1 << 26)) !== 0,
    usbCommunicationsCapable: (raw & (1 << 25)) !== 0,
    noUsbSuspend: (raw & (1 << 24)) !== 0,
    unchunkedExtendedMessages: (raw & (1 << 23)) !== 0,
    eprModeCapable: (raw & (1 << 22)) !== 0,
  };
}

/**
 * Decodes an RDO by the kind of the PDO it references; without one, kind `rdo` with the
 * fixed/variable reading (decodeMessage adds the `decode.rdo-unknown-type` warning). Never throws.
 */
export function decodeRdo(raw: number, referenced?: SourcePdo | { kind: string }): Rdo {
  raw >>>= 0;
  const objectPosition = (raw >>> 28) & 0xf;
  const kind = referenced?.kind;
  if (kind === 'pps' || kind === 'epr-avs' || kind === 'spr-avs') {
    const pps = kind === 'pps';
    return {
      kind: pps ? 'rdo-pps' : 'rdo-avs',
      raw: hex32(raw),
      objectPosition,
      outputVoltageMv: ((raw >>> 9) & 0xfff) * (pps ? 20 : 25),
      operatingCurrentMa: (raw & 0x7f) * 50,
      ...commonFlags(raw),
    };
  }
  const giveBack = (raw & (1 << 27)) !== 0;
  if (kind === 'battery') {
    return {
      kind: 'rdo-battery',
      raw: hex32(raw),
      objectPosition,
      operatingPowerMw: ((raw >>> 10) & 0x3ff) * 250,
      maxOperatingPowerMw: (raw & 0x3ff) * 250,
      giveBack,
      ...commonFlags(raw),
    };
  }
  return {
    kind: kind === 'fixed' ? 'rdo-fixed' : kind === 'variable' ? 'rdo-variable' : 'rdo',
    raw: hex32(raw),
    objectPosition,
    operatingCurrentMa: ((raw >>> 10) & 0x3ff) * 10,
    maxOperatingCurrentMa: (raw & 0x3ff) * 10,
    giveBack,
    ...commonFlags(raw),
  };
}

/**
 * Fixed, Variable and Battery RDOs are one layout: B27 GiveBack, B19..10 the operating value, B9..0
 * the maximum; a Battery RDO counts power in 250 mW where the others count current in 10 mA.
 */
function encodeOperating(common: number, raw: unknown, giveBack: unknown, operating: unknown, maximum: unknown, step: number, names: [string, string], unit: string): number {
  return (
    (common | (flag(giveBack, 'giveBack') << 27) | (units(operating, step, 10, names[0], unit) << 10) | units(maximum, step, 10, names[1], unit) | keptReserved(raw, RDO_RESERVED_MASKS.fixed)) >>> 0
  );
}

/** Encodes an RDO from its fields, keeping reserved bits found in `raw`. Throws RangeError on a bad field. */
export function encodeRdo(rdo: Rdo): number {
  const common =
    (code(rdo.objectPosition, 4, 'objectPosition') << 28) |
    (flag(rdo.capabilityMismatch, 'capabilityMismatch') << 26) |
    (flag(rdo.usbCommunicationsCapable, 'usbCommunicationsCapable') << 25) |
    (flag(rdo.noUsbSuspend, 'noUsbSuspend') << 24) |
    (flag(rdo.unchunkedExtendedMessages, 'unchunkedExtendedMessages') << 23) |
    (flag(rdo.eprModeCapable, 'eprModeCapable') << 22);
  switch (rdo.kind) {
    case 'rdo-pps':
    case 'rdo-avs': {
      const step = rdo.kind === 'rdo-pps' ? 20 : 25;
      return (
        (common |
          (units(rdo.outputVoltageMv, step, 12, 'outputVoltageMv', 'mV') << 9) |
          units(rdo.operatingCurrentMa, 50, 7, 'operatingCurrentMa', 'mA') |
          keptReserved(rdo.raw, RDO_RESERVED_MASKS.programmable)) >>>
        0
      );
    }
    case 'rdo-battery':
      return encodeOperating(common, rdo.raw, rdo.giveBack, rdo.operatingPowerMw, rdo.maxOperatingPowerMw, 250, ['operatingPowerMw', 'maxOperatingPowerMw'], 'mW');
    case 'rdo-fixed':
    case 'rdo-variable':
    case 'rdo':
      return encodeOperating(common, rdo.raw, rdo.giveBack, rdo.operatingCurrentMa, rdo.maxOperatingCurrentMa, 10, ['operatingCurrentMa', 'maxOperatingCurrentMa'], 'mA');
    default:
      throw new RangeError(`kind: "${(rdo as { kind: string }).kind}" is not a request data object kind`);
  }
}
