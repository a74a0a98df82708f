/**
 * fast-check arbitraries over the engine's inputs, for property vectors (`engine.arbitraries`) and
 * the benchmark. PDOs are packed here by hand from the specification's bit layouts, not through the
 * codec, so a property that decodes them checks the codec against an independent writer.
 *
 * Fixed Supply PDO (USB PD R3.1 V1.8 §6.4.1.2.2, Table 6-9): B31..30 = 00, B19..10 voltage in 50 mV,
 * B9..0 maximum current in 10 mA. PPS APDO (Table 6-13): B31..30 = 11, B29..28 = 00, B24..17 maximum
 * voltage in 100 mV, B15..8 minimum voltage in 100 mV, B6..0 maximum current in 50 mA.
 * Power Rules (USB PD R3.1 V1.8 §10.2.3.2, Table 10-2 "Normative voltages and currents", from
 * memory): PDP ≤ 15 W: 5 V at PDP/5; ≤ 27 W: adds 9 V at PDP/9 (5 V at 3 A); ≤ 45 W: adds 15 V at
 * PDP/15 (9 V at 3 A); ≤ 100 W: adds 20 V at PDP/20 (15 V at 3 A).
 */
import * as fc from 'fast-check';

/** The 32-bit Fixed Supply PDO for a voltage and current (flags all clear). */
export function fixedPdoRaw(voltageMv: number, currentMa: number, flags = 0): number {
  return (flags | ((Math.floor(voltageMv / 50) & 0x3ff) << 10) | (Math.floor(currentMa / 10) & 0x3ff)) >>> 0;
}

/** The 32-bit PPS APDO for a range and current. */
export function ppsApdoRaw(minVoltageMv: number, maxVoltageMv: number, currentMa: number): number {
  return ((0b11 << 30) | ((Math.floor(maxVoltageMv / 100) & 0xff) << 17) | ((Math.floor(minVoltageMv / 100) & 0xff) << 8) | (Math.floor(currentMa / 50) & 0x7f)) >>> 0;
}

export function pdoHex(raw: number): string {
  return `0x${(raw >>> 0).toString(16).padStart(8, '0')}`;
}

/** Current for `pdpW` at `voltageMv`, rounded up to the PDO's 10 mA step and capped at `capMa`. */
function powerRulesCurrentMa(pdpW: number, voltageMv: number, capMa: number): number {
  const exactMa = (pdpW * 1_000_000) / voltageMv;
  return Math.min(capMa, Math.ceil(exactMa / 10) * 10);
}

/** The offers the Power Rules require for a PDP (1–100 W), as PDO hex, lowest voltage first. */
export function lawfulCapsPdos(pdpW: number): string[] {
  const steps = [
    { voltageMv: 5_000, fromW: 0 },
    { voltageMv: 9_000, fromW: 15 },
    { voltageMv: 15_000, fromW: 27 },
    { voltageMv: 20_000, fromW: 45 },
  ];
  const offered = steps.filter((s) => pdpW > s.fromW);
  return offered.map((s, i) => {
    const last = i === offered.length - 1;
    // Every voltage below the top one carries 3 A; the top one carries the rest of the PDP.
    const capMa = last && s.voltageMv === 20_000 ? 5_000 : 3_000;
    const currentMa = last ? powerRulesCurrentMa(pdpW, s.voltageMv, capMa) : 3_000;
    return pdoHex(fixedPdoRaw(s.voltageMv, currentMa));
  });
}

/** A PDP in whole watts over the SPR range. */
export const pdpW = (): fc.Arbitrary<number> => fc.integer({ min: 1, max: 100 });

/** A lawful SPR offer set for a random PDP, with that PDP. */
export const lawfulCaps = (): fc.Arbitrary<{ pdpW: number; pdos: string[] }> => pdpW().map((w) => ({ pdpW: w, pdos: lawfulCapsPdos(w) }));

/** A structurally valid offer set: vSafe5V first, then fixed supplies by rising voltage, maybe one PPS. */
export const sourcePdos = (): fc.Arbitrary<string[]> =>
  fc
    .record({
      firstMa: fc.integer({ min: 10, max: 300 }).map((n) => n * 10),
      fixed: fc.uniqueArray(fc.constantFrom(9_000, 12_000, 15_000, 20_000), { maxLength: 3 }),
      currentsMa: fc.array(
        fc.integer({ min: 50, max: 500 }).map((n) => n * 10),
        { minLength: 3, maxLength: 3 },
      ),
      pps: fc.option(fc.constantFrom([3_300, 5_900], [3_300, 11_000], [3_300, 16_000], [3_300, 21_000]), { nil: undefined }),
      ppsMa: fc.integer({ min: 20, max: 100 }).map((n) => n * 50),
    })
    .map(({ firstMa, fixed, currentsMa, pps, ppsMa }) => {
      const pdos = [fixedPdoRaw(5_000, firstMa)];
      for (const [i, voltageMv] of [...fixed].sort((a, b) => a - b).entries()) pdos.push(fixedPdoRaw(voltageMv, currentsMa[i] ?? 3_000));
      if (pps) pdos.push(ppsApdoRaw(pps[0], pps[1], ppsMa));
      return pdos.map(pdoHex);
    });

/** Any of vector.md's four sink policies, with values a real sink might ask for. */
export const sinkPolicy = () =>
  fc.oneof(
    fc.constant({ kind: 'max-power' as const }),
    fc.record({
      kind: fc.constant('fixed' as const),
      voltageMv: fc.constantFrom(5_000, 9_000, 12_000, 15_000, 20_000),
      currentMa: fc.integer({ min: 1, max: 100 }).map((n) => n * 50),
    }),
    fc.record({
      kind: fc.constant('pps' as const),
      voltageMv: fc.integer({ min: 165, max: 1_050 }).map((n) => n * 20),
      currentMa: fc.integer({ min: 1, max: 60 }).map((n) => n * 50),
    }),
    fc
      .record({ minVoltageMv: fc.constantFrom(5_000, 9_000), spanMv: fc.constantFrom(0, 4_000, 11_000), powerMw: fc.integer({ min: 1, max: 60 }).map((n) => n * 1_000) })
      .map(({ minVoltageMv, spanMv, powerMw }) => ({ kind: 'range' as const, minVoltageMv, maxVoltageMv: minVoltageMv + spanMv, powerMw })),
  );

export interface ScenarioOptions {
  /** Add one fault of these kinds (default: none). */
  faults?: ReadonlyArray<'drop-goodcrc'>;
  durationMs?: number;
}

/** A negotiation scenario (vector.md) over lawful offers, a random policy, cable and seed. */
export const scenario = (options: ScenarioOptions = {}) =>
  fc
    .record({
      caps: lawfulCaps(),
      policy: fc.oneof(
        fc.constant({ kind: 'max-power' as const }),
        fc.record({ kind: fc.constant('fixed' as const), voltageMv: fc.constantFrom(5_000, 9_000, 15_000, 20_000), currentMa: fc.integer({ min: 1, max: 60 }).map((n) => n * 50) }),
      ),
      specRevision: fc.constantFrom('2.0' as const, '3.0' as const),
      cableMa: fc.constantFrom(3_000, 5_000),
      resistanceMohm: fc.integer({ min: 50, max: 300 }),
      fault: fc.record({ from: fc.constantFrom('source' as const, 'sink' as const), nth: fc.integer({ min: 1, max: 4 }) }),
      seed: fc.integer({ min: 0, max: 0x7fff_ffff }),
    })
    .map(({ caps, policy, specRevision, cableMa, resistanceMohm, fault, seed }) => ({
      source: { caps: { pdos: caps.pdos }, specRevision },
      sink: { specRevision, policy },
      cable: { currentRatingMa: cableMa, resistanceMohm },
      faults: (options.faults ?? []).includes('drop-goodcrc') ? [{ kind: 'drop' as const, from: fault.from, messageType: 'GoodCRC', nth: fault.nth }] : [],
      durationMs: options.durationMs ?? 2_000,
      seed,
    }));

export const arbitraries = { pdpW, lawfulCaps, lawfulCapsPdos, sourcePdos, sinkPolicy, scenario, fixedPdoRaw, ppsApdoRaw, pdoHex };
