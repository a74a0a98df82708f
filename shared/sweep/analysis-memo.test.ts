/**
 * The findings memo changes no finding: every run of a campaign (pairs and timer edges included)
 * gets from the memo exactly what a fresh analyser reports on its records, and runs that repeat a
 * trace share one analysis.
 */
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../sim/scenario.ts';
import { simulate } from '../sim/simulate.ts';
import { analyseRecords } from '../trace/analyser.ts';
import { analyserFindings, createFindingsMemo } from './analysis-memo.ts';
import { planSweep } from './plan.ts';
import { scenarioFor } from './run-placement.ts';

function scenario(input: unknown): Scenario {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return parsed.scenario;
}

// Kestrel Devices K27: 5 V 3 A and 9 V 3 A, the sink asks 9 V 2 A.
const nineVolt = scenario({ source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 2_000, seed: 3 });
// Kestrel Devices K45 prototype: 5 V 3 A and 15 V 3 A with no 9 V offer, which the Power Rules
// require of a 45 W source (USB PD R3.2 V1.1 §10.2.3, Table 10.2; from memory): a caps finding in every run.
const noNineVolt = scenario({ source: { caps: { pdos: ['0x0001912c', '0x0004b12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 15_000, currentMa: 3_000 } }, durationMs: 2_000, seed: 5 });

describe('the findings memo of a sweep', () => {
  for (const [name, base] of [
    ['9 V SPR', nineVolt],
    ['a source missing 9 V', noNineVolt],
  ] as const) {
    it(`gives each run of a campaign (${name}) the findings a fresh analyser reports`, () => {
      const planned = planSweep(base, { timerEdges: true, pairs: true, max: 160 });
      if (!planned.ok) throw new Error(planned.error.message);
      const memo = createFindingsMemo();
      for (const placement of planned.plan.placements) {
        const events = simulate(scenarioFor(base, placement), { decode: false, analyze: false }).events;
        expect(analyserFindings(events, memo)).toEqual(analyseRecords(events).findings);
      }
      // Runs repeating a trace (held timers that never fire) were analysed once.
      expect(memo.byTrace.size).toBeLessThan(planned.plan.placements.length);
    });
  }

  it('keeps the offer checks of the rules engine on a memoised offer list', () => {
    const events = simulate(noNineVolt, { decode: false, analyze: false }).events;
    const memo = createFindingsMemo();
    const rules = (findings: readonly { rule: string }[]) => findings.map((f) => f.rule).filter((rule) => rule.startsWith('caps.'));
    const first = rules(analyserFindings(events, memo));
    expect(first.length).toBeGreaterThan(0);
    // A second, different trace with the same offers reads the offer checks from the memo.
    const later = events.map((record) => ({ ...record, t: record.t + 1_000 }));
    expect(rules(analyserFindings(later, memo))).toEqual(first);
    expect(memo.analyser.capsFindings.size).toBe(1);
  });
});
