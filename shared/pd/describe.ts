/**
 * Plain-text descriptions of decoded fields for people (CLI listing, Decoder page): a field name
 * with its unit suffix (`voltageMv`) becomes words and a value in the larger unit ("voltage", "5 V").
 */
import type { DataObject } from './types.ts';

const UNIT_SUFFIXES: readonly [suffix: string, unit: string, divisor: number][] = [
  ['Mv', 'V', 1000],
  ['Ma', 'A', 1000],
  ['Mw', 'W', 1000],
  ['Mwh', 'Wh', 1000],
  ['Ms', 'ms', 1],
  ['W', 'W', 1],
  ['C', '°C', 1],
];

/** Identifiers shown in hex, as the specification and USB descriptors print them. */
const HEX_FIELDS = new Set(['svid', 'vid', 'pid', 'xid', 'usbVendorId', 'usbProductId', 'bcdDevice', 'svidN', 'svidNPlus1']);

/** "maxCurrent15vMa" → "max current 15v"; "pdpW" → "PDP". */
export function fieldWords(name: string): string {
  let base = name;
  for (const [suffix] of UNIT_SUFFIXES) {
    if (name.endsWith(suffix) && name.length > suffix.length && /[a-z0-9]/.test(name[name.length - suffix.length - 1]!)) {
      base = name.slice(0, -suffix.length);
      break;
    }
  }
  return base
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .replace(/\b(pdp|usb|epr|spr|pps|avs|ocp|otp|ovp|svid|vid|pid|xid|drd|dp|tbt|pcie|ptf|omf|vbus|vconn|sbu|vdo|hw|id|vpd|ufp|dfp)\b/g, (w) => w.toUpperCase())
    .replace(/\busb(\d)/gi, 'USB$1')
    .replace(/([a-z])(\d+)v\b/g, '$1 $2 V');
}

/** A value with its unit, e.g. ("voltageMv", 5000) → "5 V"; booleans "yes"/"no"; null "not supported". */
export function formatValue(name: string, value: unknown): string {
  if (value === null) return 'not supported';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value !== 'number') return String(value);
  if (HEX_FIELDS.has(name)) return '0x' + value.toString(16).padStart(value > 0xffff ? 8 : 4, '0');
  for (const [suffix, unit, divisor] of UNIT_SUFFIXES) {
    if (name.endsWith(suffix) && /[a-z0-9]/.test(name[name.length - suffix.length - 1] ?? '')) return `${trim(value / divisor)} ${unit}`;
  }
  return String(value);
}

function trim(n: number): string {
  return Number.isInteger(n) ? String(n) : String(Math.round(n * 1000) / 1000);
}

/** The fields of an object as [words, value] pairs (without kind and raw). */
export function describeFields(object: Record<string, unknown>): [string, string][] {
  const out: [string, string][] = [];
  for (const [name, value] of Object.entries(object)) {
    if (name === 'kind' || name === 'raw') continue;
    out.push([fieldWords(name), formatValue(name, value)]);
  }
  return out;
}

/** One line for an object: the values that matter, flags only when set ("5 V, 3 A, unconstrained power"). */
export function summarizeObject(object: DataObject): string {
  const parts: string[] = [];
  for (const [name, value] of Object.entries(object)) {
    if (name === 'kind' || name === 'raw') continue;
    if (typeof value === 'boolean') {
      if (value) parts.push(fieldWords(name));
    } else if (name === 'peakCurrent' || name === 'frSwapRequiredCurrent') {
      if (value !== 0) parts.push(`${fieldWords(name)} ${String(value)}`);
    } else {
      parts.push(`${fieldWords(name)} ${formatValue(name, value)}`);
    }
  }
  return parts.join(', ');
}
