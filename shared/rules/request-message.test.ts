import { describe, expect, it } from 'vitest';
import { decodeMessage, parseHex } from '../pd/index.ts';
import { chooseRequest } from './choose-request.ts';
import { eprAvsApdo, fixedPdo as fixed, paddingPdo } from './pdo-builders.ts';
import { requestMessageHex } from './request-message.ts';

describe('requestMessageHex', () => {
  it('a Request with one RDO (data type 2, USB PD R3.1 V1.8 Table 6-6, from memory)', () => {
    const offers = [fixed(5_000, 3_000), fixed(9_000, 3_000)];
    const chosen = chooseRequest(offers, { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 });
    const r = requestMessageHex(chosen.rdo, offers[1]!);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // header: NDO 1 << 12 | revision 3.0 (10b) << 6 | type 2 = 0x1082, then the RDO 0x200320c8, little-endian
    expect(r.hex).toBe('8210c8200320');
  });
  it('an EPR_Request with the RDO and the PDO copy for position 8', () => {
    const offers = [fixed(5_000, 3_000), fixed(20_000, 5_000), ...Array.from({ length: 5 }, paddingPdo), fixed(28_000, 5_000), eprAvsApdo(15_000, 28_000, 140)];
    const chosen = chooseRequest(offers, { kind: 'max-power' }, { cableMa: 5_000, epr: true });
    const r = requestMessageHex(chosen.rdo, offers[7]!);
    const bytes = r.ok ? parseHex(r.hex) : r;
    const decoded = bytes.ok ? decodeMessage(bytes.bytes) : bytes;
    expect(decoded.ok && decoded.message.header.messageType).toBe('EPR_Request');
    expect(decoded.ok && decoded.message.objects.length).toBe(2);
  });
});
