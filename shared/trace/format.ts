/** Numbers for sentences a support engineer can paste: "9 V", "2.25 A", "0.24 s", "41.2 ms". */
import type { Contract } from '../core/contract.ts';

const trim = (text: string): string => (text.includes('.') ? text.replace(/\.?0+$/, '') : text);

export const volts = (mv: number): string => `${trim((mv / 1_000).toFixed(2))} V`;
export const amps = (ma: number): string => `${trim((ma / 1_000).toFixed(2))} A`;
export const watts = (mw: number): string => `${trim((mw / 1_000).toFixed(1))} W`;

/** Seconds with up to three decimals: 240000 µs → "0.24 s". */
export const seconds = (us: number): string => `${trim((us / 1_000_000).toFixed(3))} s`;

/** Milliseconds with one decimal: 41230 µs → "41.2 ms". */
export const millis = (us: number): string => `${trim((us / 1_000).toFixed(1))} ms`;

/** "9 V 2 A", "PPS 8.4 V 2.5 A", "battery 9–12 V 30 W" style, from a contract. */
export function contractText(c: Contract): string {
  switch (c.kind) {
    case 'pps':
      return `PPS ${volts(c.voltageMv)} ${amps(c.currentMa)}`;
    case 'avs':
      return `AVS ${volts(c.voltageMv)} ${amps(c.currentMa)}`;
    case 'battery':
      return `battery ${volts(c.voltageMv)} ${watts(c.powerMw)}`;
    case 'variable':
      return `variable ${volts(c.voltageMv)} ${amps(c.currentMa)}`;
    default:
      return `${volts(c.voltageMv)} ${amps(c.currentMa)}`;
  }
}

export const sideName = (side: string): string => (side === 'source' ? 'source' : side === 'sink' ? 'sink' : 'cable');
