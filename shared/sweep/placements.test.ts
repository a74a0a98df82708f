import { describe, expect, it } from 'vitest';
import { timersPd3 } from '../core/timers.ts';
import type { RunMessage } from './messages.ts';
import { countPlacements, delayEdgesMs, FAULT_FREE_ID, generatePlacements, matrixColumns, SWEEP_FAULT_KINDS } from './placements.ts';

const m = (index: number, from: 'source' | 'sink', messageType: string, nth = 1): RunMessage => ({ index, t: index * 1_000, from, messageType, nth, hex: '' });
// Source_Capabilities, GoodCRC, Request, GoodCRC, Accept, GoodCRC, PS_RDY, GoodCRC: a fixed contract's 8 messages.
const negotiation = [
  m(0, 'source', 'Source_Capabilities'),
  m(1, 'sink', 'GoodCRC'),
  m(2, 'sink', 'Request'),
  m(3, 'source', 'GoodCRC'),
  m(4, 'source', 'Accept'),
  m(5, 'sink', 'GoodCRC', 2),
  m(6, 'source', 'PS_RDY'),
  m(7, 'sink', 'GoodCRC', 3),
];

describe('generatePlacements', () => {
  it('places drop and corrupt on every message and two delays on every message but GoodCRC', () => {
    const placements = generatePlacements(negotiation);
    expect(placements[0]).toEqual({ id: FAULT_FREE_ID, faults: [] });
    // 1 fault-free + 8 drop + 8 corrupt + 2 × 4 delays.
    expect(placements).toHaveLength(25);
    expect(placements.find((p) => p.id === 'drop@5')?.faults).toEqual([{ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 2 }]);
    const { withinMs, pastMs } = delayEdgesMs();
    expect(placements.find((p) => p.id === `delay${pastMs}@4`)).toMatchObject({
      faults: [{ kind: 'delay', from: 'source', messageType: 'Accept', nth: 1, delayMs: pastMs }],
      cell: { messageIndex: 4, column: `delay ${pastMs} ms` },
    });
    expect(placements.some((p) => p.id === `delay${withinMs}@1`)).toBe(false);
    expect(new Set(placements.map((p) => p.id)).size).toBe(placements.length);
  });

  it('derives the delays from tSenderResponse (USB PD R3.2 V1.1 §6.6: 27–33 ms)', () => {
    expect(timersPd3.tSenderResponse).toMatchObject({ minUs: 27_000, maxUs: 33_000 });
    expect(delayEdgesMs()).toEqual({ withinMs: 20, pastMs: 34 });
    expect(matrixColumns()).toEqual(['drop', 'corrupt', 'delay 20 ms', 'delay 34 ms']);
  });

  it('places reject only on Requests and no-ps-rdy only on PS_RDY', () => {
    const placements = generatePlacements(negotiation, { kinds: ['reject', 'no-ps-rdy'] });
    expect(placements.map((p) => p.id)).toEqual([FAULT_FREE_ID, 'reject@2', 'no-ps-rdy@6']);
    expect(placements[1]!.faults).toEqual([{ kind: 'reject', nth: 1 }]);
  });

  it('adds every pair of single placements and each timer at both ends', () => {
    const singles = 24;
    const pairs = generatePlacements(negotiation, { pairs: true });
    expect(pairs).toHaveLength(1 + singles + (singles * (singles - 1)) / 2);
    expect(pairs.at(-1)!.faults).toHaveLength(2);
    const edges = generatePlacements(negotiation, { timerEdges: true }).filter((p) => p.timers);
    const ranged = Object.values(timersPd3).filter((t) => t.minUs < t.maxUs).length;
    expect(edges).toHaveLength(2 * ranged);
    expect(edges.find((p) => p.id === 'tPSTransition=min')?.timers).toEqual({ tPSTransition: 'min' });
    // tSinkRequest has one value (100 ms): no edges.
    expect(edges.some((p) => p.id.startsWith('tSinkRequest'))).toBe(false);
  });
});

describe('countPlacements', () => {
  it('counts exactly what generatePlacements builds, pairs and timer edges included', () => {
    for (const options of [{}, { pairs: true }, { timerEdges: true }, { kinds: SWEEP_FAULT_KINDS, pairs: true, timerEdges: true }, { kinds: ['reject'] as const, revision: '2.0' }]) {
      expect(countPlacements(negotiation, options)).toBe(generatePlacements(negotiation, options).length);
    }
    // 24 singles give 24 × 23 / 2 = 276 pairs: 1 + 24 + 276.
    expect(countPlacements(negotiation, { pairs: true })).toBe(301);
  });
});
