/**
 * The cable plug's answer to Discover Identity on SOP': a structured VDM ACK with the ID Header,
 * Cert Stat, Product and Passive Cable VDOs, and the reading of that answer by the source.
 *
 * USB PD R3.2 V1.1 §6.4.4.2 Structured VDM header (SVID 0xFF00 = PD SID, b15 structured, b14..13
 * SVDM major version 01b = 2.x, b7..6 command type 00 REQ / 01 ACK / 10 NAK / 11 BUSY, b4..0 command,
 * Discover Identity = 1); §6.4.4.3.1.1 ID Header VDO (b29..27 product type SOP': 011b passive cable,
 * b22..21 connector type 10b receptacle / 11b plug, b15..0 USB VID); §6.4.4.3.1.2 Cert Stat VDO (XID);
 * §6.4.4.3.1.3 Product VDO (PID b31..16, bcdDevice b15..0); §6.4.4.3.1.6 Passive Cable VDO (b17 EPR
 * Capable, b10..9 Maximum VBUS Voltage 00b 20 V / 01b 30 V / 10b 40 V / 11b 50 V, b6..5 VBUS Current
 * Handling 01b 3 A / 10b 5 A, b19..18 10b USB Type-C plug). Bit positions from memory.
 */

export interface EMarker {
  currentMa: 3_000 | 5_000 | number;
  maxVoltageMv: 20_000 | 30_000 | 40_000 | 50_000 | number;
  eprCapable: boolean;
}

export const PD_SID = 0xff00;
export const DISCOVER_IDENTITY = 1;
/** A fictional VID and PID for the simulated cable (Kestrel Devices demo data). */
const CABLE_VID = 0xfffe;
const CABLE_PID = 0x0c50;

/** The structured VDM header: Discover Identity, REQ or ACK (SVDM version 2.x). */
export function vdmHeader(commandType: 'req' | 'ack' | 'nak' | 'busy', command = DISCOVER_IDENTITY): number {
  const type = commandType === 'req' ? 0 : commandType === 'ack' ? 1 : commandType === 'nak' ? 2 : 3;
  return ((PD_SID << 16) | (1 << 15) | (0b01 << 13) | (type << 6) | (command & 0x1f)) >>> 0;
}

export function vdmCommandType(header: number): 'req' | 'ack' | 'nak' | 'busy' {
  const types = ['req', 'ack', 'nak', 'busy'] as const;
  return types[(header >>> 6) & 0b11] ?? 'req';
}

const VOLTAGE_CODES: Record<number, number> = { 20_000: 0b00, 30_000: 0b01, 40_000: 0b10, 50_000: 0b11 };

/** The ACK's objects: VDM header, ID Header, Cert Stat, Product, Passive Cable VDO. */
export function identityAck(marker: EMarker): number[] {
  const idHeader = ((0b011 << 27) | (0b11 << 21) | CABLE_VID) >>> 0;
  const certStat = 0;
  const product = ((CABLE_PID << 16) | 0x0100) >>> 0;
  const passive = ((0b10 << 18) | ((marker.eprCapable ? 1 : 0) << 17) | (0b0001 << 13) | ((VOLTAGE_CODES[marker.maxVoltageMv] ?? 0) << 9) | ((marker.currentMa >= 5_000 ? 0b10 : 0b01) << 5)) >>> 0;
  return [vdmHeader('ack'), idHeader, certStat, product, passive];
}

/** What the source learns from a Discover Identity ACK; null when it is not a passive cable's ACK. */
export function readIdentity(objects: readonly number[]): EMarker | null {
  const [header, idHeader, , , passive] = objects;
  if (header === undefined || idHeader === undefined || passive === undefined) return null;
  if (header >>> 16 !== PD_SID || vdmCommandType(header) !== 'ack' || ((idHeader >>> 27) & 0b111) !== 0b011) return null;
  const voltageCode = (passive >>> 9) & 0b11;
  return {
    currentMa: ((passive >>> 5) & 0b11) === 0b10 ? 5_000 : 3_000,
    maxVoltageMv: [20_000, 30_000, 40_000, 50_000][voltageCode]!,
    eprCapable: ((passive >>> 17) & 1) === 1,
  };
}

/** A cable that answered nothing: 3 A, 20 V (USB Type-C R2.3 §4.9: every cable carries 3 A, from memory). */
export const UNMARKED_CABLE: EMarker = { currentMa: 3_000, maxVoltageMv: 20_000, eprCapable: false };

/** EPR needs a 50 V, 5 A, EPR-capable cable (USB PD R3.2 V1.1 §6.4.10, from memory). */
export function cableAllowsEpr(marker: EMarker | null): boolean {
  if (marker === null) return false;
  return marker.eprCapable && marker.maxVoltageMv >= 50_000 && marker.currentMa >= 5_000;
}
