import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../../../shared/sim/index.ts';
import { createSampleBuffer } from '../../../../shared/sim/sample-buffer.ts';
import { defaultScenario } from './form-model.ts';
import { laneMessagesOf } from '../../../components/timeline/lane-messages.ts';
import { chartMeasurements } from './timeline-data.ts';

function run(input: unknown) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario, { samples: true });
}

describe('timeline data', () => {
  it('links each GoodCRC to the message it acknowledges', () => {
    // The SOP' Discover Identity the source sends first (it offers 3.25 A, so it asks the cable) is left out here.
    const { lanes: all } = laneMessagesOf(run(defaultScenario).events);
    const first = all.findIndex((lane) => lane.messageType === 'Source_Capabilities');
    const lanes = all.slice(first);
    const types = lanes.map((lane) => lane.messageType);
    expect(types.slice(0, 4)).toEqual(['Source_Capabilities', 'GoodCRC', 'Request', 'GoodCRC']);
    expect(lanes[1]?.goodCrcFor).toBe(first);
    expect(lanes[3]?.goodCrcFor).toBe(first + 2);
    expect(lanes.some((lane) => lane.retry)).toBe(false);
    // 2-byte GoodCRC: 64 + 20 + 2 × 10 + 40 + 5 = 149 bits at 300 kbps ≈ 497 µs (USB PD R3.2 V1.1 §5.6, §5.8.1).
    expect(lanes[1]?.durationUs).toBe(497);
  });

  it('marks the Request sent again after its GoodCRC was dropped as a retry', () => {
    const { lanes } = laneMessagesOf(run({ ...defaultScenario, faults: [{ kind: 'drop', from: 'source', messageType: 'GoodCRC', nth: 1 }] }).events);
    const requests = lanes.filter((lane) => lane.messageType === 'Request');
    expect(requests).toHaveLength(2);
    expect(requests[0]?.retry).toBeUndefined();
    expect(requests[1]?.retry).toBe(true);
  });

  it('gives the chart the whole run coarsely and the window in detail', () => {
    const count = 100_000;
    const buffer = createSampleBuffer(1_000);
    // 5 V for the first half, 20 V after; a one-sample current spike at 70 s; the sink 200 mV lower.
    for (let index = 0; index < count; index += 1) buffer.push(index * 1_000, index < 50_000 ? 5_000 : 20_000, index === 70_000 ? 5_000 : 1_000, index < 50_000 ? 4_800 : 19_800);
    const samples = buffer.finish();
    // Four steps stand for the 100,000 samples; the chart reads them as samples all the same.
    expect(samples.steps).toBe(4);
    const whole = chartMeasurements(samples, { startUs: 0, endUs: 100_000_000 });
    expect(whole.source.length).toBeLessThanOrEqual(1_400);
    expect(Math.max(...whole.source.map((m) => m.ma ?? 0))).toBe(5_000);
    expect(whole.sink[0]).toEqual({ t: 0, mv: 4_800 });

    const zoomed = chartMeasurements(samples, { startUs: 49_990_000, endUs: 50_010_000 });
    const inWindow = zoomed.source.filter((m) => m.t >= 49_990_000 && m.t <= 50_010_000);
    expect(inWindow).toHaveLength(21);
    expect(zoomed.source.length).toBeLessThan(650);
    expect(zoomed.source[0]?.t).toBe(0);
    expect(zoomed.source.at(-1)?.t).toBe(99_999_000);
    const times = zoomed.source.map((m) => m.t);
    expect(times).toEqual([...times].sort((a, b) => a - b));
    expect(chartMeasurements(createSampleBuffer(1_000).finish(), { startUs: 0, endUs: 1 })).toEqual({ source: [], sink: [] });
  });
});
