import { describe, expect, it } from 'vitest';
import { analyseOffers, readOffers } from './analyse-offers.ts';

const sixtyFive = [
  { kind: 'fixed', voltageMv: 5_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 9_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 15_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 20_000, maxCurrentMa: 3_250 },
  { kind: 'pps', minVoltageMv: 3_300, maxVoltageMv: 21_000, maxCurrentMa: 3_000 },
] as const;

describe('analyseOffers', () => {
  it('checks the offers and gives the contract over 3 A and 5 A cables', () => {
    const r = analyseOffers({ offers: [...sixtyFive], pdpW: 65, policy: { kind: 'max-power' } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.report.findings.filter((f) => f.severity === 'error')).toEqual([]);
    // 20 V: 3 A over a 3 A cable (60 W), 3.25 A over 5 A (65 W); RDO 4 << 28 | 325 << 10 | 325
    expect(r.contracts.map((c) => [c.cableMa, c.contract.powerMw, c.rdo])).toEqual([
      [3_000, 60_000, '0x4004b12c'],
      [5_000, 65_000, '0x40051545'],
    ]);
  });
  it('places the first EPR offer at position 8 in EPR mode', () => {
    const r = analyseOffers({ offers: [...sixtyFive, { kind: 'fixed', voltageMv: 28_000, maxCurrentMa: 5_000 }], epr: true });
    expect(r.ok && r.pdos.length).toBe(8);
    expect(r.ok && r.report.findings.map((f) => f.rule)).not.toContain('caps.epr-position');
  });
  it('names the field of a bad policy', () => {
    expect(analyseOffers({ offers: [...sixtyFive], policy: { kind: 'fixed', voltageMv: 9_000 } })).toMatchObject({
      ok: false,
      error: { code: 'input.policy', message: expect.stringMatching(/^policy\.currentMa: /) },
    });
  });
});

describe('readOffers', () => {
  it('reads PDO words into form offers', () => {
    expect(readOffers({ pdos: ['0001912c', '0002d12c'] })).toMatchObject({
      ok: true,
      offers: [
        { kind: 'fixed', voltageMv: 5_000 },
        { kind: 'fixed', voltageMv: 9_000 },
      ],
      epr: false,
    });
  });
});
