/**
 * The cable plug of a simulated run as words on SOP': the source's Discover Identity REQ, the
 * cable's ACK (ID Header, Cert Stat, Product and Passive Cable VDOs) and the source's reading of
 * that ACK. Every layout is the codec's (`shared/pd/identity.ts` builds the objects, the VDO tables
 * of `layouts-vdo.ts` place the bits: USB PD R3.2 V1.1 §6.4.4.2 Structured VDM Header,
 * §6.4.4.3.1 Discover Identity and its VDOs); this module only turns them into words and back.
 */
import { cableIdentityAck, cableLimits, discoverIdentityRequest, type CableIdentity } from '../pd/identity.ts';
import { decodeOtherObject, encodeOtherObject } from '../pd/other-objects.ts';
import type { OtherObject } from '../pd/types.ts';
import type { DataObjectInput } from '../pd/encode-message.ts';
import { vdmObjectKinds } from '../pd/vdm-objects.ts';

export interface EMarker {
  currentMa: 3_000 | 5_000 | number;
  maxVoltageMv: 20_000 | 30_000 | 40_000 | 50_000 | number;
  eprCapable: boolean;
}

/** A fictional VID and PID for the simulated cable (Kestrel Devices demo data). */
const CABLE_VID = 0xfffe;
const CABLE_PID = 0x0c50;
const MAX_VOLTAGES = [20_000, 30_000, 40_000, 50_000] as const;

function words(objects: readonly DataObjectInput[] | undefined): number[] {
  return (objects ?? []).map((object) => encodeOtherObject(object as OtherObject));
}

/** The source's Discover Identity REQ to the cable plug: the Structured VDM Header alone. */
export const DISCOVER_IDENTITY_REQ: readonly number[] = Object.freeze(words(discoverIdentityRequest().objects));

const acks = new Map<string, readonly number[]>();
/** The ACK's objects for an e-marker (memoised: a run asks once or twice, a bench thousands of times). */
export function identityAck(marker: EMarker): readonly number[] {
  const key = `${marker.currentMa}|${marker.maxVoltageMv}|${marker.eprCapable}`;
  let objects = acks.get(key);
  if (!objects) {
    const cable: CableIdentity = {
      vbusCurrentMa: marker.currentMa >= 5_000 ? 5_000 : 3_000,
      maxVbusVoltageMv: MAX_VOLTAGES.find((mv) => mv === marker.maxVoltageMv) ?? 20_000,
      eprModeCapable: marker.eprCapable,
      usbVendorId: CABLE_VID,
      usbProductId: CABLE_PID,
      bcdDevice: 0x0100,
      xid: 0,
      hwVersion: 0,
      firmwareVersion: 0,
    };
    objects = Object.freeze(words(cableIdentityAck(cable).objects));
    acks.set(key, objects);
  }
  return objects;
}

/** The command type of a Structured VDM Header ('REQ', 'ACK', 'NAK', 'BUSY'). */
export function vdmCommandType(header: number): string {
  return String(decodeOtherObject('vdm-header', header).commandType);
}

const readings = new WeakMap<readonly number[], EMarker | null>();
/** What the source learns from a Discover Identity ACK on SOP'; null when it is not a cable's ACK. */
export function readIdentity(objects: readonly number[]): EMarker | null {
  let marker = readings.get(objects);
  if (marker !== undefined) return marker;
  marker = null;
  if (objects.length > 0 && vdmCommandType(objects[0]!) === 'ACK') {
    const kinds = vdmObjectKinds(objects, "SOP'");
    const limits = cableLimits({ objects: objects.map((word, i) => decodeOtherObject(kinds[i] ?? 'raw', word)) });
    if (limits && limits.kind !== 'vpd') marker = { currentMa: limits.vbusCurrentMa ?? 3_000, maxVoltageMv: limits.maxVbusVoltageMv, eprCapable: limits.eprModeCapable };
  }
  readings.set(objects, marker);
  return marker;
}

/** A cable that answered nothing: 3 A, 20 V (USB Type-C R2.3 §4.9: every cable carries 3 A, from memory). */
export const UNMARKED_CABLE: EMarker = { currentMa: 3_000, maxVoltageMv: 20_000, eprCapable: false };

/** EPR needs a 50 V, 5 A, EPR-capable cable (USB PD R3.2 V1.1 §6.4.10, from memory). */
export function cableAllowsEpr(marker: EMarker | null): boolean {
  if (marker === null) return false;
  return marker.eprCapable && marker.maxVoltageMv >= 50_000 && marker.currentMa >= 5_000;
}
