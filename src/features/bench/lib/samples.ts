/**
 * Samples as the sim worker returns them: one interleaved Int32Array `[t, mv, ma, sinkMv, …]`
 * (µs, mV at the source's connector, mA, mV at the sink after the cable's drop).
 */
export const SAMPLE_FIELDS = 4;

export type PackedSamples = { data: Int32Array; count: number };

export type SamplePoint = { tUs: number; vbusMv: number; ibusMa: number; sinkVbusMv: number };

export function sampleAt(samples: PackedSamples, index: number): SamplePoint {
  const offset = index * SAMPLE_FIELDS;
  const { data } = samples;
  return { tUs: data[offset] ?? 0, vbusMv: data[offset + 1] ?? 0, ibusMa: data[offset + 2] ?? 0, sinkVbusMv: data[offset + 3] ?? 0 };
}

/** The CSV export: a header line, then one sample a line, integers only. */
export function samplesCsv(samples: PackedSamples): string {
  const lines: string[] = ['t_us,vbus_mv,ibus_ma,sink_vbus_mv'];
  const { data, count } = samples;
  for (let index = 0; index < count; index += 1) {
    const offset = index * SAMPLE_FIELDS;
    lines.push(`${data[offset]},${data[offset + 1]},${data[offset + 2]},${data[offset + 3]}`);
  }
  return `${lines.join('\n')}\n`;
}

/** First index whose time is at or after `tUs` (binary search; times never decrease). */
export function firstIndexAtOrAfter(samples: PackedSamples, tUs: number): number {
  let low = 0;
  let high = samples.count;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if ((samples.data[middle * SAMPLE_FIELDS] ?? 0) < tUs) low = middle + 1;
    else high = middle;
  }
  return low;
}
