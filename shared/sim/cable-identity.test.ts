/**
 * The simulated cable's words on SOP', built by the codec (shared/pd/identity.ts, layouts-vdo.ts):
 * the same words the simulator sent when it placed the bits itself (USB PD R3.2 V1.1 §6.4.4.2
 * Structured VDM Header; §6.4.4.3.1 ID Header, Cert Stat, Product and Passive Cable VDOs).
 */
import { describe, expect, it } from 'vitest';
import { decodeMessage } from '../pd/index.ts';
import { DISCOVER_IDENTITY_REQ, identityAck, readIdentity, vdmCommandType } from './cable-identity.ts';

const hex = (words: readonly number[]) => words.map((word) => (word >>> 0).toString(16).padStart(8, '0'));

describe('the cable plug on SOP', () => {
  it('asks with a Discover Identity REQ: PD SID, structured, SVDM 2.x, command 1', () => {
    expect(hex(DISCOVER_IDENTITY_REQ)).toEqual(['ff00a001']);
    expect(vdmCommandType(DISCOVER_IDENTITY_REQ[0]!)).toBe('REQ');
  });

  it.each([
    // Passive Cable VDO: b19..18 10b Type-C plug, b17 EPR Mode Capable, b16..13 latency 0001b, b10..9 max VBUS, b6..5 current.
    [{ currentMa: 5_000, maxVoltageMv: 50_000, eprCapable: true }, '000a2640'],
    [{ currentMa: 5_000, maxVoltageMv: 20_000, eprCapable: false }, '00082040'],
    [{ currentMa: 3_000, maxVoltageMv: 20_000, eprCapable: false }, '00082020'],
    [{ currentMa: 5_000, maxVoltageMv: 30_000, eprCapable: false }, '00082240'],
    [{ currentMa: 3_000, maxVoltageMv: 40_000, eprCapable: true }, '000a2420'],
  ])('answers %o with the same words as before (passive VDO %s) and reads them back', (marker, passive) => {
    const words = identityAck(marker);
    // ACK header, ID Header (passive cable, Type-C plug, VID 0xFFFE), Cert Stat, Product (PID 0x0C50, bcdDevice 0x0100).
    expect(hex(words)).toEqual(['ff00a041', '1860fffe', '00000000', '0c500100', passive]);
    expect(readIdentity(words)).toEqual(marker);
  });

  it('is what the codec decodes as a passive cable on SOP', () => {
    const words = identityAck({ currentMa: 5_000, maxVoltageMv: 50_000, eprCapable: true });
    const bytes = new Uint8Array(2 + words.length * 4);
    bytes[0] = 0x8f; // Vendor_Defined (b4..0 = 15), revision 3.0 (b7..6 = 10b)
    bytes[1] = 0x51; // Cable Plug (b8), MessageID 0, five objects (b14..12)
    const view = new DataView(bytes.buffer);
    for (const [i, word] of words.entries()) view.setUint32(2 + i * 4, word, true);
    const decoded = decodeMessage(bytes, { sop: "SOP'" });
    expect(decoded.ok && decoded.message.objects.map((o) => o.kind)).toEqual(['vdm-header', 'cable-id-header', 'cert-stat', 'product', 'passive-cable']);
  });

  it('reads nothing from a NAK or a REQ', () => {
    expect(readIdentity([...DISCOVER_IDENTITY_REQ])).toBeNull();
    expect(readIdentity([0xff00_a081])).toBeNull();
  });
});
