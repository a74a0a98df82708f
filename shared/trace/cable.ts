/**
 * What the cable said about itself: the Discover Identity ACK a cable plug sends on SOP' (USB PD
 * R3.2 V1.1 §6.4.4.3.1; from memory). Only the three facts the analyser uses are read here, from
 * the raw words:
 * - VDM Header (object 1): B15 Structured, B7..6 Command Type (01b ACK), B4..0 Command (1 Discover Identity);
 * - ID Header VDO (object 2): B29..27 Product Type (UFP / cable plug): 011b Passive Cable, 100b Active Cable;
 * - Passive / Active Cable VDO 1 (object 5, after Cert Stat and Product VDOs): B17 EPR Mode Capable,
 *   B10..9 Maximum VBUS Voltage (00b 20 V, 01b 30 V, 10b 40 V, 11b 50 V), B6..5 VBUS Current Handling
 *   Capability (01b 3 A, 10b 5 A).
 */
import { objectAt } from './decode-cache.ts';
import type { SeenMessage } from './seen.ts';

export interface CableIdentity {
  t: number;
  kind: 'passive' | 'active';
  currentMa: number | undefined;
  maxVoltageMv: number;
  eprCapable: boolean;
}

const VOLTAGES_MV = [20_000, 30_000, 40_000, 50_000];
const CURRENTS_MA: Record<number, number> = { 1: 3_000, 2: 5_000 };

/** The cable's identity from a message, when it is a cable plug's Discover Identity ACK. */
export function cableIdentityOf(m: SeenMessage): CableIdentity | undefined {
  if (m.sop !== "SOP'" || m.from !== 'cable' || m.d.messageType !== 'Vendor_Defined' || !m.crcOk) return undefined;
  const header = objectAt(m.d.bytes, 1);
  const idHeader = objectAt(m.d.bytes, 2);
  const cableVdo = objectAt(m.d.bytes, 5);
  if (header === undefined || idHeader === undefined || cableVdo === undefined) return undefined;
  const structured = (header & 0x8000) !== 0;
  if (!structured || (header & 0x1f) !== 1 || ((header >>> 6) & 3) !== 1) return undefined;
  const productType = (idHeader >>> 27) & 7;
  if (productType !== 3 && productType !== 4) return undefined;
  return {
    t: m.t,
    kind: productType === 3 ? 'passive' : 'active',
    currentMa: CURRENTS_MA[(cableVdo >>> 5) & 3],
    maxVoltageMv: VOLTAGES_MV[(cableVdo >>> 9) & 3]!,
    eprCapable: (cableVdo & (1 << 17)) !== 0,
  };
}

/** "a 3 A, 20 V passive cable" */
export function cableText(c: CableIdentity): string {
  return `a ${c.currentMa !== undefined ? `${c.currentMa / 1_000} A, ` : ''}${c.maxVoltageMv / 1_000} V ${c.kind} cable${c.eprCapable ? ' (EPR capable)' : ''}`;
}
