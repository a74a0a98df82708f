/**
 * Which side a finding or a Hard Reset cause points at, for the summary sentence: the adapter (the
 * source), the device (the sink) or the cable. Offers, VBUS and the VBUS cycle after a reset are the
 * source's doing; requests, keep-alives and collisions the sink's; a corrupted message points at the
 * line (cable, connector, noise). Otherwise the finding's sentence names its subject first ("The
 * sink did not answer …", "The source sent PS_RDY …"); a missing GoodCRC is the receiver's.
 */
import type { Finding } from '../core/finding.ts';

export type Side = 'adapter' | 'device' | 'cable';

const BY_RULE: Record<string, Side> = {
  'decode.crc': 'cable',
  'caps.revision': 'adapter',
  'request.epr-copy': 'device',
  'request.position': 'device',
  'request.exceeds-offer': 'device',
  'request.out-of-range': 'device',
  'request.cable-current': 'adapter',
  'timing.pps-keepalive': 'device',
  'timing.epr-keepalive': 'device',
  'timing.sink-request': 'device',
  'timing.hard-reset-recovery': 'adapter',
  'timing.caps-interval': 'adapter',
  'protocol.collision': 'device',
  'vbus.out-of-range': 'adapter',
  'vbus.over-current': 'device',
};

const SIDE_OF: Record<string, Side> = { source: 'adapter', sink: 'device', cable: 'cable' };
const OTHER: Record<string, Side> = { source: 'device', sink: 'adapter' };

/** The side a sentence about a port names: its subject, or the receiver when a GoodCRC went missing. */
export function sideOfClause(text: string): Side | undefined {
  if (/^VBUS/i.test(text)) return 'adapter';
  const missingAck = /^the (source|sink)'s .* got no GoodCRC/i.exec(text) ?? /^the (source|sink) sent its .* never got a GoodCRC/i.exec(text);
  if (missingAck) return OTHER[missingAck[1]!.toLowerCase()];
  const subject = /^(?:the|a) (source|sink|cable)\b/i.exec(text);
  return subject ? SIDE_OF[subject[1]!.toLowerCase()] : undefined;
}

export function sideOfFinding(f: Finding): Side | undefined {
  if (f.rule.startsWith('caps.')) return 'adapter';
  return BY_RULE[f.rule] ?? sideOfClause(f.message);
}

export const sideText: Record<Side, string> = { adapter: 'the adapter (source)', device: 'the device (sink)', cable: 'the cable or the line' };
