/**
 * VCD `$timescale` (IEEE 1364-2005 §18.2.3.7): 1, 10 or 100 followed by s, ms, us, ns, ps or fs,
 * with or without a space between them.
 */
const UNIT_US: Readonly<Record<string, number>> = { s: 1e6, ms: 1e3, us: 1, ns: 1e-3, ps: 1e-6, fs: 1e-9 };

export type VcdTimescale = `${1 | 10 | 100} ${'s' | 'ms' | 'us' | 'ns' | 'ps' | 'fs'}`;

/** Microseconds per tick, or null when the text is not a timescale. */
export function parseTimescaleUs(text: string): number | null {
  const match = /^\s*(1|10|100)\s*(s|ms|us|ns|ps|fs)\s*$/.exec(text);
  if (!match) return null;
  return Number(match[1]) * UNIT_US[match[2]!]!;
}
