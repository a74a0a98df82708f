/**
 * Augmented PDOs, shared by the source and sink forms. USB PD R3.2 V1.1 §6.4.1.2.5–7 and
 * §6.4.1.3.4–6 (R3.1 V1.8 Tables 6.13, 6.14, 6.20, 6.21; SPR AVS new in R3.2): B31..30 = 11b,
 * B29..28 the APDO type — 00b SPR PPS, 01b EPR AVS, 10b SPR AVS, 11b Reserved. A sink's PPS has
 * no Power Limited bit and a sink's AVS no Peak Current (reserved there).
 */
import { code, flag, keptReserved, rawWord, units } from './guards.ts';
import { hex32 } from './hex.ts';
import { PDO_TYPE_APDO } from './pdo-layout.ts';
import type { RawObject, SourcePdo } from './types.ts';

export const APDO_TYPE_PPS = 0b00;
export const APDO_TYPE_EPR_AVS = 0b01;
export const APDO_TYPE_SPR_AVS = 0b10;

/** Source APDO reserved bits. */
export const SOURCE_APDO_RESERVED_MASKS = {
  pps: (0b11 << 25) | (1 << 16) | (1 << 7),
  'epr-avs': 1 << 16,
  'spr-avs': 0x3f << 20,
} as const;

/** Sink APDO reserved bits: as the source's, plus the peak-current bits B27..26 and PPS Power Limited. */
export const SINK_APDO_RESERVED_MASKS = {
  pps: (0b111 << 25) | (1 << 16) | (1 << 7),
  'epr-avs': (0b11 << 26) | (1 << 16),
  'spr-avs': 0xff << 20,
} as const;

/** APDO reading shared by source and sink forms (the sink's peak-current bits are reserved). */
export function decodeApdo(raw: number, source: boolean): SourcePdo | RawObject {
  const apdo = (raw >>> 28) & 3;
  if (apdo === APDO_TYPE_PPS) {
    return {
      kind: 'pps',
      raw: hex32(raw),
      minVoltageMv: ((raw >>> 8) & 0xff) * 100,
      maxVoltageMv: ((raw >>> 17) & 0xff) * 100,
      maxCurrentMa: (raw & 0x7f) * 50,
      powerLimited: source && (raw & (1 << 27)) !== 0,
    };
  }
  if (apdo === APDO_TYPE_EPR_AVS) {
    return {
      kind: 'epr-avs',
      raw: hex32(raw),
      minVoltageMv: ((raw >>> 8) & 0xff) * 100,
      maxVoltageMv: ((raw >>> 17) & 0x1ff) * 100,
      pdpW: raw & 0xff,
      peakCurrent: (raw >>> 26) & 3,
    };
  }
  if (apdo === APDO_TYPE_SPR_AVS) {
    return { kind: 'spr-avs', raw: hex32(raw), maxCurrent15vMa: ((raw >>> 10) & 0x3ff) * 10, maxCurrent20vMa: (raw & 0x3ff) * 10, peakCurrent: (raw >>> 26) & 3 };
  }
  return { kind: 'raw', raw: hex32(raw) };
}

/** APDO writer shared by source and sink forms. */
export function encodeApdo(pdo: SourcePdo | RawObject, source: boolean): number {
  const masks = source ? SOURCE_APDO_RESERVED_MASKS : SINK_APDO_RESERVED_MASKS;
  switch (pdo.kind) {
    case 'pps':
      return (
        ((PDO_TYPE_APDO << 30) |
          (APDO_TYPE_PPS << 28) |
          ((source ? flag(pdo.powerLimited, 'powerLimited') : 0) << 27) |
          (units(pdo.maxVoltageMv, 100, 8, 'maxVoltageMv', 'mV') << 17) |
          (units(pdo.minVoltageMv, 100, 8, 'minVoltageMv', 'mV') << 8) |
          units(pdo.maxCurrentMa, 50, 7, 'maxCurrentMa', 'mA') |
          keptReserved(pdo.raw, masks.pps)) >>>
        0
      );
    case 'epr-avs':
      return (
        ((PDO_TYPE_APDO << 30) |
          (APDO_TYPE_EPR_AVS << 28) |
          (code(pdo.peakCurrent, 2, 'peakCurrent') << 26) |
          (units(pdo.maxVoltageMv, 100, 9, 'maxVoltageMv', 'mV') << 17) |
          (units(pdo.minVoltageMv, 100, 8, 'minVoltageMv', 'mV') << 8) |
          units(pdo.pdpW, 1, 8, 'pdpW', 'W') |
          keptReserved(pdo.raw, masks['epr-avs'])) >>>
        0
      );
    case 'spr-avs':
      return (
        ((PDO_TYPE_APDO << 30) |
          (APDO_TYPE_SPR_AVS << 28) |
          (code(pdo.peakCurrent, 2, 'peakCurrent') << 26) |
          (units(pdo.maxCurrent15vMa, 10, 10, 'maxCurrent15vMa', 'mA') << 10) |
          units(pdo.maxCurrent20vMa, 10, 10, 'maxCurrent20vMa', 'mA') |
          keptReserved(pdo.raw, masks['spr-avs'])) >>>
        0
      );
    case 'raw':
      return rawWord(pdo.raw, 'raw');
    default:
      throw new RangeError(`kind: "${(pdo as { kind: string }).kind}" is not a power data object kind`);
  }
}
