import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createSampleBuffer, expandSamples, SampleReader, sampleRows, STEP_FIELDS } from './sample-buffer.ts';

type Write = { tUs: number; count: number; mv: number; ma: number; sinkMv: number };

/** Every sample written one row each, as the buffer held them before steps: the reference. */
function rowsOf(writes: Write[], everyUs: number): number[][] {
  const rows: number[][] = [];
  for (const w of writes) for (let n = 0; n < w.count; n++) rows.push([w.tUs + n * everyUs, w.mv, w.ma, w.sinkMv]);
  return rows;
}

describe('sample buffer', () => {
  it('keeps a held stretch as one step and a ramp as one step a sample', () => {
    const buffer = createSampleBuffer(1_000);
    buffer.push(0, 5_000, 100, 4_990);
    buffer.push(1_000, 5_000, 100, 4_990);
    buffer.repeat(2_000, 3, 5_000, 100, 4_990);
    buffer.push(5_000, 5_010, 100, 5_000);
    buffer.push(6_000, 5_020, 100, 5_010);
    const samples = buffer.finish();
    expect(samples.count).toBe(7);
    expect(samples.steps).toBe(3);
    expect(Array.from(samples.data.subarray(0, STEP_FIELDS))).toEqual([0, 5_000, 100, 4_990, 5]);
    expect(sampleRows(samples).map(([t]) => t)).toEqual([0, 1_000, 2_000, 3_000, 4_000, 5_000, 6_000]);
    const reader = new SampleReader(samples);
    expect([reader.timeOf(3), reader.valueOf(3, 1), reader.timeOf(6), reader.valueOf(6, 3)]).toEqual([3_000, 5_000, 6_000, 5_010]);
    expect([reader.indexAtOrAfter(-5), reader.indexAtOrAfter(3_500), reader.indexAtOrAfter(6_000), reader.indexAtOrAfter(6_001)]).toEqual([0, 4, 6, 7]);
  });

  it('does not join equal values across a gap in time', () => {
    const buffer = createSampleBuffer(1_000);
    buffer.push(0, 5_000, 100, 4_990);
    buffer.push(2_000, 5_000, 100, 4_990);
    expect(buffer.finish().steps).toBe(2);
  });

  it('gives back exactly the samples written, whatever the writes (grown past its first size too)', () => {
    const value = fc.constantFrom(0, 5_000, 9_000, 20_000);
    const everyUs = 250;
    const writes = fc.array(fc.record({ count: fc.integer({ min: 0, max: 40 }), mv: value, ma: fc.constantFrom(0, 3_000), sinkMv: value }), { maxLength: 200 });
    fc.assert(
      fc.property(writes, (raw) => {
        let tUs = 0;
        const timed: Write[] = raw.map((w) => {
          const write = { ...w, tUs };
          tUs += w.count * everyUs;
          return write;
        });
        const buffer = createSampleBuffer(everyUs);
        for (const w of timed) buffer.repeat(w.tUs, w.count, w.mv, w.ma, w.sinkMv);
        const samples = buffer.finish();
        const expected = rowsOf(timed, everyUs);
        expect(samples.count).toBe(expected.length);
        expect(sampleRows(samples)).toEqual(expected);
        expect(Array.from(expandSamples(samples))).toEqual(expected.flat());
        // The reader gives each sample by index, and finds each time, as the rows do.
        const reader = new SampleReader(samples);
        expected.forEach(([t, mv, ma, sinkMv], index) => {
          expect([reader.timeOf(index), reader.valueOf(index, 1), reader.valueOf(index, 2), reader.valueOf(index, 3)]).toEqual([t, mv, ma, sinkMv]);
        });
        for (const atUs of [-1, 0, 1, 125, 250, 251, tUs - 1, tUs, tUs + 1]) {
          const index = expected.findIndex(([t]) => t! >= atUs);
          expect(reader.indexAtOrAfter(atUs)).toBe(index === -1 ? expected.length : index);
        }
      }),
    );
  });
});
