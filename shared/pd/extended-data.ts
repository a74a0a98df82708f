/**
 * Data blocks of extended messages, read into `message.data` once the block is complete.
 * Multi-byte fields are little-endian (USB PD R3.2 V1.1 §6.5). Layouts (R3.1 V1.8 tables):
 * - Source_Capabilities_Extended, §6.5.1 Table 6.54 (SCEDB, 25 bytes; R3.0 ended at byte 23).
 * - Status, §6.5.2 Table 6.55 (SDB, 7 bytes in R3.1; earlier revisions fewer).
 * - PPS_Status, §6.5.10 Table 6.68 (PPSSDB, 4 bytes): Output Voltage (20 mV, 0xFFFF = not
 *   supported), Output Current (50 mA, 0xFF = not supported), Real Time Flags (B2..1 PTF, B3 OMF).
 * - Extended_Control, §6.5.14 Table 6.74 (ECDB, 2 bytes): Type, Data.
 * Only whole fields are read; a field the block is too short for is left out (older revisions).
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
    u16('vid', 'Vendor ID'), u16('pid', 'Product ID'), { name: 'xid', size: 4, label: 'XID' },
    u8('fwVersion', 'Firmware Version'), u8('hwVersion', 'Hardware Version'), u8('voltageRegulation', 'Voltage Regulation'),
    u8('holdupTimeMs', 'Holdup Time', 'ms'), u8('compliance', 'Compliance'), u8('touchCurrent', 'Touch Current'),
    u16('peakCurrent1', 'Peak Current1'), u16('peakCurrent2', 'Peak Current2'), u16('peakCurrent3', 'Peak Current3'),
    u8('touchTemp', 'Touch Temp'), u8('sourceInputs', 'Source Inputs'), u8('batteries', 'Number of Batteries/Battery Slots'),
    u8('sprSourcePdpW', 'SPR Source PDP Rating', 'W'), u8('eprSourcePdpW', 'EPR Source PDP Rating', 'W'),
  ],
};

export const STATUS_LAYOUT: BlockLayout = {
  messageType: 'Status',
  ref: 'USB PD R3.2 V1.1 §6.5.2, Status Data Block (R3.1 Table 6.55)',
  fields: [
    u8('internalTempC', 'Internal Temp (°C; 0 = not supported)', '°C'), u8('presentInput', 'Present Input'),
    u8('presentBatteryInput', 'Present Battery Input'), u8('eventFlags', 'Event Flags'), u8('temperatureStatus', 'Temperature Status'),
    u8('powerStatus', 'Power Status'), u8('powerStateChange', 'Power State Change'),
  ],
};

export const GET_BATTERY_LAYOUT = (messageType: string): BlockLayout => ({
  messageType,
  ref: `USB PD R3.2 V1.1 §6.5, ${messageType} Data Block (from memory)`,
  fields: [u8('batteryRef', 'Battery Cap Ref / Battery Status Ref')],
});

const EXTENDED_CONTROL_TYPES: Record<number, string> = { 1: 'EPR_Get_Source_Cap', 2: 'EPR_Get_Sink_Cap', 3: 'EPR_KeepAlive', 4: 'EPR_KeepAlive_Ack' };

const BLOCKS: Record<string, BlockLayout> = {
  Source_Capabilities_Extended: SOURCE_CAPS_EXTENDED_LAYOUT,
  Status: STATUS_LAYOUT,
  Get_Battery_Cap: GET_BATTERY_LAYOUT('Get_Battery_Cap'),
  Get_Battery_Status: GET_BATTERY_LAYOUT('Get_Battery_Status'),
};

/** True when this message type's data block is read into `data`. */
export function hasDataBlock(messageType: string): boolean {
  return messageType in BLOCKS || messageType === 'PPS_Status' || messageType === 'Extended_Control';
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
    return { type: EXTENDED_CONTROL_TYPES[type] ?? type, data: view.getUint8(1) };
  }
  const layout = BLOCKS[messageType];
  if (!layout) return undefined;
  const data: Record<string, unknown> = {};
  let offset = 0;
  for (const f of layout.fields) {
    if (offset + f.size > block.length) break;
    data[f.name] = f.size === 1 ? view.getUint8(offset) : f.size === 2 ? view.getUint16(offset, true) : view.getUint32(offset, true);
    offset += f.size;
  }
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
    const named = Object.entries(EXTENDED_CONTROL_TYPES).find(([, name]) => name === data.type);
    return Uint8Array.of(named ? Number(named[0]) : code(data.type, 8, 'data.type'), code(data.data ?? 0, 8, 'data.data'));
  }
  const layout = BLOCKS[messageType];
  if (!layout) throw new RangeError(`data: ${messageType} has no data block the codec writes; give "payload" instead`);
  const present = layout.fields.filter((f, i) => layout.fields.slice(0, i + 1).every((g) => data[g.name] !== undefined));
  const out = new Uint8Array(present.reduce((n, f) => n + f.size, 0));
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
