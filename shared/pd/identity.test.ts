import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { discoverIdentityArb, layoutObjectArb } from './arbitraries.ts';
import { decodeMessage } from './decode-message.ts';
import { encodeMessage, type MessageInput } from './encode-message.ts';
import { parseWords, toHex } from './hex.ts';
import { cableIdentityAck, cableLimits, discoverIdentityAck, discoverIdentityRequest, discoverSvidsAck } from './identity.ts';
import { VDO_LAYOUTS } from './layouts-vdo.ts';
import { decodeOtherObject, encodeOtherObject } from './other-objects.ts';
import type { Message, Sop } from './types.ts';

function decodeWords(words: string[], sop: Sop): Message {
  const bytes = parseWords(words);
  if (!bytes.ok) throw new Error(bytes.error.message);
  const r = decodeMessage(bytes.bytes, { sop });
  if (!r.ok) throw new Error(r.error.message);
  expect(r.warnings).toEqual([]);
  return r.message;
}

function encoded(input: MessageInput): Uint8Array {
  const r = encodeMessage(input);
  if (!r.ok) throw new Error(r.error.message);
  return r.bytes;
}

// Words assembled by hand from the tables (USB PD R3.1 V1.8 / R3.2 V1.1 §6.4.4.2 Structured VDM
// Header; §6.4.4.3.1.1 ID Header VDO, .6 Passive Cable VDO; table numbers from memory):
// VDM header 0xff00a041 = SVID 0xFF00, Structured, version 2.0 (01b.00b), ACK (01b), Discover Identity (1).
// ID header 0x18601234 = Product Type (Cable Plug) 011b Passive Cable, Connector Type 11b USB Type-C Plug, VID 0x1234.
// Passive Cable VDO 0x120a2640 = HW 1, FW 2, VDO version 0, B19..18 10b USB Type-C, B17 EPR Mode Capable,
//   B16..13 0001b <10 ns, B10..9 11b 50 V, B6..5 10b 5 A, B2..0 000b USB 2.0 only.
// Message header 0x518f = 5 objects, MessageID 0, Cable Plug 1, revision 3.x, type 01111b Vendor_Defined (Table 6.6).
const PASSIVE_5A_EPR = ['0x518f', '0xff00a041', '0x18601234', '0x00000000', '0x56780100', '0x120a2640'];

describe("Discover Identity ACK from a cable plug (SOP')", () => {
  it('decodes a passive 5 A, 50 V, EPR-capable cable field by field', () => {
    const m = decodeWords(PASSIVE_5A_EPR, "SOP'");
    expect(m.header).toMatchObject({ messageType: 'Vendor_Defined', cablePlug: true, numDataObjects: 5 });
    expect(m.objects.map((o) => o.kind)).toEqual(['vdm-header', 'cable-id-header', 'cert-stat', 'product', 'passive-cable']);
    expect(m.objects[0]).toMatchObject({ svid: 0xff00, structured: true, commandType: 'ACK', command: 'Discover Identity' });
    expect(m.objects[1]).toMatchObject({
      raw: '0x18601234',
      productTypeCablePlug: 'Passive Cable',
      connectorType: 'USB Type-C Plug',
      usbVendorId: 0x1234,
      modalOperationSupported: false,
      usbCommunicationsCapableAsHost: false,
    });
    expect(m.objects[2]).toEqual({ kind: 'cert-stat', raw: '0x00000000', xid: 0 });
    expect(m.objects[3]).toEqual({ kind: 'product', raw: '0x56780100', usbProductId: 0x5678, bcdDevice: 0x0100 });
    expect(m.objects[4]).toEqual({
      kind: 'passive-cable',
      raw: '0x120a2640',
      hwVersion: 1,
      firmwareVersion: 2,
      vdoVersion: 0,
      plugToPlugOrCaptive: 'USB Type-C',
      eprModeCapable: true,
      cableLatency: '<10 ns (~1 m)',
      cableTerminationType: 'VCONN not required',
      maximumVbusVoltage: '50 V',
      vbusCurrentHandlingCapability: '5 A',
      usbHighestSpeed: 'USB 2.0 only',
      maxVbusVoltageMv: 50_000,
      vbusCurrentMa: 5_000,
    });
    expect(cableLimits(m)).toEqual({ kind: 'passive', vbusCurrentMa: 5_000, maxVbusVoltageMv: 50_000, eprModeCapable: true });
  });

  it('the builder makes the same words as the hand-assembled message', () => {
    const built = cableIdentityAck({ vbusCurrentMa: 5_000, maxVbusVoltageMv: 50_000, eprModeCapable: true, usbVendorId: 0x1234, usbProductId: 0x5678 });
    // The builder's HW/FW versions are 1/1, so only the passive VDO's top byte differs.
    const words = parseWords(PASSIVE_5A_EPR.slice(0, 5).concat('0x110a2640'));
    expect(words.ok && toHex(encoded(built))).toBe(words.ok ? toHex(words.bytes) : '');
  });

  it('reads a 3 A, 20 V passive cable: no EPR (R3.1 §6.4.4.3.1.6: VBUS current 01b = 3 A, voltage 00b = 20 V)', () => {
    const m = decodeWords(['0x518f', '0xff00a041', '0x18601234', '0x00000000', '0x56780100', '0x11082020'], "SOP'");
    expect(cableLimits(m)).toEqual({ kind: 'passive', vbusCurrentMa: 3_000, maxVbusVoltageMv: 20_000, eprModeCapable: false });
  });

  it('reads an active cable: VDO1 and VDO2 follow the Product VDO', () => {
    const input = cableIdentityAck({ active: true, vbusCurrentMa: 3_000, usbHighestSpeed: 'USB4 Gen3' });
    const r = decodeMessage(encoded(input), { sop: "SOP'" });
    expect(r.ok && r.message.objects.map((o) => o.kind)).toEqual(['vdm-header', 'cable-id-header', 'cert-stat', 'product', 'active-cable-1', 'active-cable-2']);
    if (!r.ok) return;
    expect(r.message.objects[1]).toMatchObject({ productTypeCablePlug: 'Active Cable' });
    expect(r.message.objects[4]).toMatchObject({ vbusCurrentHandlingCapability: '3 A', vdoVersion: 3, vbusThroughCable: true, usbHighestSpeed: 'USB4 Gen3', sbuSupported: false });
    expect(r.message.objects[5]).toMatchObject({ maxOperatingTemperatureC: 70, shutdownTemperatureC: 85, activeElement: 'Active Re-timer', usb2Supported: true });
    // "USB 2.0 Supported": 0b = supported (an inverted bit), so bit 5 of VDO2 is clear.
    expect(parseInt(String(r.message.objects[5]!.raw), 16) & 0x20).toBe(0);
    expect(cableLimits(r.message)).toEqual({ kind: 'active', vbusCurrentMa: 3_000, maxVbusVoltageMv: 20_000, eprModeCapable: false });
  });

  it('an active cable whose current code is 00b names no current (USB Type-C default)', () => {
    const object = decodeOtherObject('active-cable-1', 0x0060_0000);
    expect(object).toMatchObject({ vbusCurrentHandlingCapability: 'USB Type-C Default Current', vbusCurrentMa: null });
  });

  it('reads a VPD VDO: impedances in 2 mΩ and 1 mΩ units, Charge Through current', () => {
    // B16..15 00b 20 V, B14 1 = 5 A, B12..7 = 10 (20 mΩ), B6..1 = 15 (15 mΩ), B0 charge through.
    const raw = (1 << 14) | (10 << 7) | (15 << 1) | 1;
    expect(decodeOtherObject('vpd', raw)).toMatchObject({
      maximumVbusVoltage: '20 V',
      chargeThroughCurrentSupport: '5 A',
      vbusImpedanceMohm: 20,
      groundImpedanceMohm: 15,
      chargeThroughSupport: true,
      chargeThroughCurrentMa: 5_000,
    });
  });

  it("the request to the cable is the VDM header alone, on SOP' with Cable Plug = 0", () => {
    const r = decodeMessage(encoded(discoverIdentityRequest()), { sop: "SOP'" });
    expect(r.ok && r.message.header).toMatchObject({ numDataObjects: 1, cablePlug: false });
    expect(r.ok && r.message.objects[0]).toMatchObject({ commandType: 'REQ', command: 'Discover Identity' });
  });
});

describe('Discover Identity ACK from a port partner (SOP)', () => {
  it('the same ID header code 011b on SOP is a PSD, with no Product Type VDO after the Product VDO', () => {
    const m = decodeWords(['0x5f8f', '0xff00a041', '0x18601234', '0x00000000', '0x56780100', '0x120a2640'], 'SOP');
    expect(m.objects.map((o) => o.kind)).toEqual(['vdm-header', 'id-header', 'cert-stat', 'product', 'raw']);
    expect(m.objects[1]).toMatchObject({ productTypeUfp: 'PSD', productTypeDfp: 'Not a DFP' });
  });

  it('a hub that is both UFP and DFP sends UFP VDO, a zero pad, then DFP VDO (from memory)', () => {
    const input = discoverIdentityAck([
      {
        kind: 'id-header',
        usbCommunicationsCapableAsHost: true,
        usbCommunicationsCapableAsDevice: true,
        productTypeUfp: 'PDUSB Hub',
        modalOperationSupported: false,
        productTypeDfp: 'PDUSB Hub',
        connectorType: 'USB Type-C Receptacle',
        usbVendorId: 0x1234,
      },
      { kind: 'cert-stat', xid: 42 },
      { kind: 'product', usbProductId: 1, bcdDevice: 2 },
      {
        kind: 'ufp',
        ufpVdoVersion: 3,
        usb4DeviceCapable: false,
        usb32DeviceCapable: true,
        usb2BillboardOnly: false,
        usb2DeviceCapable: true,
        connectorTypeLegacy: 0,
        vconnPower: '1 W',
        vconnRequired: false,
        vbusRequired: true,
        nonReconfigurableAlternateModes: false,
        reconfigurableAlternateModes: false,
        tbt3AlternateMode: false,
        usbHighestSpeed: 'USB 3.2 Gen1',
      },
      { kind: 'pad' },
      { kind: 'dfp', dfpVdoVersion: 2, usb4HostCapable: false, usb32HostCapable: true, usb2HostCapable: true, connectorTypeLegacy: 0, portNumber: 3 },
    ]);
    const bytes = encoded(input);
    const r = decodeMessage(bytes, { sop: 'SOP' });
    expect(r.ok && r.message.objects.map((o) => o.kind)).toEqual(['vdm-header', 'id-header', 'cert-stat', 'product', 'ufp', 'pad', 'dfp']);
    if (!r.ok) return;
    expect(r.warnings).toEqual([]);
    // VBUS Required is 0b = yes: bit 6 of the UFP VDO is clear.
    expect(parseInt(String(r.message.objects[4]!.raw), 16) & 0x40).toBe(0);
    expect(r.message.objects[6]).toMatchObject({ portNumber: 3, usb32HostCapable: true });
  });
});

describe('Discover SVIDs ACK', () => {
  it('lists two SVIDs a VDO and ends with a zero SVID', () => {
    const r = decodeMessage(encoded(discoverSvidsAck([0xff01, 0x8087])), { sop: 'SOP' });
    expect(r.ok && r.message.objects.slice(1)).toEqual([
      { kind: 'svids', raw: '0xff018087', svidN: 0xff01, svidNPlus1: 0x8087 },
      { kind: 'svids', raw: '0x00000000', svidN: 0, svidNPlus1: 0 },
    ]);
  });
});

describe('VDO round trips', () => {
  it('every VDO layout: decode(encode(x)) = x, and any 32-bit word decodes and encodes back to itself', () => {
    for (const layout of Object.values(VDO_LAYOUTS)) {
      fc.assert(
        fc.property(layoutObjectArb(layout), (object) => {
          const raw = encodeOtherObject(object as never);
          expect(decodeOtherObject(layout.kind, raw)).toMatchObject(object);
        }),
        { numRuns: 300 },
      );
      fc.assert(
        fc.property(fc.integer({ min: 0, max: 0xffff_ffff }), (raw) => {
          expect(encodeOtherObject(decodeOtherObject(layout.kind, raw))).toBe(raw);
        }),
        { numRuns: 300 },
      );
    }
  });

  it('every Discover Identity / SVIDs ACK the arbitraries make survives the message codec', () => {
    fc.assert(
      fc.property(discoverIdentityArb, ({ message }) => {
        const r = decodeMessage(encoded(message), { sop: message.sop });
        expect(r.ok && r.message).toMatchObject(message);
      }),
      { numRuns: 500 },
    );
  });
});
