import { describe, expect, it } from 'vitest';
import { createSampleBuffer } from '../../../../shared/sim/sample-buffer.ts';
import { firstIndexAtOrAfter, sampleAt, samplesCsv } from './samples.ts';

function packedOf(rows: [number, number, number, number][]) {
  const buffer = createSampleBuffer(1_000);
  for (const [t, mv, ma, sinkMv] of rows) buffer.push(t, mv, ma, sinkMv);
  return buffer.finish();
}

// The last two samples hold the same values: one step of two samples.
const packed = packedOf([
  [0, 5_000, 100, 4_990],
  [1_000, 5_010, 2_900, 4_720],
  [2_000, 20_000, 3_250, 19_675],
  [3_000, 20_000, 3_250, 19_675],
]);

describe('samples', () => {
  it('writes the CSV with the agreed header and one integer row a sample, held samples included', () => {
    expect(packed.steps).toBe(3);
    expect(samplesCsv(packed)).toBe('t_us,vbus_mv,ibus_ma,sink_vbus_mv\n0,5000,100,4990\n1000,5010,2900,4720\n2000,20000,3250,19675\n3000,20000,3250,19675\n');
    expect(samplesCsv(packedOf([]))).toBe('t_us,vbus_mv,ibus_ma,sink_vbus_mv\n');
  });

  it('reads one sample, inside a step too, and finds times by binary search', () => {
    expect(sampleAt(packed, 1)).toEqual({ tUs: 1_000, vbusMv: 5_010, ibusMa: 2_900, sinkVbusMv: 4_720 });
    expect(sampleAt(packed, 3)).toEqual({ tUs: 3_000, vbusMv: 20_000, ibusMa: 3_250, sinkVbusMv: 19_675 });
    expect(firstIndexAtOrAfter(packed, 0)).toBe(0);
    expect(firstIndexAtOrAfter(packed, 1)).toBe(1);
    expect(firstIndexAtOrAfter(packed, 1_000)).toBe(1);
    expect(firstIndexAtOrAfter(packed, 2_500)).toBe(3);
    expect(firstIndexAtOrAfter(packed, 3_000)).toBe(3);
    expect(firstIndexAtOrAfter(packed, 5_000)).toBe(4);
  });
});
