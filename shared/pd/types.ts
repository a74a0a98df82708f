/**
 * The decoded form of USB PD messages and data objects, as docs/objects.md fixes it.
 * Field names are fixed by the contract; fields may be added. Every number is an integer in the
 * unit its name says; `raw` is `0x` + lower-case hex (4 digits for a header, 8 for an object).
 */

export type Sop = 'SOP' | "SOP'" | "SOP''" | "SOP'_Debug" | "SOP''_Debug";
export type SpecRevision = '1.0' | '2.0' | '3.0' | 'reserved';
export type MessageCategory = 'control' | 'data' | 'extended';
export type PowerRole = 'source' | 'sink';
export type DataRole = 'dfp' | 'ufp';

export interface MessageHeader {
  raw: string;
  /** The specification's name, spelled as it spells it (`GoodCRC`, `PS_RDY`, `Source_Capabilities`, …) or `Reserved`. */
  messageType: string;
  category: MessageCategory;
  numDataObjects: number;
  messageId: number;
  specRevision: SpecRevision;
  extended: boolean;
  /** SOP only. */
  powerRole?: PowerRole;
  /** SOP only. */
  dataRole?: DataRole;
  /** SOP'/SOP'' only: true when sent by a cable plug. */
  cablePlug?: boolean;
}

export interface ExtendedHeader {
  raw: string;
  chunked: boolean;
  chunkNumber: number;
  requestChunk: boolean;
  dataSize: number;
}

// ---- Power Data Objects (source and sink forms) -------------------------------------------------

export interface FixedSourcePdo {
  kind: 'fixed';
  raw: string;
  voltageMv: number;
  maxCurrentMa: number;
  /** 0–3, the Peak Current code. */
  peakCurrent: number;
  dualRolePower: boolean;
  usbSuspendSupported: boolean;
  unconstrainedPower: boolean;
  usbCommunicationsCapable: boolean;
  dualRoleData: boolean;
  unchunkedExtendedMessages: boolean;
  eprModeCapable: boolean;
}

export interface FixedSinkPdo {
  kind: 'fixed';
  raw: string;
  voltageMv: number;
  operationalCurrentMa: number;
  dualRolePower: boolean;
  higherCapability: boolean;
  unconstrainedPower: boolean;
  usbCommunicationsCapable: boolean;
  dualRoleData: boolean;
  /** 0–3, the Fast Role Swap required USB Type-C current code. */
  frSwapRequiredCurrent: number;
}

export interface VariableSourcePdo {
  kind: 'variable';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  maxCurrentMa: number;
}
export interface VariableSinkPdo {
  kind: 'variable';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  operationalCurrentMa: number;
}
export interface BatterySourcePdo {
  kind: 'battery';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  maxPowerMw: number;
}
export interface BatterySinkPdo {
  kind: 'battery';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  operationalPowerMw: number;
}
export interface PpsApdo {
  kind: 'pps';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  maxCurrentMa: number;
  powerLimited: boolean;
}
export interface EprAvsApdo {
  kind: 'epr-avs';
  raw: string;
  minVoltageMv: number;
  maxVoltageMv: number;
  pdpW: number;
  peakCurrent: number;
}
export interface SprAvsApdo {
  kind: 'spr-avs';
  raw: string;
  maxCurrent15vMa: number;
  maxCurrent20vMa: number;
  peakCurrent: number;
}

export type SourcePdo = FixedSourcePdo | VariableSourcePdo | BatterySourcePdo | PpsApdo | EprAvsApdo | SprAvsApdo;
export type SinkPdo = FixedSinkPdo | VariableSinkPdo | BatterySinkPdo | PpsApdo | EprAvsApdo | SprAvsApdo;

// ---- Request Data Objects ------------------------------------------------------------------------

interface RdoFlags {
  objectPosition: number;
  capabilityMismatch: boolean;
  usbCommunicationsCapable: boolean;
  noUsbSuspend: boolean;
  unchunkedExtendedMessages: boolean;
  eprModeCapable: boolean;
}

export interface FixedRdo extends RdoFlags {
  kind: 'rdo-fixed' | 'rdo-variable';
  raw: string;
  operatingCurrentMa: number;
  maxOperatingCurrentMa: number;
  giveBack: boolean;
}
export interface BatteryRdo extends RdoFlags {
  kind: 'rdo-battery';
  raw: string;
  operatingPowerMw: number;
  maxOperatingPowerMw: number;
  giveBack: boolean;
}
export interface PpsRdo extends RdoFlags {
  kind: 'rdo-pps';
  raw: string;
  outputVoltageMv: number;
  operatingCurrentMa: number;
}
export interface AvsRdo extends RdoFlags {
  kind: 'rdo-avs';
  raw: string;
  outputVoltageMv: number;
  operatingCurrentMa: number;
}
/** A Request decoded without the Source_Capabilities it refers to: the fixed/variable reading. */
export interface UnknownRdo extends RdoFlags {
  kind: 'rdo';
  raw: string;
  operatingCurrentMa: number;
  maxOperatingCurrentMa: number;
  giveBack: boolean;
}

export type Rdo = FixedRdo | BatteryRdo | PpsRdo | AvsRdo | UnknownRdo;

// ---- Other data objects ---------------------------------------------------------------------------

/** BIST, Alert, VDM header, Source_Info, Revision, EPR_Mode: the specification's fields, camel-cased. */
export interface OtherObject {
  kind: 'bist' | 'alert' | 'vdm-header' | 'source-info' | 'revision' | 'epr-mode' | 'raw' | (string & {});
  raw: string;
  [field: string]: unknown;
}

/** An object the codec cannot read further (a reserved APDO type, VDOs, test data): only `raw`. */
export interface RawObject {
  kind: 'raw';
  raw: string;
}

export type DataObject = SourcePdo | SinkPdo | Rdo | RawObject | OtherObject;

export interface Message {
  sop: Sop;
  header: MessageHeader;
  extendedHeader?: ExtendedHeader;
  objects: DataObject[];
  /** Hex of an extended message's data block. */
  payload?: string;
  /** Only when a CRC was given. */
  crc?: { value: string; ok: boolean };
  /** Decoded fields of an extended message's data block (Source_Capabilities_Extended, Status, PPS_Status, …). */
  data?: Record<string, unknown>;
}
