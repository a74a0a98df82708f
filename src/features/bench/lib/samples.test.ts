import { describe, expect, it } from 'vitest';
import { firstIndexAtOrAfter, sampleAt, samplesCsv } from './samples.ts';

const packed = { data: Int32Array.from([0, 5_000, 100, 4_990, 1_000, 5_010, 2_900, 4_720, 2_000, 20_000, 3_250, 19_675]), count: 3 };

describe('samples', () => {
  it('writes the CSV with the agreed header and one integer row a sample', () => {
    expect(samplesCsv(packed)).toBe('t_us,vbus_mv,ibus_ma,sink_vbus_mv\n0,5000,100,4990\n1000,5010,2900,4720\n2000,20000,3250,19675\n');
    expect(samplesCsv({ data: new Int32Array(0), count: 0 })).toBe('t_us,vbus_mv,ibus_ma,sink_vbus_mv\n');
  });

  it('reads one sample and finds times by binary search', () => {
    expect(sampleAt(packed, 1)).toEqual({ tUs: 1_000, vbusMv: 5_010, ibusMa: 2_900, sinkVbusMv: 4_720 });
    expect(firstIndexAtOrAfter(packed, 0)).toBe(0);
    expect(firstIndexAtOrAfter(packed, 1)).toBe(1);
    expect(firstIndexAtOrAfter(packed, 1_000)).toBe(1);
    expect(firstIndexAtOrAfter(packed, 5_000)).toBe(3);
  });
});
