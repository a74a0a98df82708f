import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../../shared/sim/index.ts';
import { laneMessagesOf } from './lane-messages.ts';

describe('laneMessagesOf', () => {
  it('pairs each GoodCRC with its message on SOP and on SOP′ (the cable plug answers the source)', () => {
    // A 140 W EPR run over an EPR cable: Discover Identity on SOP′ before the offers and again at EPR entry.
    const parsed = parseScenario({
      source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c', '0x000641f4'] }, eprCaps: { pdos: ['0x0008c1f4'] } },
      sink: { epr: { pdpW: 140 }, policy: { kind: 'fixed', voltageMv: 28_000, currentMa: 5_000 } },
      cable: { currentRatingMa: 5_000, eMarker: { currentMa: 5_000, maxVoltageMv: 50_000, eprCapable: true } },
      durationMs: 1_500,
    });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const { lanes } = laneMessagesOf(simulate(parsed.scenario, { analyze: false }).events);
    const acknowledged = new Set(lanes.flatMap((lane) => (lane.goodCrcFor === undefined ? [] : [lane.goodCrcFor])));
    const unacknowledged = lanes.filter((lane, index) => lane.messageType !== 'GoodCRC' && !acknowledged.has(index)).map((lane) => `${lane.messageType} from ${lane.from}`);
    expect(unacknowledged).toEqual([]);
    expect(lanes.filter((lane) => lane.from === 'cable' && lane.messageType === 'Vendor_Defined')).toHaveLength(2);
  });
});
