import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../../../shared/sim/index.ts';
import { defaultScenario } from './form-model.ts';
import { laneMessagesOf, measurementsOf } from './timeline-data.ts';

function run(input: unknown) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario, { samples: true });
}

describe('timeline data', () => {
  it('links each GoodCRC to the message it acknowledges', () => {
    const { lanes } = laneMessagesOf(run(defaultScenario).events);
    const types = lanes.map((lane) => lane.messageType);
    expect(types.slice(0, 4)).toEqual(['Source_Capabilities', 'GoodCRC', 'Request', 'GoodCRC']);
    expect(lanes[1]?.goodCrcFor).toBe(0);
    expect(lanes[3]?.goodCrcFor).toBe(2);
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

  it('turns packed samples into source and sink measurements within a budget', () => {
    const data = Int32Array.from([0, 5_000, 100, 4_990, 1_000, 9_000, 2_000, 8_800, 2_000, 9_000, 3_000, 8_700]);
    expect(measurementsOf({ data, count: 3 })).toEqual({
      source: [{ t: 0, mv: 5_000, ma: 100 }, { t: 1_000, mv: 9_000, ma: 2_000 }, { t: 2_000, mv: 9_000, ma: 3_000 }],
      sink: [{ t: 0, mv: 4_990 }, { t: 1_000, mv: 8_800 }, { t: 2_000, mv: 8_700 }],
    });
    expect(measurementsOf({ data, count: 3 }, 2).source.map((m) => m.t)).toEqual([0, 2_000]);
  });
});
