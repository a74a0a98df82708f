/**
 * Collision avoidance in USB PD 3.x (USB PD R3.2 V1.1 §5.7; USB Type-C R2.3 §4.8.1.3 — from
 * memory): the source says through its Rp who may start the next exchange — Rp at 3.0 A is
 * SinkTxOK, Rp at 1.5 A is SinkTxNG. After setting SinkTxNG the source waits tSinkTx before it
 * starts, so a sink that began within tSinkTx of the change may simply not have seen it yet; a sink
 * that starts an exchange later than that collides.
 *
 * "Starts an exchange": a message of the kinds a sink sends on its own (requests, swaps, Get_*,
 * EPR_Mode, keep-alives, a VDM request), not an answer to the source. A Request within
 * tSenderResponse of Source_Capabilities answers them; FR_Swap, Soft_Reset and Hard Reset are exempt.
 */
import { timersFor } from '../core/timers.ts';
import { objectAt } from './decode-cache.ts';
import { millis, seconds } from './format.ts';
import type { Report, SeenMessage } from './seen.ts';

const SINK_STARTS = new Set([
  'Request',
  'EPR_Request',
  'Get_Source_Cap',
  'Get_Sink_Cap',
  'Get_Source_Cap_Extended',
  'Get_Status',
  'Get_PPS_Status',
  'Get_Country_Codes',
  'Get_Country_Info',
  'Get_Manufacturer_Info',
  'Get_Battery_Cap',
  'Get_Battery_Status',
  'Get_Revision',
  'Get_Source_Info',
  'Get_Sink_Cap_Extended',
  'PR_Swap',
  'DR_Swap',
  'VCONN_Swap',
  'Data_Reset',
  'Alert',
  'EPR_Mode',
  'Extended_Control',
  'Vendor_Defined',
]);
const OFFERS = new Set(['Source_Capabilities', 'EPR_Source_Capabilities']);

export interface CollisionWatch {
  /** The source set its Rp (`rp` event): "1.5A" is SinkTxNG, "3.0A" SinkTxOK. */
  onRp(t: number, rp: string | undefined): void;
  /** Every message the receiver took. */
  onMessage(m: SeenMessage): void;
  reset(): void;
}

export function createCollisionWatch(report: Report): CollisionWatch {
  let sinkTxNgSinceUs: number | undefined;
  let lastOfferEndUs: number | undefined;
  const { tSinkTx, tSenderResponse } = timersFor('3.0');

  const startsExchange = (m: SeenMessage): boolean => {
    const type = m.d.messageType;
    if (!SINK_STARTS.has(type)) return false;
    if ((type === 'Request' || type === 'EPR_Request') && lastOfferEndUs !== undefined && m.t - lastOfferEndUs <= tSenderResponse.maxUs) return false;
    if (type === 'Vendor_Defined') {
      const header = objectAt(m.d.bytes, 1);
      // Structured VDM: Command Type 00b is a request (§6.4.4.2); an unstructured one counts as starting.
      if (header !== undefined && (header & 0x8000) !== 0 && ((header >>> 6) & 3) !== 0) return false;
    }
    if (type === 'Extended_Control' || type === 'EPR_Mode') return m.d.message.extendedHeader?.requestChunk !== true;
    return true;
  };

  return {
    onRp(t, rp) {
      if (rp === '1.5A') sinkTxNgSinceUs ??= t;
      else sinkTxNgSinceUs = undefined;
    },
    onMessage(m) {
      if (m.sop !== 'SOP') return;
      if (m.from === 'source' && OFFERS.has(m.d.messageType)) lastOfferEndUs = m.endUs;
      if (m.from !== 'sink' || sinkTxNgSinceUs === undefined || m.d.revision !== '3.0') return;
      const heldUs = m.t - sinkTxNgSinceUs;
      if (heldUs <= tSinkTx.maxUs || !startsExchange(m)) return;
      report(
        'protocol.collision',
        `The sink started ${m.d.messageType} at ${seconds(m.t)} while the source's Rp said SinkTxNG (1.5 A since ${seconds(sinkTxNgSinceUs)}, ${millis(heldUs)} before, more than tSinkTx ${millis(tSinkTx.maxUs)}).`,
        { t: m.t, ...(m.line !== undefined ? { line: m.line } : {}), ref: tSinkTx.ref },
      );
    },
    reset() {
      sinkTxNgSinceUs = undefined;
      lastOfferEndUs = undefined;
    },
  };
}
