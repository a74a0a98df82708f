import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { SourcePdo } from '../pd/types.ts';
import { checkCaps } from './check-caps.ts';
import { eprAvsApdo, fixedPdo as fixed, paddingPdo, ppsApdo as pps } from './pdo-builders.ts';
import { powerRulesFor } from './power-rules.ts';
import { definedPpsRanges } from './programmable-ranges.ts';

const rules = (findings: { rule: string }[]) => findings.map((f) => f.rule);

describe('checkCaps', () => {
  it('declared PDP is used as is; otherwise inferred and said so', () => {
    const offers = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250)];
    expect(checkCaps(offers, { pdpW: 65, cableMa: 5_000 })).toEqual({ pdpW: 65, pdpInferred: false, findings: [] });
    // 3.25 A is above 3 A: information that a 5 A cable is needed (USB Type-C R2.3 §4.9, from memory).
    expect(checkCaps(offers)).toMatchObject({
      pdpW: 65,
      pdpInferred: true,
      findings: [
        { rule: 'caps.cable-current', object: 4 },
        { rule: 'caps.pdp-inferred', severity: 'info' },
      ],
    });
  });

  it('a declared PDP above what is offered yields Power Rules errors', () => {
    const fortyFive = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000)];
    expect(rules(checkCaps(fortyFive, { pdpW: 65 }).findings)).toEqual(['caps.power-rules-missing']);
  });

  it('compares a printed label with the offers and the PDP', () => {
    const offers = [fixed(5_000, 3_000), fixed(9_000, 2_000)];
    expect(rules(checkCaps(offers, { pdpW: 18, label: '5V⎓3A 9V⎓2A 18W' }).findings)).toEqual([]);
    expect(rules(checkCaps(offers, { pdpW: 18, label: '5V⎓3A 9V⎓2A 20W' }).findings)).toEqual(['caps.label-mismatch']);
  });

  it('stops at caps.empty for no objects', () => {
    expect(checkCaps([])).toMatchObject({ pdpW: 0, findings: [{ rule: 'caps.empty' }] });
    expect(rules(checkCaps([], { pdpW: 10 }).findings)).toEqual(['caps.empty', 'caps.power-rules-missing']);
  });

  /*
   * A fact of the trade: a 100 W adapter offering 5, 9, 12 and 15 V at 3 A, 20 V at 5 A and one
   * programmable range 3.3–20 V up to 5 A (20 V × 5 A = 100 W). What the specification says:
   * - 5, 9, 15 V at 3 A and 20 V at PDP/20 = 5 A are the 60–100 W band's normative offers
   *   (USB PD R3.1 V1.8 §10.2.3, Table 10-2, from memory): no power-rules finding;
   * - 12 V is an optional voltage the Power Rules allow but do not require (same section): no finding;
   * - fixed by rising voltage, the APDO last (§6.4.1, from memory): no order finding;
   * - 3.3–20 V is none of the defined PPS ranges (3.3–21 V would be; §10.2.3.2, from memory): caps.pps-range;
   * - 20 V 5 A and the 5 A range exceed 3 A: usable only over a 5 A cable (USB Type-C R2.3 §4.9,
   *   from memory): caps.cable-current for objects 5 and 6;
   * - over a 3 A cable, 20 V at 3 A is what the Power Rules ask (the 5 A cable note of Table 10-2),
   *   so no power-rules error either; over a 5 A cable, 20 V at only 3 A would fail 100 W.
   */
  const hundred = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(12_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 5_000), pps(3_300, 20_000, 5_000)];
  it('the 100 W adapter with a 3.3–20 V range', () => {
    const report = checkCaps(hundred, { pdpW: 100 });
    expect(report.findings).toMatchObject([
      { rule: 'caps.pps-range', severity: 'warning', object: 6 },
      { rule: 'caps.cable-current', severity: 'info', object: 5 },
      { rule: 'caps.cable-current', severity: 'info', object: 6 },
    ]);
    expect(checkCaps(hundred).pdpW).toBe(100);
    expect(rules(checkCaps(hundred, { pdpW: 100, cableMa: 5_000 }).findings)).toEqual(['caps.pps-range']);
    expect(rules(checkCaps(hundred, { pdpW: 100, cableMa: 3_000 }).findings)).toEqual(['caps.pps-range', 'caps.cable-current', 'caps.cable-current']);
  });
  it('20 V at 3 A satisfies 100 W only without a 5 A cable', () => {
    const capped = [...hundred.slice(0, 4), fixed(20_000, 3_000), pps(3_300, 21_000, 3_000)];
    expect(rules(checkCaps(capped, { pdpW: 100, cableMa: 3_000 }).findings)).toEqual([]);
    expect(rules(checkCaps(capped, { pdpW: 100, cableMa: 5_000 }).findings)).toEqual(['caps.power-rules-current']);
  });
});

/** A lawful offer set for a PDP: the normative offers, optional 12 V and defined PPS ranges; EPR above 100 W. */
function lawfulOffers(pdpW: number, extra12V: boolean, ppsPicks: number[]): SourcePdo[] {
  const epr = pdpW > 100;
  const required = powerRulesFor(pdpW, { epr });
  const spr = required.fixed.filter((r) => r.voltageMv <= 20_000);
  const fixedSpr = spr.map((r) => fixed(r.voltageMv, r.currentMa));
  const sprPdpW = required.sprPdpW;
  if (extra12V && sprPdpW > 15) {
    const currentMa = Math.min(3_000, Math.floor((sprPdpW * 1_000_000) / 12_000 / 10) * 10);
    const at = fixedSpr.findIndex((p) => p.voltageMv > 12_000);
    fixedSpr.splice(at === -1 ? fixedSpr.length : at, 0, fixed(12_000, currentMa));
  }
  const ranges = [...new Set(ppsPicks)].map((i) => definedPpsRanges[i % definedPpsRanges.length]!).sort((a, b) => a.maxVoltageMv - b.maxVoltageMv);
  const programmable = ranges.map((r) => pps(r.minVoltageMv, r.maxVoltageMv, 3_000));
  const sprPart = [...fixedSpr, ...programmable].slice(0, 7);
  if (!epr) return sprPart;
  const eprFixed = required.fixed.filter((r) => r.voltageMv > 20_000).map((r) => fixed(r.voltageMv, r.currentMa));
  const avs = required.avs!;
  return [...sprPart, ...Array.from({ length: 7 - sprPart.length }, paddingPdo), ...eprFixed, eprAvsApdo(avs.minVoltageMv, avs.maxVoltageMv, pdpW)];
}

const lawfulArb = fc.record({
  pdpW: fc.integer({ min: 1, max: 240 }),
  extra12V: fc.boolean(),
  ppsPicks: fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 2 }),
  cableMa: fc.constantFrom(undefined, 3_000, 5_000),
});

describe('checkCaps properties', () => {
  it('a lawful offer set for any PDP gets no error finding', () => {
    fc.assert(
      fc.property(lawfulArb, ({ pdpW, extra12V, ppsPicks, cableMa }) => {
        const offers = lawfulOffers(pdpW, extra12V, ppsPicks);
        const { findings } = checkCaps(offers, { pdpW, cableMa, epr: pdpW > 100 });
        expect(findings.filter((f) => f.severity === 'error')).toEqual([]);
      }),
      { numRuns: 300 },
    );
  });

  it('removing a required voltage always yields caps.power-rules-missing', () => {
    fc.assert(
      fc.property(lawfulArb, fc.nat(), ({ pdpW, extra12V, ppsPicks, cableMa }, pick) => {
        const epr = pdpW > 100;
        const offers = lawfulOffers(pdpW, extra12V, ppsPicks);
        const required = powerRulesFor(pdpW, { epr }).fixed;
        const gone = required[pick % required.length]!.voltageMv;
        const without = offers.map((p) => (p.kind === 'fixed' && p.voltageMv === gone ? paddingPdo() : p)).filter((p) => epr || p.raw !== '0x00000000');
        const { findings } = checkCaps(without, { pdpW, cableMa, epr });
        expect(findings.map((f) => f.rule)).toContain('caps.power-rules-missing');
      }),
      { numRuns: 300 },
    );
  });
});
