/**
 * Samples as the sim worker returns them: the simulator's steps (shared/sim/sample-buffer.ts),
 * each sample µs, mV at the source's connector, mA, mV at the sink after the cable's drop.
 */
import { expandSamples, SAMPLE_FIELDS, SampleReader, type PackedSamples } from '../../../../shared/sim/sample-buffer.ts';

export type { PackedSamples, SampleReader };

export type SamplePoint = { tUs: number; vbusMv: number; ibusMa: number; sinkVbusMv: number };

const readers = new WeakMap<PackedSamples, SampleReader>();

/** One reader a run (its step index is built once, not on every zoom). */
export function readerOf(samples: PackedSamples): SampleReader {
  const known = readers.get(samples);
  if (known) return known;
  const reader = new SampleReader(samples);
  readers.set(samples, reader);
  return reader;
}

/** The `index`th sample (0 ≤ index < count). */
export function sampleAt(samples: PackedSamples, index: number): SamplePoint {
  const reader = readerOf(samples);
  return { tUs: reader.timeOf(index), vbusMv: reader.valueOf(index, 1), ibusMa: reader.valueOf(index, 2), sinkVbusMv: reader.valueOf(index, 3) };
}

/** The CSV export: a header line, then one sample a line, integers only. */
export function samplesCsv(samples: PackedSamples): string {
  const lines: string[] = ['t_us,vbus_mv,ibus_ma,sink_vbus_mv'];
  const data = expandSamples(samples);
  for (let offset = 0; offset < data.length; offset += SAMPLE_FIELDS) lines.push(`${data[offset]},${data[offset + 1]},${data[offset + 2]},${data[offset + 3]}`);
  return `${lines.join('\n')}\n`;
}

/** First index whose time is at or after `tUs` (`count` when none is). */
export function firstIndexAtOrAfter(samples: PackedSamples, tUs: number): number {
  return readerOf(samples).indexAtOrAfter(tUs);
}
