/**
 * What the cable said about itself: the Discover Identity ACK a cable plug sends on SOP' (USB PD
 * R3.2 V1.1 §6.4.4.3.1), read by the codec field by field (shared/pd cableLimits: Passive / Active
 * Cable VDO — VBUS Current Handling Capability, Maximum VBUS Voltage, EPR Mode Capable — or a VPD).
 */
import { cableLimits } from '../pd/index.ts';
import type { SeenMessage } from './seen.ts';

export interface CableIdentity {
  t: number;
  kind: 'passive' | 'active' | 'vpd';
  /** Undefined when the VDO names no current. */
  currentMa: number | undefined;
  maxVoltageMv: number;
  eprCapable: boolean;
}

/** The cable's identity from a message, when it is a cable plug's Discover Identity ACK. */
export function cableIdentityOf(m: SeenMessage): CableIdentity | undefined {
  if (m.sop !== "SOP'" || m.from !== 'cable' || m.d.messageType !== 'Vendor_Defined' || !m.crcOk) return undefined;
  const limits = cableLimits(m.d.message);
  if (!limits) return undefined;
  return { t: m.t, kind: limits.kind, currentMa: limits.vbusCurrentMa ?? undefined, maxVoltageMv: limits.maxVbusVoltageMv, eprCapable: limits.eprModeCapable };
}

/** "a 3 A, 20 V passive cable" */
export function cableText(c: CableIdentity): string {
  return `a ${c.currentMa !== undefined ? `${c.currentMa / 1_000} A, ` : ''}${c.maxVoltageMv / 1_000} V ${c.kind === 'vpd' ? 'VCONN-powered device' : `${c.kind} cable`}${c.eprCapable ? ' (EPR capable)' : ''}`;
}
