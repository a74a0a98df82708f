/**
 * Data blocks of extended messages, read into `message.data` once the block is complete.
 * Multi-byte fields are little-endian (USB PD R3.2 V1.1 §6.5). Layouts (R3.1 V1.8 tables):
 * - Source_Capabilities_Extended, §6.5.1 Table 6.54 (SCEDB, 25 bytes; R3.0 ended at byte 23).
 * - Status, §6.5.2 Table 6.55 (SDB, 7 bytes in R3.1; earlier revisions fewer).
 * - PPS_Status, §6.5.10 Table 6.68 (PPSSDB, 4 bytes): Output Voltage (20 mV, 0xFFFF = not
 *   supported), Output Current (50 mA, 0xFF = not supported), Real Time Flags (B2..1 PTF, B3 OMF).
 * - Extended_Control, §6.5.14 Table 6.74 (ECDB, 2 bytes): Type, Data.
 * - Battery_Capabilities §6.5.5 (BCDB, 9 bytes), Get_Manufacturer_Info §6.5.6 (GMIDB, 2 bytes),
 *   Manufacturer_Info §6.5.7 (MIDB: VID, PID, then up to 22 bytes of ASCII string),
 *   Country_Codes §6.5.8 (CCDB: Length, Reserved, two ASCII bytes a code), Country_Info §6.5.9
 *   (CIDB: code, 2 reserved bytes, country-specific data), Sink_Capabilities_Extended §6.5.13
 *   (SKEDB, 24 bytes in R3.1). Table numbers and the bit meanings of the sub-fields (Status'
 *   Present Input, Event Flags, …; the SCEDB's Voltage Regulation, Peak Current, …) are from memory.
 * Only whole fields are read; a field the block is too short for is left out (older revisions), and
 * bytes after the last field are kept as `trailing` hex, so that writing `data` gives the same block.
 * Sub-fields are added as read-only objects beside the byte they come from (`presentInputFlags`, …).
 */
import { code, units } from './guards.ts';

export interface BlockField {
  name: string;
  size: 1 | 2 | 4;
  label: string;
  scale?: number;
  unit?: string;
}

export interface BlockLayout {
  messageType: string;
  ref: string;
  fields: readonly BlockField[];
}

const u8 = (name: string, label: string, unit?: string): BlockField => ({ name, size: 1, label, ...(unit ? { unit } : {}) });
const u16 = (name: string, label: string): BlockField => ({ name, size: 2, label });

export const SOURCE_CAPS_EXTENDED_LAYOUT: BlockLayout = {
  messageType: 'Source_Capabilities_Extended',
  ref: 'USB PD R3.2 V1.1 §6.5.1, Source Capabilities Extended Data Block (R3.1 Table 6.54)',
  fields: [
    u16('vid', 'Vendor ID'),
    u16('pid', 'Product ID'),
    { name: 'xid', size: 4, label: 'XID' },
    u8('fwVersion', 'Firmware Version'),
    u8('hwVersion', 'Hardware Version'),
    u8('voltageRegulation', 'Voltage Regulation'),
    u8('holdupTimeMs', 'Holdup Time', 'ms'),
    u8('compliance', 'Compliance'),
    u8('touchCurrent', 'Touch Current'),
    u16('peakCurrent1', 'Peak Current1'),
    u16('peakCurrent2', 'Peak Current2'),
    u16('peakCurrent3', 'Peak Current3'),
    u8('touchTemp', 'Touch Temp'),
    u8('sourceInputs', 'Source Inputs'),
    u8('batteries', 'Number of Batteries/Battery Slots'),
    u8('sprSourcePdpW', 'SPR Source PDP Rating', 'W'),
    u8('eprSourcePdpW', 'EPR Source PDP Rating', 'W'),
  ],
};

export const STATUS_LAYOUT: BlockLayout = {
  messageType: 'Status',
  ref: 'USB PD R3.2 V1.1 §6.5.2, Status Data Block (R3.1 Table 6.55)',
  fields: [
    u8('internalTempC', 'Internal Temp (°C; 0 = not supported)', '°C'),
    u8('presentInput', 'Present Input'),
    u8('presentBatteryInput', 'Present Battery Input'),
    u8('eventFlags', 'Event Flags'),
    u8('temperatureStatus', 'Temperature Status'),
    u8('powerStatus', 'Power Status'),
    u8('powerStateChange', 'Power State Change'),
  ],
};

export const GET_BATTERY_LAYOUT = (messageType: string): BlockLayout => ({
  messageType,
  ref: `USB PD R3.2 V1.1 §6.5, ${messageType} Data Block (from memory)`,
  fields: [u8('batteryRef', 'Battery Cap Ref / Battery Status Ref')],
});

export const BATTERY_CAPABILITIES_LAYOUT: BlockLayout = {
  messageType: 'Battery_Capabilities',
  ref: 'USB PD R3.2 V1.1 §6.5.5, Battery Capability Data Block (from memory)',
  fields: [
    u16('vid', 'Vendor ID'),
    u16('pid', 'Product ID'),
    u16('batteryDesignCapacity', 'Battery Design Capacity (0.1 Wh; 0 = no battery, 0xFFFF = unknown)'),
    u16('batteryLastFullChargeCapacity', 'Battery Last Full Charge Capacity (0.1 Wh; 0 = no battery, 0xFFFF = unknown)'),
    u8('batteryType', 'Battery Type (B0: Invalid Battery reference)'),
  ],
};

export const GET_MANUFACTURER_INFO_LAYOUT: BlockLayout = {
  messageType: 'Get_Manufacturer_Info',
  ref: 'USB PD R3.2 V1.1 §6.5.6, Get Manufacturer Info Data Block (from memory)',
  fields: [u8('manufacturerInfoTarget', 'Manufacturer Info Target (0 port/cable plug, 1 battery)'), u8('manufacturerInfoRef', 'Manufacturer Info Ref (battery index)')],
};

export const SINK_CAPS_EXTENDED_LAYOUT: BlockLayout = {
  messageType: 'Sink_Capabilities_Extended',
  ref: 'USB PD R3.2 V1.1 §6.5.13, Sink Capabilities Extended Data Block (from memory)',
  fields: [
    u16('vid', 'Vendor ID'),
    u16('pid', 'Product ID'),
    { name: 'xid', size: 4, label: 'XID' },
    u8('fwVersion', 'Firmware Version'),
    u8('hwVersion', 'Hardware Version'),
    u8('skedbVersion', 'SKEDB Version'),
    u8('loadStep', 'Load Step (00b 150 mA/µs, 01b 500 mA/µs)'),
    u16('sinkLoadCharacteristics', 'Sink Load Characteristics'),
    u8('compliance', 'Compliance'),
    u8('touchTemp', 'Touch Temp'),
    u8('batteryInfo', 'Battery Info'),
    u8('sinkModes', 'Sink Modes'),
    u8('sinkMinimumPdpW', 'Sink Minimum PDP', 'W'),
    u8('sinkOperationalPdpW', 'Sink Operational PDP', 'W'),
    u8('sinkMaximumPdpW', 'Sink Maximum PDP', 'W'),
    u8('eprSinkMinimumPdpW', 'EPR Sink Minimum PDP', 'W'),
    u8('eprSinkOperationalPdpW', 'EPR Sink Operational PDP', 'W'),
    u8('eprSinkMaximumPdpW', 'EPR Sink Maximum PDP', 'W'),
  ],
};

/** Extended_Control types (§6.5.14, the ECDB's Type byte), named like messages: the one table the codec, the simulator and its faults use. */
export const EXTENDED_CONTROL_TYPES = { EPR_Get_Source_Cap: 1, EPR_Get_Sink_Cap: 2, EPR_KeepAlive: 3, EPR_KeepAlive_Ack: 4 } as const;
export type ExtendedControlType = keyof typeof EXTENDED_CONTROL_TYPES;
const EXTENDED_CONTROL_NAMES = new Map<number, ExtendedControlType>(Object.entries(EXTENDED_CONTROL_TYPES).map(([name, type]) => [type, name as ExtendedControlType]));

/** The Extended_Control type's name, or undefined for a value the specification does not define. */
export function extendedControlName(type: number): ExtendedControlType | undefined {
  return EXTENDED_CONTROL_NAMES.get(type);
}

const BLOCKS: Record<string, BlockLayout> = {
  Source_Capabilities_Extended: SOURCE_CAPS_EXTENDED_LAYOUT,
  Status: STATUS_LAYOUT,
  Get_Battery_Cap: GET_BATTERY_LAYOUT('Get_Battery_Cap'),
  Get_Battery_Status: GET_BATTERY_LAYOUT('Get_Battery_Status'),
  Battery_Capabilities: BATTERY_CAPABILITIES_LAYOUT,
  Get_Manufacturer_Info: GET_MANUFACTURER_INFO_LAYOUT,
  Sink_Capabilities_Extended: SINK_CAPS_EXTENDED_LAYOUT,
};

/** Blocks of a field list followed by variable-length content (see decodeVariable). */
const VARIABLE = new Set(['Manufacturer_Info', 'Country_Codes', 'Country_Info']);

const bit = (value: number, n: number) => ((value >> n) & 1) === 1;
const TEMPERATURE_STATUS = ['not supported', 'normal', 'warning', 'over temperature'];
const NEW_POWER_STATE = ['not supported', 'S0', 'Modern Standby', 'S3', 'S4', 'S5 (off with wake)', 'G3 (off)'];
const POWER_STATE_INDICATOR = ['off', 'on', 'blinking', 'breathing'];
const TOUCH_TEMP = ['IEC 60950-1', 'IEC 62368-1 TS1', 'IEC 62368-1 TS2'];

/** A Peak Current field of the SCEDB: overload %, its period and duty cycle, VBUS droop (from memory). */
function peakCurrent(value: number) {
  return { overloadPercent: (value & 0x1f) * 10, overloadPeriodMs: ((value >> 5) & 0x3f) * 20, dutyCyclePercent: ((value >> 11) & 0xf) * 5, vbusVoltageDroop: bit(value, 15) };
}

/** The sub-fields of the bytes that pack several (read-only; the byte itself is what is written). */
function addSubFields(messageType: string, data: Record<string, unknown>): void {
  const n = (name: string) => (typeof data[name] === 'number' ? (data[name] as number) : undefined);
  if (messageType === 'Status') {
    const input = n('presentInput');
    if (input !== undefined)
      data.presentInputFlags = { externalPower: bit(input, 1), externalPowerAc: bit(input, 2), internalPowerFromBattery: bit(input, 3), internalPowerFromNonBattery: bit(input, 4) };
    const battery = n('presentBatteryInput');
    if (battery !== undefined) data.presentBatteryInputFlags = { fixedBatteries: battery & 0xf, hotSwappableBatteries: battery >> 4 };
    const events = n('eventFlags');
    if (events !== undefined) data.eventFlagsFlags = { ocp: bit(events, 1), otp: bit(events, 2), ovp: bit(events, 3), cfMode: bit(events, 4) };
    const temperature = n('temperatureStatus');
    if (temperature !== undefined) data.temperatureStatusText = TEMPERATURE_STATUS[(temperature >> 1) & 3];
    const power = n('powerStatus');
    if (power !== undefined)
      data.powerStatusFlags = {
        limitedByCable: bit(power, 1),
        limitedByOtherPorts: bit(power, 2),
        limitedByExternalPower: bit(power, 3),
        limitedByEventFlags: bit(power, 4),
        limitedByTemperature: bit(power, 5),
      };
    const change = n('powerStateChange');
    if (change !== undefined)
      data.powerStateChangeFields = { newPowerState: NEW_POWER_STATE[change & 7] ?? change & 7, newPowerStateIndicator: POWER_STATE_INDICATOR[(change >> 3) & 7] ?? (change >> 3) & 7 };
  } else if (messageType === 'Source_Capabilities_Extended') {
    const regulation = n('voltageRegulation');
    if (regulation !== undefined) data.voltageRegulationFields = { loadStepMaPerUs: (regulation & 3) === 1 ? 500 : 150, loadStepMagnitudePercent: bit(regulation, 2) ? 90 : 25 };
    const compliance = n('compliance');
    if (compliance !== undefined) data.complianceFlags = { lps: bit(compliance, 0), ps1: bit(compliance, 1), ps2: bit(compliance, 2) };
    const touch = n('touchCurrent');
    if (touch !== undefined) data.touchCurrentFlags = { lowTouchCurrentEps: bit(touch, 0), groundPinSupported: bit(touch, 1), groundPinForProtectiveEarth: bit(touch, 2) };
    for (const k of ['peakCurrent1', 'peakCurrent2', 'peakCurrent3']) {
      const v = n(k);
      if (v !== undefined) data[`${k}Fields`] = peakCurrent(v);
    }
    const temp = n('touchTemp');
    if (temp !== undefined) data.touchTempText = TOUCH_TEMP[temp] ?? 'reserved';
    const inputs = n('sourceInputs');
    if (inputs !== undefined) data.sourceInputsFlags = { externalSupply: bit(inputs, 0), externalSupplyUnconstrained: bit(inputs, 1), internalBattery: bit(inputs, 2) };
    const batteries = n('batteries');
    if (batteries !== undefined) data.batteriesFields = { fixedBatteries: batteries & 0xf, hotSwappableBatteries: batteries >> 4 };
  } else if (messageType === 'Battery_Capabilities') {
    for (const [k, out] of [
      ['batteryDesignCapacity', 'batteryDesignCapacityMwh'],
      ['batteryLastFullChargeCapacity', 'batteryLastFullChargeCapacityMwh'],
    ] as const) {
      const v = n(k);
      // 0x0000: no battery; 0xFFFF: capacity unknown.
      if (v !== undefined) data[out] = v === 0 || v === 0xffff ? null : v * 100;
    }
    const type = n('batteryType');
    if (type !== undefined) data.invalidBatteryReference = bit(type, 0);
  }
}

function hexOf(bytes: Uint8Array): string {
  let out = '';
  for (const b of bytes) out += b.toString(16).padStart(2, '0');
  return out;
}

function bytesOf(hex: unknown, name: string): Uint8Array {
  if (hex === undefined) return new Uint8Array(0);
  if (typeof hex !== 'string' || !/^([0-9a-f]{2})*$/i.test(hex)) throw new RangeError(`${name}: expected hex, two digits a byte`);
  return Uint8Array.from({ length: hex.length / 2 }, (_, i) => parseInt(hex.slice(2 * i, 2 * i + 2), 16));
}

const latin1 = (bytes: Uint8Array) => String.fromCharCode(...bytes);

function ascii(value: unknown, name: string, maxBytes: number): Uint8Array {
  if (typeof value !== 'string' || value.length > maxBytes || !/^[\x00-\xff]*$/.test(value)) throw new RangeError(`${name}: ${JSON.stringify(value)} is not text of at most ${maxBytes} characters`);
  return Uint8Array.from(value, (c) => c.charCodeAt(0));
}

/** Manufacturer_Info, Country_Codes, Country_Info. */
function decodeVariable(messageType: string, block: Uint8Array): Record<string, unknown> | undefined {
  const view = new DataView(block.buffer, block.byteOffset, block.byteLength);
  if (messageType === 'Manufacturer_Info') {
    if (block.length < 4) return undefined;
    const text = block.subarray(4);
    const nul = text.indexOf(0);
    const end = nul < 0 ? text.length : nul;
    const data: Record<string, unknown> = { vid: view.getUint16(0, true), pid: view.getUint16(2, true), manufacturerString: latin1(text.subarray(0, end)) };
    if (end < text.length) data.trailing = hexOf(text.subarray(end));
    return data;
  }
  if (messageType === 'Country_Codes') {
    if (block.length < 2) return undefined;
    const count = Math.floor((block.length - 2) / 2);
    const codes: string[] = [];
    for (let i = 0; i < count; i++) codes.push(latin1(block.subarray(2 + 2 * i, 4 + 2 * i)));
    const data: Record<string, unknown> = { length: block[0]!, reserved: block[1]!, countryCodes: codes };
    if (block.length > 2 + 2 * count) data.trailing = hexOf(block.subarray(2 + 2 * count));
    return data;
  }
  if (block.length < 4) return undefined;
  return { countryCode: latin1(block.subarray(0, 2)), reserved: view.getUint16(2, true), countrySpecificData: hexOf(block.subarray(4)) };
}

function encodeVariable(messageType: string, data: Record<string, unknown>): Uint8Array {
  const parts: Uint8Array[] = [];
  if (messageType === 'Manufacturer_Info') {
    const head = new Uint8Array(4);
    new DataView(head.buffer).setUint16(0, units(data.vid, 1, 16, 'data.vid', 'units'), true);
    new DataView(head.buffer).setUint16(2, units(data.pid, 1, 16, 'data.pid', 'units'), true);
    parts.push(head, ascii(data.manufacturerString ?? '', 'data.manufacturerString', 256), bytesOf(data.trailing, 'data.trailing'));
  } else if (messageType === 'Country_Codes') {
    const codes = Array.isArray(data.countryCodes) ? data.countryCodes : [];
    parts.push(Uint8Array.of(code(data.length ?? codes.length, 8, 'data.length'), code(data.reserved ?? 0, 8, 'data.reserved')));
    codes.forEach((c, i) => {
      const bytes = ascii(c, `data.countryCodes[${i}]`, 2);
      if (bytes.length !== 2) throw new RangeError(`data.countryCodes[${i}]: ${JSON.stringify(c)} is not two characters`);
      parts.push(bytes);
    });
    parts.push(bytesOf(data.trailing, 'data.trailing'));
  } else {
    const country = ascii(data.countryCode, 'data.countryCode', 2);
    if (country.length !== 2) throw new RangeError(`data.countryCode: ${JSON.stringify(data.countryCode)} is not two characters`);
    const reserved = code(data.reserved ?? 0, 16, 'data.reserved');
    parts.push(country, Uint8Array.of(reserved & 0xff, reserved >> 8), bytesOf(data.countrySpecificData, 'data.countrySpecificData'));
  }
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** True when this message type's data block is read into `data`. */
export function hasDataBlock(messageType: string): boolean {
  return messageType in BLOCKS || VARIABLE.has(messageType) || messageType === 'PPS_Status' || messageType === 'Extended_Control';
}

/** Reads a complete data block. Never throws; unknown types give undefined. */
export function decodeDataBlock(messageType: string, block: Uint8Array): Record<string, unknown> | undefined {
  const view = new DataView(block.buffer, block.byteOffset, block.byteLength);
  if (messageType === 'PPS_Status') {
    if (block.length < 4) return undefined;
    const voltage = view.getUint16(0, true);
    const current = view.getUint8(2);
    const flags = view.getUint8(3);
    return {
      outputVoltageMv: voltage === 0xffff ? null : voltage * 20,
      outputCurrentMa: current === 0xff ? null : current * 50,
      ptf: (flags >> 1) & 3,
      omf: (flags & 8) !== 0,
    };
  }
  if (messageType === 'Extended_Control') {
    if (block.length < 2) return undefined;
    const type = view.getUint8(0);
    return { type: extendedControlName(type) ?? type, data: view.getUint8(1) };
  }
  if (VARIABLE.has(messageType)) return decodeVariable(messageType, block);
  const layout = BLOCKS[messageType];
  if (!layout) return undefined;
  const data: Record<string, unknown> = {};
  let offset = 0;
  for (const f of layout.fields) {
    if (offset + f.size > block.length) break;
    data[f.name] = f.size === 1 ? view.getUint8(offset) : f.size === 2 ? view.getUint16(offset, true) : view.getUint32(offset, true);
    offset += f.size;
  }
  if (offset < block.length) data.trailing = hexOf(block.subarray(offset));
  addSubFields(messageType, data);
  return data;
}

/** Writes a data block from `data`; fields are written in order up to the first one left out. Throws RangeError. */
export function encodeDataBlock(messageType: string, data: Record<string, unknown>): Uint8Array {
  if (messageType === 'PPS_Status') {
    const out = new Uint8Array(4);
    const view = new DataView(out.buffer);
    view.setUint16(0, data.outputVoltageMv === null ? 0xffff : units(data.outputVoltageMv, 20, 16, 'data.outputVoltageMv', 'mV'), true);
    out[2] = data.outputCurrentMa === null ? 0xff : units(data.outputCurrentMa, 50, 8, 'data.outputCurrentMa', 'mA');
    out[3] = (code(data.ptf, 2, 'data.ptf') << 1) | (data.omf === true ? 8 : 0);
    return out;
  }
  if (messageType === 'Extended_Control') {
    const named = typeof data.type === 'string' && Object.hasOwn(EXTENDED_CONTROL_TYPES, data.type) ? EXTENDED_CONTROL_TYPES[data.type as ExtendedControlType] : undefined;
    return Uint8Array.of(named ?? code(data.type, 8, 'data.type'), code(data.data ?? 0, 8, 'data.data'));
  }
  if (VARIABLE.has(messageType)) return encodeVariable(messageType, data);
  const layout = BLOCKS[messageType];
  if (!layout) throw new RangeError(`data: ${messageType} has no data block the codec writes; give "payload" instead`);
  const present = layout.fields.filter((_, i) => layout.fields.slice(0, i + 1).every((g) => data[g.name] !== undefined));
  const trailing = bytesOf(data.trailing, 'data.trailing');
  const size = present.reduce((n, f) => n + f.size, 0);
  const out = new Uint8Array(size + trailing.length);
  out.set(trailing, size);
  const view = new DataView(out.buffer);
  let offset = 0;
  for (const f of present) {
    const value = units(data[f.name], 1, 8 * f.size, `data.${f.name}`, f.unit ?? 'units');
    if (f.size === 1) view.setUint8(offset, value);
    else if (f.size === 2) view.setUint16(offset, value, true);
    else view.setUint32(offset, value, true);
    offset += f.size;
  }
  return out;
}
