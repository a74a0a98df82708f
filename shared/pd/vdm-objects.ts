/**
 * Which VDO each position of a Vendor_Defined message holds, from its Structured VDM Header
 * (USB PD R3.2 V1.1 §6.4.4.2, §6.4.4.3.1 Discover Identity, §6.4.4.3.2 Discover SVIDs):
 * - Discover Identity ACK (SVID 0xFF00): ID Header VDO, Cert Stat VDO, Product VDO, then the
 *   Product Type VDOs the ID Header names. On SOP'/SOP'' (a cable plug or VPD): Passive Cable VDO,
 *   Active Cable VDO1 + VDO2, or VPD VDO. On SOP: UFP VDO for a hub or peripheral, DFP VDO for a
 *   hub, host or power brick; a port that is both sends UFP VDO, a zero pad, DFP VDO (from memory).
 * - Discover SVIDs ACK (SVID 0xFF00): two SVIDs a VDO.
 * Anything else (Discover Modes' mode VDOs, Attention, vendor VDMs) stays `raw`.
 */
import type { Sop } from './types.ts';

/** The PD SID (USB PD R3.2 V1.1 §6.4.4.2: the SVID of Discover Identity and Discover SVIDs). */
export const PD_SID = 0xff00;
const COMMAND_DISCOVER_IDENTITY = 1;
const COMMAND_DISCOVER_SVIDS = 2;
const COMMAND_TYPE_ACK = 1;

/** ID Header codes that a Product Type VDO follows (R3.1 Table 6.33; see layouts-vdo.ts). */
const CABLE_PASSIVE = 3;
const CABLE_ACTIVE = 4;
const VPD = 6;
const UFP_WITH_VDO = new Set([1, 2]); // PDUSB Hub, PDUSB Peripheral
const DFP_WITH_VDO = new Set([1, 2, 3]); // PDUSB Hub, PDUSB Host, Power Brick

/** The object kind at each position (index 0 is the VDM header); undefined means `raw`. */
export function vdmObjectKinds(words: ArrayLike<number>, sop: Sop): (string | undefined)[] {
  const kinds: (string | undefined)[] = new Array(words.length).fill(undefined);
  if (words.length === 0) return kinds;
  kinds[0] = 'vdm-header';
  const header = words[0]! >>> 0;
  const structured = (header & 0x8000) !== 0;
  if (!structured || header >>> 16 !== PD_SID || ((header >>> 6) & 3) !== COMMAND_TYPE_ACK) return kinds;
  const command = header & 0x1f;
  if (command === COMMAND_DISCOVER_SVIDS) {
    for (let i = 1; i < words.length; i++) kinds[i] = 'svids';
    return kinds;
  }
  if (command !== COMMAND_DISCOVER_IDENTITY || words.length < 2) return kinds;
  const cable = sop !== 'SOP';
  const idHeader = words[1]! >>> 0;
  const order = ['cert-stat', 'product', ...productTypeKinds(idHeader, cable)];
  kinds[1] = cable ? 'cable-id-header' : 'id-header';
  for (let i = 2; i < words.length && i - 2 < order.length; i++) kinds[i] = order[i - 2];
  return kinds;
}

function productTypeKinds(idHeader: number, cable: boolean): string[] {
  const upper = (idHeader >>> 27) & 7;
  if (cable) {
    if (upper === CABLE_PASSIVE) return ['passive-cable'];
    if (upper === CABLE_ACTIVE) return ['active-cable-1', 'active-cable-2'];
    if (upper === VPD) return ['vpd'];
    return [];
  }
  const ufp = UFP_WITH_VDO.has(upper);
  const dfp = DFP_WITH_VDO.has((idHeader >>> 23) & 7);
  if (ufp && dfp) return ['ufp', 'pad', 'dfp'];
  if (ufp) return ['ufp'];
  if (dfp) return ['dfp'];
  return [];
}
