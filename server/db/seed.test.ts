import { describe, expect, it } from 'vitest';
import { demoDevices } from './seed.ts';

const word = (hex: string) => Number.parseInt(hex, 16) >>> 0;
const bits = (w: number, high: number, low: number) => (w >>> low) & ((1 << (high - low + 1)) - 1);

/** Fixed Supply PDO, USB PD R3.2 Table 6.9: B31..30 = 00b, B19..10 voltage (50 mV), B9..0 maximum current (10 mA). */
const fixed = (hex: string) => {
  const w = word(hex);
  expect(bits(w, 31, 30)).toBe(0b00);
  return `${bits(w, 19, 10) * 50}mV ${bits(w, 9, 0) * 10}mA`;
};

/** SPR PPS APDO, USB PD R3.2 Table 6.14: B31..30 = 11b, B29..28 = 00b, B24..17 max (100 mV), B15..8 min (100 mV), B6..0 current (50 mA). */
const pps = (hex: string) => {
  const w = word(hex);
  expect(bits(w, 31, 30)).toBe(0b11);
  expect(bits(w, 29, 28)).toBe(0b00);
  return `${bits(w, 15, 8) * 100}-${bits(w, 24, 17) * 100}mV ${bits(w, 6, 0) * 50}mA`;
};

const device = (name: string) => demoDevices.find((d) => d.name === name)!;

describe('demo devices', () => {
  it('K65 offers 5/9/15 V 3 A, 20 V 3.25 A and PPS 3.3–21 V 3 A', () => {
    const [a, b, c, d, e] = device('Kestrel K65 travel adapter').pdos as [string, string, string, string, string];
    expect([fixed(a), fixed(b), fixed(c), fixed(d)]).toEqual(['5000mV 3000mA', '9000mV 3000mA', '15000mV 3000mA', '20000mV 3250mA']);
    expect(pps(e)).toBe('3300-21000mV 3000mA');
  });

  it('D100 offers 5/9/15 V 3 A, 20 V 5 A and PPS 3.3–21 V 5 A', () => {
    const [a, b, c, d, e] = device('Kestrel D100 desk charger').pdos as [string, string, string, string, string];
    expect([fixed(a), fixed(b), fixed(c), fixed(d)]).toEqual(['5000mV 3000mA', '9000mV 3000mA', '15000mV 3000mA', '20000mV 5000mA']);
    expect(pps(e)).toBe('3300-21000mV 5000mA');
  });

  it('Wren 14 is a sink whose first object is vSafe5V', () => {
    const wren = device('Kestrel Wren 14 laptop');
    expect(wren.role).toBe('sink');
    // Sink Fixed Supply PDO, USB PD R3.2 Table 6.17 (same voltage/current fields); the first PDO is 5 V (§6.4.1.3, from memory).
    expect(wren.pdos.map(fixed)).toEqual(['5000mV 3000mA', '15000mV 3000mA', '20000mV 3250mA']);
  });

  it('uses fictional names only', () => {
    for (const d of demoDevices) expect(d.name.startsWith('Kestrel ')).toBe(true);
  });
});
