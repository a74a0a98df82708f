/**
 * SPR messages for the wire cross-checks, wire-order hex without CRC, each built by hand from the
 * field layouts of USB PD R3.2 V1.1: message header §6.2.1.1 (Table 6.1), fixed and PPS source
 * PDOs §6.4.1.2/§6.4.1.3 (Tables 6.9, 6.14), sink fixed PDO §6.4.1.3 (Table 6.17), fixed RDO
 * §6.4.2 (Table 6.22), structured VDM header §6.4.4.2 (Table 6.29). Table numbers from memory;
 * header words: type[4:0], data role[5], revision[7:6] (10b = 3.x), power role / cable plug[8],
 * message id[11:9], object count[14:12]. The demo port is a fictional Kestrel Devices adapter.
 */
const le16 = (v: number) => [v & 0xff, v >> 8].map((b) => b.toString(16).padStart(2, '0')).join('');
const le32 = (v: number) => [0, 8, 16, 24].map((s) => ((v >>> s) & 0xff).toString(16).padStart(2, '0')).join('');
const message = (header: number, objects: number[] = []) => le16(header) + objects.map(le32).join('');

export interface WireFixture {
  name: string;
  sop: 'SOP' | "SOP'";
  header: number;
  objects: number[];
  hex: string;
}

function fixture(name: string, header: number, objects: number[] = [], sop: WireFixture['sop'] = 'SOP'): WireFixture {
  return { name, sop, header, objects, hex: message(header, objects) };
}

// Fixed 5 V 3 A (dual-role power, USB communications, dual-role data), 9 V 3 A, 12 V 3 A, 15 V 3 A, 20 V 3.25 A.
const FIXED_5V = 0x2601_912c;
const FIXED_9V = 0x0002_d12c;
const FIXED_12V = 0x0003_c12c;
const FIXED_15V = 0x0004_b12c;
const FIXED_20V = 0x0006_4145;
// PPS 3.3–11 V 3 A and 3.3–21 V 3 A.
const PPS_11V = 0xc0dc_213c;
const PPS_21V = 0xc1a4_213c;

export const WIRE_FIXTURES: WireFixture[] = [
  fixture('Source_Capabilities (5 PDOs)', 0x51a1, [FIXED_5V, FIXED_9V, FIXED_15V, FIXED_20V, PPS_11V]),
  fixture('GoodCRC', 0x0081),
  fixture('Source_Capabilities (6 PDOs)', 0x63a1, [FIXED_5V, FIXED_9V, FIXED_15V, FIXED_20V, PPS_11V, PPS_21V]),
  fixture('Source_Capabilities (7 PDOs)', 0x75a1, [FIXED_5V, FIXED_9V, FIXED_12V, FIXED_15V, FIXED_20V, PPS_11V, PPS_21V]),
  // Request object 2 (9 V), 3 A operating and maximum, USB communications capable, no USB suspend.
  fixture('Request', 0x1282, [0x2304_b12c]),
  fixture('Accept', 0x07a3),
  fixture('PS_RDY', 0x09a6),
  // Sink fixed 5 V 3 A (higher capability, USB communications) and 9 V 2 A.
  fixture('Sink_Capabilities', 0x2484, [0x1401_912c, 0x0002_d0c8]),
  // Discover Identity request, SVID 0xFF00, structured VDM version 2.0.
  fixture('Vendor_Defined', 0x1baf, [0xff00_a001]),
  fixture("Vendor_Defined on SOP'", 0x108f, [0xff00_a001], "SOP'"),
];
