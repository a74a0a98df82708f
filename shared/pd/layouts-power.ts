/**
 * Layouts of headers, PDOs and RDOs for the bit-field view and the reserved-bit cross-checks.
 * The hand-written readers (header.ts, source-pdo.ts, sink-pdo.ts, rdo.ts) are the fast path;
 * layouts.test.ts checks that they agree with these layouts on random words.
 * References as in those files (USB PD R3.2 V1.1 §6.2.1, §6.4.1, §6.4.2; R3.1 V1.8 table numbers).
 */
import { enumBits, flagBit as F, reservedBits as R, typeTag as T, uintBits as U, word32 } from './field-layouts.ts';
import type { FieldLayout, WordLayout } from './layout.ts';
const PDO = 'USB PD R3.2 V1.1 §6.4.1';
const RDO = 'USB PD R3.2 V1.1 §6.4.2';

/** The Message Header (Table 6.1): bits 8 and 5 read as power and data role on SOP, Cable Plug and reserved on SOP'/SOP''. */
const messageHeader = (title: string, bit8: FieldLayout, bit5: FieldLayout): WordLayout => ({
  kind: 'header',
  title,
  ref: 'USB PD R3.2 V1.1 §6.2.1.1, Table 6.1',
  bits: 16,
  fields: [
    F(15, 'extended', 'Extended'),
    U(14, 12, 'numDataObjects', 'Number of Data Objects'),
    U(11, 9, 'messageId', 'MessageID'),
    bit8,
    enumBits(7, 6, 'specRevision', 'Specification Revision', { 0: '1.0', 1: '2.0', 2: '3.0', 3: 'reserved' }),
    bit5,
    U(4, 0, 'messageTypeCode', 'Message Type'),
  ],
});

export const HEADER_SOP_LAYOUT: WordLayout = messageHeader(
  'Message Header (SOP)',
  enumBits(8, 8, 'powerRole', 'Port Power Role', { 0: 'sink', 1: 'source' }),
  enumBits(5, 5, 'dataRole', 'Port Data Role', { 0: 'ufp', 1: 'dfp' }),
);

export const HEADER_CABLE_LAYOUT: WordLayout = messageHeader("Message Header (SOP'/SOP'')", F(8, 'cablePlug', 'Cable Plug'), R(5, 5));

export const EXTENDED_HEADER_LAYOUT: WordLayout = {
  kind: 'extended-header',
  title: 'Extended Message Header',
  ref: 'USB PD R3.2 V1.1 §6.2.1.2, Table 6.3',
  bits: 16,
  fields: [F(15, 'chunked', 'Chunked'), U(14, 11, 'chunkNumber', 'Chunk Number'), F(10, 'requestChunk', 'Request Chunk'), R(9, 9), U(8, 0, 'dataSize', 'Data Size', 1, 'bytes')],
};

const fixedSourceFlags = [
  F(29, 'dualRolePower', 'Dual-Role Power'),
  F(28, 'usbSuspendSupported', 'USB Suspend Supported'),
  F(27, 'unconstrainedPower', 'Unconstrained Power'),
  F(26, 'usbCommunicationsCapable', 'USB Communications Capable'),
  F(25, 'dualRoleData', 'Dual-Role Data'),
  F(24, 'unchunkedExtendedMessages', 'Unchunked Extended Messages Supported'),
  F(23, 'eprModeCapable', 'EPR Mode Capable'),
];
const range50 = [U(29, 20, 'maxVoltageMv', 'Maximum Voltage', 50, 'mV'), U(19, 10, 'minVoltageMv', 'Minimum Voltage', 50, 'mV')];
const ppsVolts = [
  U(24, 17, 'maxVoltageMv', 'Maximum Voltage', 100, 'mV'),
  R(16, 16),
  U(15, 8, 'minVoltageMv', 'Minimum Voltage', 100, 'mV'),
  R(7, 7),
  U(6, 0, 'maxCurrentMa', 'Maximum Current', 50, 'mA'),
];
const avsVolts = [U(25, 17, 'maxVoltageMv', 'Maximum Voltage', 100, 'mV'), R(16, 16), U(15, 8, 'minVoltageMv', 'Minimum Voltage', 100, 'mV'), U(7, 0, 'pdpW', 'PDP', 1, 'W')];
const sprAvs = [U(19, 10, 'maxCurrent15vMa', 'Maximum Current 9–15 V', 10, 'mA'), U(9, 0, 'maxCurrent20vMa', 'Maximum Current 15–20 V', 10, 'mA')];
const peak = (hi: number): FieldLayout => U(hi, hi - 1, 'peakCurrent', 'Peak Current');

export const SOURCE_PDO_LAYOUTS: Record<string, WordLayout> = {
  fixed: word32('fixed', 'Fixed Supply PDO – Source', `${PDO}.2.2, Table 6.9`, [
    T(31, 30, 0, 'Fixed supply (00b)'),
    ...fixedSourceFlags,
    R(22, 22),
    peak(21),
    U(19, 10, 'voltageMv', 'Voltage', 50, 'mV'),
    U(9, 0, 'maxCurrentMa', 'Maximum Current', 10, 'mA'),
  ]),
  variable: word32('variable', 'Variable Supply PDO – Source', `${PDO}.2.3, Table 6.11`, [T(31, 30, 2, 'Variable supply (10b)'), ...range50, U(9, 0, 'maxCurrentMa', 'Maximum Current', 10, 'mA')]),
  battery: word32('battery', 'Battery Supply PDO – Source', `${PDO}.2.4, Table 6.12`, [T(31, 30, 1, 'Battery (01b)'), ...range50, U(9, 0, 'maxPowerMw', 'Maximum Allowable Power', 250, 'mW')]),
  pps: word32('pps', 'SPR Programmable Power Supply APDO – Source', `${PDO}.2.5, Table 6.13`, [
    T(31, 30, 3, 'APDO (11b)'),
    T(29, 28, 0, 'SPR PPS (00b)'),
    F(27, 'powerLimited', 'PPS Power Limited'),
    R(26, 25),
    ...ppsVolts,
  ]),
  'epr-avs': word32('epr-avs', 'EPR Adjustable Voltage Supply APDO – Source', `${PDO}.2.6, Table 6.14`, [T(31, 30, 3, 'APDO (11b)'), T(29, 28, 1, 'EPR AVS (01b)'), peak(27), ...avsVolts]),
  'spr-avs': word32('spr-avs', 'SPR Adjustable Voltage Supply APDO – Source', `${PDO}.2.7 (new in R3.2)`, [T(31, 30, 3, 'APDO (11b)'), T(29, 28, 2, 'SPR AVS (10b)'), peak(27), R(25, 20), ...sprAvs]),
};

export const SINK_PDO_LAYOUTS: Record<string, WordLayout> = {
  fixed: word32('fixed', 'Fixed Supply PDO – Sink', `${PDO}.3.1, Table 6.17`, [
    T(31, 30, 0, 'Fixed supply (00b)'),
    F(29, 'dualRolePower', 'Dual-Role Power'),
    F(28, 'higherCapability', 'Higher Capability'),
    F(27, 'unconstrainedPower', 'Unconstrained Power'),
    F(26, 'usbCommunicationsCapable', 'USB Communications Capable'),
    F(25, 'dualRoleData', 'Dual-Role Data'),
    U(24, 23, 'frSwapRequiredCurrent', 'Fast Role Swap required USB Type-C Current'),
    R(22, 20),
    U(19, 10, 'voltageMv', 'Voltage', 50, 'mV'),
    U(9, 0, 'operationalCurrentMa', 'Operational Current', 10, 'mA'),
  ]),
  variable: word32('variable', 'Variable Supply PDO – Sink', `${PDO}.3.2, Table 6.18`, [
    T(31, 30, 2, 'Variable supply (10b)'),
    ...range50,
    U(9, 0, 'operationalCurrentMa', 'Operational Current', 10, 'mA'),
  ]),
  battery: word32('battery', 'Battery Supply PDO – Sink', `${PDO}.3.3, Table 6.19`, [T(31, 30, 1, 'Battery (01b)'), ...range50, U(9, 0, 'operationalPowerMw', 'Operational Power', 250, 'mW')]),
  pps: word32('pps', 'SPR Programmable Power Supply APDO – Sink', `${PDO}.3.4, Table 6.20`, [T(31, 30, 3, 'APDO (11b)'), T(29, 28, 0, 'SPR PPS (00b)'), R(27, 25), ...ppsVolts]),
  'epr-avs': word32('epr-avs', 'EPR Adjustable Voltage Supply APDO – Sink', `${PDO}.3.5, Table 6.21`, [T(31, 30, 3, 'APDO (11b)'), T(29, 28, 1, 'EPR AVS (01b)'), R(27, 26), ...avsVolts]),
  'spr-avs': word32('spr-avs', 'SPR Adjustable Voltage Supply APDO – Sink', `${PDO}.3.6 (new in R3.2)`, [T(31, 30, 3, 'APDO (11b)'), T(29, 28, 2, 'SPR AVS (10b)'), R(27, 20), ...sprAvs]),
};

const rdoCommon = (giveBack: boolean): FieldLayout[] => [
  U(31, 28, 'objectPosition', 'Object Position'),
  giveBack ? F(27, 'giveBack', 'GiveBack (deprecated)') : R(27, 27),
  F(26, 'capabilityMismatch', 'Capability Mismatch'),
  F(25, 'usbCommunicationsCapable', 'USB Communications Capable'),
  F(24, 'noUsbSuspend', 'No USB Suspend'),
  F(23, 'unchunkedExtendedMessages', 'Unchunked Extended Messages Supported'),
  F(22, 'eprModeCapable', 'EPR Mode Capable'),
];
const fixedRdo = (kind: string, title: string, table: string): WordLayout =>
  word32(kind, title, `${RDO}, ${table}`, [
    ...rdoCommon(true),
    R(21, 20),
    U(19, 10, 'operatingCurrentMa', 'Operating Current', 10, 'mA'),
    U(9, 0, 'maxOperatingCurrentMa', 'Maximum Operating Current', 10, 'mA'),
  ]);
const programmableRdo = (kind: string, title: string, table: string, step: number): WordLayout =>
  word32(kind, title, `${RDO}, ${table}`, [
    ...rdoCommon(false),
    R(21, 21),
    U(20, 9, 'outputVoltageMv', 'Output Voltage', step, 'mV'),
    R(8, 7),
    U(6, 0, 'operatingCurrentMa', 'Operating Current', 50, 'mA'),
  ]);

export const RDO_LAYOUTS: Record<string, WordLayout> = {
  'rdo-fixed': fixedRdo('rdo-fixed', 'Fixed Supply RDO', 'Table 6.23'),
  'rdo-variable': fixedRdo('rdo-variable', 'Variable Supply RDO', 'Table 6.23'),
  rdo: fixedRdo('rdo', 'RDO (type unknown: read as Fixed/Variable)', 'Table 6.23'),
  'rdo-battery': word32('rdo-battery', 'Battery Supply RDO', `${RDO}, Table 6.24`, [
    ...rdoCommon(true),
    R(21, 20),
    U(19, 10, 'operatingPowerMw', 'Operating Power', 250, 'mW'),
    U(9, 0, 'maxOperatingPowerMw', 'Maximum Operating Power', 250, 'mW'),
  ]),
  'rdo-pps': programmableRdo('rdo-pps', 'PPS RDO', 'Table 6.25', 20),
  'rdo-avs': programmableRdo('rdo-avs', 'AVS RDO', 'Table 6.26', 25),
};
