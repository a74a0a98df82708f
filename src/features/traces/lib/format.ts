import type { Contract } from '../../../../shared/core/contract.ts';

/** 1536 → "1.5 KB"; binary multiples, as file managers show them. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** A trace time in µs as seconds with up to three decimals: 215000 → "0.215 s". */
export function formatSeconds(tUs: number | undefined): string {
  if (tUs === undefined) return '—';
  return `${(tUs / 1_000_000).toFixed(3).replace(/\.?0+$/, '') || '0'} s`;
}

const trim = (value: number, digits: number) => value.toFixed(digits).replace(/\.?0+$/, '');

/** "20 V 3.25 A", "PPS 9 V 2 A". */
export function contractLabel(c: Pick<Contract, 'kind' | 'voltageMv' | 'currentMa'>): string {
  const prefix = c.kind === 'fixed' ? '' : `${c.kind.toUpperCase()} `;
  return `${prefix}${trim(c.voltageMv / 1_000, 2)} V ${trim(c.currentMa / 1_000, 2)} A`;
}

export function formatPower(powerMw: number): string {
  return `${trim(powerMw / 1_000, 1)} W`;
}
