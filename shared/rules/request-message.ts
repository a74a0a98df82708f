/**
 * The Request message (hex, as sent) for a chosen RDO: a Request, or for an EPR offer (position 8
 * and up) an EPR_Request carrying the RDO and a copy of the PDO it requests (USB PD R3.1 V1.8
 * §6.4.9 EPR_Request Message — from memory). Sent by a sink as UFP; MessageID 0.
 */
import type { Result } from '../core/result.ts';
import { encodeMessage, toHex } from '../pd/index.ts';
import type { Rdo, SourcePdo, SpecRevision } from '../pd/types.ts';
import { FIRST_EPR_POSITION } from './pdo-facts.ts';

export function requestMessageHex(rdo: Rdo, pdo: SourcePdo, options: { specRevision?: SpecRevision; messageId?: number } = {}): Result<{ hex: string }> {
  const epr = rdo.objectPosition >= FIRST_EPR_POSITION;
  const encoded = encodeMessage({
    sop: 'SOP',
    header: {
      messageType: epr ? 'EPR_Request' : 'Request',
      messageId: options.messageId ?? 0,
      specRevision: epr ? '3.0' : (options.specRevision ?? '3.0'),
      powerRole: 'sink',
      dataRole: 'ufp',
      extended: false,
    },
    objects: epr ? [rdo, pdo] : [rdo],
  });
  return encoded.ok ? { ok: true, hex: toHex(encoded.bytes) } : encoded;
}
