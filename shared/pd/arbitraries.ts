/**
 * fast-check arbitraries of valid messages in their decoded form (`raw` left out), one per
 * message type and object kind. Used by the codec's round-trip properties and open to property
 * vectors. Values respect each field's unit step and width (see the readers' spec references).
 */
import fc from 'fast-check';
import type { MessageInput, DataObjectInput } from './encode-message.ts';
import type { FieldLayout, WordLayout } from './layout.ts';
import { otherLayout, VDM_STRUCTURED_LAYOUT, VDM_UNSTRUCTURED_LAYOUT } from './layouts-other.ts';
import { VDO_LAYOUTS } from './layouts-vdo.ts';
import { CONTROL_TYPES, EXTENDED_TYPES } from './message-types.ts';
import type { Sop } from './types.ts';

const steps = (step: number, bits: number) => fc.integer({ min: 0, max: 2 ** bits - 1 }).map((n) => n * step);
const bool = fc.boolean();

export const sourcePdoArb: fc.Arbitrary<DataObjectInput> = fc.oneof(
  fc.record({
    kind: fc.constant('fixed' as const),
    voltageMv: steps(50, 10),
    maxCurrentMa: steps(10, 10),
    peakCurrent: fc.integer({ min: 0, max: 3 }),
    dualRolePower: bool,
    usbSuspendSupported: bool,
    unconstrainedPower: bool,
    usbCommunicationsCapable: bool,
    dualRoleData: bool,
    unchunkedExtendedMessages: bool,
    eprModeCapable: bool,
  }),
  fc.record({ kind: fc.constant('variable' as const), minVoltageMv: steps(50, 10), maxVoltageMv: steps(50, 10), maxCurrentMa: steps(10, 10) }),
  fc.record({ kind: fc.constant('battery' as const), minVoltageMv: steps(50, 10), maxVoltageMv: steps(50, 10), maxPowerMw: steps(250, 10) }),
  fc.record({ kind: fc.constant('pps' as const), minVoltageMv: steps(100, 8), maxVoltageMv: steps(100, 8), maxCurrentMa: steps(50, 7), powerLimited: bool }),
  fc.record({ kind: fc.constant('epr-avs' as const), minVoltageMv: steps(100, 8), maxVoltageMv: steps(100, 9), pdpW: steps(1, 8), peakCurrent: fc.integer({ min: 0, max: 3 }) }),
  fc.record({ kind: fc.constant('spr-avs' as const), maxCurrent15vMa: steps(10, 10), maxCurrent20vMa: steps(10, 10), peakCurrent: fc.integer({ min: 0, max: 3 }) }),
);

export const sinkPdoArb: fc.Arbitrary<DataObjectInput> = fc.oneof(
  fc.record({
    kind: fc.constant('fixed' as const),
    voltageMv: steps(50, 10),
    operationalCurrentMa: steps(10, 10),
    dualRolePower: bool,
    higherCapability: bool,
    unconstrainedPower: bool,
    usbCommunicationsCapable: bool,
    dualRoleData: bool,
    frSwapRequiredCurrent: fc.integer({ min: 0, max: 3 }),
  }),
  fc.record({ kind: fc.constant('variable' as const), minVoltageMv: steps(50, 10), maxVoltageMv: steps(50, 10), operationalCurrentMa: steps(10, 10) }),
  fc.record({ kind: fc.constant('battery' as const), minVoltageMv: steps(50, 10), maxVoltageMv: steps(50, 10), operationalPowerMw: steps(250, 10) }),
  fc.record({ kind: fc.constant('pps' as const), minVoltageMv: steps(100, 8), maxVoltageMv: steps(100, 8), maxCurrentMa: steps(50, 7), powerLimited: fc.constant(false) }),
  fc.record({ kind: fc.constant('epr-avs' as const), minVoltageMv: steps(100, 8), maxVoltageMv: steps(100, 9), pdpW: steps(1, 8), peakCurrent: fc.constant(0) }),
  fc.record({ kind: fc.constant('spr-avs' as const), maxCurrent15vMa: steps(10, 10), maxCurrent20vMa: steps(10, 10), peakCurrent: fc.constant(0) }),
);

const rdoFlags = { capabilityMismatch: bool, usbCommunicationsCapable: bool, noUsbSuspend: bool, unchunkedExtendedMessages: bool, eprModeCapable: bool };

/** An RDO of the kind that a PDO of `pdoKind` calls for, at `objectPosition`. */
export function rdoArb(pdoKind: string | undefined, objectPosition: number): fc.Arbitrary<DataObjectInput> {
  const position = fc.constant(objectPosition);
  if (pdoKind === 'pps' || pdoKind === 'epr-avs' || pdoKind === 'spr-avs') {
    const pps = pdoKind === 'pps';
    return fc.record({
      kind: fc.constant(pps ? ('rdo-pps' as const) : ('rdo-avs' as const)),
      objectPosition: position,
      outputVoltageMv: steps(pps ? 20 : 25, 12),
      operatingCurrentMa: steps(50, 7),
      ...rdoFlags,
    });
  }
  if (pdoKind === 'battery')
    return fc.record({ kind: fc.constant('rdo-battery' as const), objectPosition: position, operatingPowerMw: steps(250, 10), maxOperatingPowerMw: steps(250, 10), giveBack: bool, ...rdoFlags });
  const kind = pdoKind === 'fixed' ? 'rdo-fixed' : pdoKind === 'variable' ? 'rdo-variable' : 'rdo';
  return fc.record({ kind: fc.constant(kind as 'rdo-fixed'), objectPosition: position, operatingCurrentMa: steps(10, 10), maxOperatingCurrentMa: steps(10, 10), giveBack: bool, ...rdoFlags });
}

function fieldArb(f: FieldLayout): fc.Arbitrary<unknown> {
  const width = f.hi - f.lo + 1;
  if (f.type === 'flag') return bool;
  if (f.type === 'ascii') return fc.array(fc.integer({ min: 0x41, max: 0x5a }), { minLength: width / 8, maxLength: width / 8 }).map((cs) => String.fromCharCode(...cs));
  if (f.type === 'enum') return fc.integer({ min: 0, max: 2 ** width - 1 }).map((c) => f.values?.[c] ?? c);
  return steps(f.scale ?? 1, width);
}

/** An object of a layout kind (BIST, Alert, …), every field drawn in range. */
export function layoutObjectArb(layout: WordLayout, fixed: Record<string, unknown> = {}): fc.Arbitrary<DataObjectInput> {
  const fields: Record<string, fc.Arbitrary<unknown>> = {};
  for (const f of layout.fields) if (f.type !== 'reserved' && f.type !== 'const') fields[f.name] = f.name in fixed ? fc.constant(fixed[f.name]) : fieldArb(f);
  return fc.record(fields).map((values) => ({ kind: layout.kind, ...values }) as DataObjectInput);
}

const rawArb = fc.integer({ min: 0, max: 0xffff_ffff }).map((n) => ({ kind: 'raw' as const, raw: '0x' + n.toString(16).padStart(8, '0') }));

const sopArb: fc.Arbitrary<Sop> = fc.constantFrom('SOP', "SOP'", "SOP''");

function headerArb(sop: Sop, messageType: string) {
  const base = { messageType: fc.constant(messageType), messageId: fc.integer({ min: 0, max: 7 }), specRevision: fc.constantFrom('1.0' as const, '2.0' as const, '3.0' as const) };
  return sop === 'SOP'
    ? fc.record({ ...base, powerRole: fc.constantFrom('source' as const, 'sink' as const), dataRole: fc.constantFrom('dfp' as const, 'ufp' as const) })
    : fc.record({ ...base, cablePlug: bool });
}

const hexBytes = (min: number, max: number) => fc.uint8Array({ minLength: min, maxLength: max }).map((b) => Array.from(b, (x) => x.toString(16).padStart(2, '0')).join(''));

/** `{ message, caps? }`: a valid message and, for a Request, the offers its RDO refers to. */
export type Sample = { message: MessageInput; caps?: DataObjectInput[] };

function withHeader(messageType: string, rest: fc.Arbitrary<Omit<MessageInput, 'header' | 'sop'> & { caps?: DataObjectInput[] }>, sops: fc.Arbitrary<Sop> = sopArb): fc.Arbitrary<Sample> {
  return sops.chain((sop) => fc.tuple(headerArb(sop, messageType), rest).map(([header, { caps, ...body }]) => ({ message: { sop, header, ...body }, ...(caps ? { caps } : {}) })));
}

const controlArb = fc.constantFrom(...CONTROL_TYPES.filter((n): n is string => n !== undefined)).chain((t) => withHeader(t, fc.constant({ objects: [] })));

const requestArb = fc.array(sourcePdoArb, { minLength: 1, maxLength: 7 }).chain((caps) =>
  fc.integer({ min: 1, max: caps.length }).chain((p) =>
    withHeader(
      'Request',
      rdoArb(String(caps[p - 1]!.kind), p).map((rdo) => ({ objects: [rdo], caps })),
    ),
  ),
);

const eprRequestArb = sourcePdoArb.chain((pdo) =>
  fc.integer({ min: 1, max: 13 }).chain((p) =>
    withHeader(
      'EPR_Request',
      rdoArb(String(pdo.kind), p).map((rdo) => ({ objects: [rdo, pdo] })),
    ),
  ),
);

const single = (type: string, kind: string) =>
  withHeader(
    type,
    layoutObjectArb(otherLayout(kind, 0)!).map((o) => ({ objects: [o] })),
  );

const vdo = (kind: string, fixed: Record<string, unknown> = {}) => layoutObjectArb(VDO_LAYOUTS[kind]!, fixed);
const ackHeader = (command: string) => layoutObjectArb(VDM_STRUCTURED_LAYOUT, { svid: 0xff00, structured: true, commandType: 'ACK', command });

/** Discover Identity ACKs (USB PD R3.2 V1.1 §6.4.4.3.1): each cable type on SOP', each port type on SOP. */
export const discoverIdentityArb: fc.Arbitrary<Sample> = fc.oneof(
  ...(
    [
      ['Passive Cable', ['passive-cable']],
      ['Active Cable', ['active-cable-1', 'active-cable-2']],
      ['VCONN-Powered USB Device', ['vpd']],
    ] as const
  ).map(([type, kinds]) =>
    withHeader(
      'Vendor_Defined',
      fc.tuple(ackHeader('Discover Identity'), vdo('cable-id-header', { productTypeCablePlug: type }), vdo('cert-stat'), vdo('product'), ...kinds.map((k) => vdo(k))).map((objects) => ({ objects })),
      fc.constantFrom("SOP'" as const, "SOP''" as const),
    ),
  ),
  ...(
    [
      ['PDUSB Peripheral', 'Not a DFP', ['ufp']],
      ['Not a UFP', 'Power Brick', ['dfp']],
      ['PDUSB Hub', 'PDUSB Hub', ['ufp', 'pad', 'dfp']],
      ['PSD', 'Not a DFP', []],
    ] as const
  ).map(([ufp, dfp, kinds]) =>
    withHeader(
      'Vendor_Defined',
      fc
        .tuple(ackHeader('Discover Identity'), vdo('id-header', { productTypeUfp: ufp, productTypeDfp: dfp }), vdo('cert-stat'), vdo('product'), ...kinds.map((k) => vdo(k)))
        .map((objects) => ({ objects })),
      fc.constant('SOP' as const),
    ),
  ),
  withHeader(
    'Vendor_Defined',
    fc.tuple(ackHeader('Discover SVIDs'), fc.array(vdo('svids'), { minLength: 1, maxLength: 6 })).map(([h, rest]) => ({ objects: [h, ...rest] })),
  ),
);

const dataArb = fc.oneof(
  discoverIdentityArb,
  withHeader(
    'Source_Capabilities',
    fc.array(sourcePdoArb, { minLength: 1, maxLength: 7 }).map((objects) => ({ objects })),
  ),
  withHeader(
    'Sink_Capabilities',
    fc.array(sinkPdoArb, { minLength: 1, maxLength: 7 }).map((objects) => ({ objects })),
  ),
  requestArb,
  eprRequestArb,
  withHeader(
    'BIST',
    fc.tuple(layoutObjectArb(otherLayout('bist', 0)!), fc.array(rawArb, { maxLength: 6 })).map(([b, rest]) => ({ objects: [b, ...rest] })),
  ),
  withHeader(
    'Vendor_Defined',
    // Headers other than the Discover Identity / SVIDs ACKs above, whose VDOs stay raw.
    fc
      .tuple(
        fc.oneof(
          layoutObjectArb(VDM_STRUCTURED_LAYOUT, { structured: true }).filter((h) => !((h as Record<string, unknown>).svid === 0xff00 && (h as Record<string, unknown>).commandType === 'ACK')),
          layoutObjectArb(VDM_UNSTRUCTURED_LAYOUT, { structured: false }),
        ),
        fc.array(rawArb, { maxLength: 6 }),
      )
      .map(([h, rest]) => ({ objects: [h, ...rest] })),
  ),
  single('Battery_Status', 'battery-status'),
  single('Alert', 'alert'),
  single('Get_Country_Info', 'country-code'),
  single('Enter_USB', 'enter-usb'),
  single('EPR_Mode', 'epr-mode'),
  single('Source_Info', 'source-info'),
  single('Revision', 'revision'),
);

const u = (bits: number) => fc.integer({ min: 0, max: 2 ** bits - 1 });
const chunked = (dataSize: number) => ({ chunked: true, chunkNumber: 0, requestChunk: false, dataSize });

const extendedArb = fc.oneof(
  withHeader(
    'Source_Capabilities_Extended',
    fc
      .record({
        vid: u(16),
        pid: u(16),
        xid: u(32),
        fwVersion: u(8),
        hwVersion: u(8),
        voltageRegulation: u(8),
        holdupTimeMs: u(8),
        compliance: u(8),
        touchCurrent: u(8),
        peakCurrent1: u(16),
        peakCurrent2: u(16),
        peakCurrent3: u(16),
        touchTemp: u(8),
        sourceInputs: u(8),
        batteries: u(8),
        sprSourcePdpW: u(8),
        eprSourcePdpW: u(8),
      })
      .map((data) => ({ extendedHeader: chunked(25), objects: [], data })),
  ),
  withHeader(
    'Status',
    fc
      .record({ internalTempC: u(8), presentInput: u(8), presentBatteryInput: u(8), eventFlags: u(8), temperatureStatus: u(8), powerStatus: u(8), powerStateChange: u(8) })
      .map((data) => ({ extendedHeader: chunked(7), objects: [], data })),
  ),
  withHeader(
    'PPS_Status',
    fc
      .record({
        outputVoltageMv: fc.option(
          steps(20, 16).filter((v) => v !== 0xffff * 20),
          { nil: null },
        ),
        outputCurrentMa: fc.option(
          steps(50, 8).filter((v) => v !== 0xff * 50),
          { nil: null },
        ),
        ptf: u(2),
        omf: bool,
      })
      .map((data) => ({ extendedHeader: chunked(4), objects: [], data })),
  ),
  withHeader(
    'Extended_Control',
    fc
      .record({ type: fc.constantFrom('EPR_Get_Source_Cap', 'EPR_Get_Sink_Cap', 'EPR_KeepAlive', 'EPR_KeepAlive_Ack'), data: fc.constant(0) })
      .map((data) => ({ extendedHeader: chunked(2), objects: [], data })),
  ),
  withHeader(
    'EPR_Source_Capabilities',
    fc.array(sourcePdoArb, { minLength: 1, maxLength: 6 }).map((objects) => ({ extendedHeader: chunked(4 * objects.length), objects })),
  ),
  withHeader(
    'EPR_Sink_Capabilities',
    fc.array(sinkPdoArb, { minLength: 1, maxLength: 6 }).map((objects) => ({ extendedHeader: chunked(4 * objects.length), objects })),
  ),
  // Types whose block stays a payload: one whole chunk, a later chunk of a longer block, unchunked, a chunk request.
  fc
    .constantFrom(
      'Battery_Capabilities',
      'Manufacturer_Info',
      'Security_Request',
      'Security_Response',
      'Firmware_Update_Request',
      'Firmware_Update_Response',
      'Country_Info',
      'Country_Codes',
      'Sink_Capabilities_Extended',
      'Get_Manufacturer_Info',
      'Vendor_Defined_Extended',
    )
    .chain((t) =>
      fc.oneof(
        withHeader(
          t,
          hexBytes(1, 26).map((payload) => ({ extendedHeader: chunked(payload.length / 2), objects: [], payload })),
        ),
        withHeader(
          t,
          fc
            .tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 26 }))
            .chain(([n, last]) => hexBytes(last, last).map((payload) => ({ extendedHeader: { chunked: true, chunkNumber: n, requestChunk: false, dataSize: 26 * n + last }, objects: [], payload }))),
        ),
        withHeader(
          t,
          hexBytes(0, 260).map((payload) => ({ extendedHeader: { chunked: false, chunkNumber: 0, requestChunk: false, dataSize: payload.length / 2 }, objects: [], payload })),
        ),
        withHeader(
          t,
          u(4).map((n) => ({ extendedHeader: { chunked: true, chunkNumber: n, requestChunk: true, dataSize: 0 }, objects: [], payload: '' })),
        ),
      ),
    ),
);

/** Any valid message of any type. */
export const messageArb: fc.Arbitrary<Sample> = fc.oneof(controlArb, dataArb, extendedArb);

export const definedExtendedTypes = EXTENDED_TYPES.filter((n): n is string => n !== undefined);
