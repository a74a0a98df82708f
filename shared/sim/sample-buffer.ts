/**
 * VBUS/IBUS samples `[t, mv, ma, sinkMv]` every `everyUs`, stored as steps: a run of samples
 * with the same values is one row `[t of its first sample, mv, ma, sinkMv, samples]` in one growable
 * Int32Array. VBUS is held between events, so a 60 s run at 1 ms (60,001 samples) is a few
 * hundred steps instead of a 938 KB buffer whose fresh pages cost more than the run itself; a
 * ramp is one step a sample. The Bench's worker transfers the buffer as it is.
 */

/** Integers of one sample as the CLI prints it: t µs, mV at the source, mA, mV at the sink. */
export const SAMPLE_FIELDS = 4;
/** Integers of one step: a sample's four, then how many samples `everyUs` apart hold them. */
export const STEP_FIELDS = 5;

/** Samples as `simulate` returns them: `steps` rows of `STEP_FIELDS` in `data`, standing for `count` samples. */
export interface PackedSamples {
  data: Int32Array;
  steps: number;
  /** Samples the steps stand for (every `everyUs` from the first). */
  count: number;
  everyUs: number;
}

/** A growable step buffer (a class: one shape, so the hot loops stay monomorphic). */
export class SampleBuffer {
  private data = new Int32Array(64 * STEP_FIELDS);
  private length = 0;
  private count = 0;

  constructor(readonly everyUs: number) {}

  push(tUs: number, mv: number, ma: number, sinkMv: number): void {
    this.repeat(tUs, 1, mv, ma, sinkMv);
  }

  /** `count` samples from `tUs`, `everyUs` apart, with the same values (VBUS flat between events). */
  repeat(tUs: number, count: number, mv: number, ma: number, sinkMv: number): void {
    if (count <= 0) return;
    this.count += count;
    let data = this.data;
    const last = this.length - STEP_FIELDS;
    // The same values right after the last step's samples: that step holds longer.
    if (last >= 0 && data[last + 1] === mv && data[last + 2] === ma && data[last + 3] === sinkMv && data[last]! + data[last + 4]! * this.everyUs === tUs) {
      data[last + 4] = data[last + 4]! + count;
      return;
    }
    if (this.length + STEP_FIELDS > data.length) {
      const grown = new Int32Array(data.length * 2);
      grown.set(data);
      this.data = data = grown;
    }
    const o = this.length;
    data[o] = tUs;
    data[o + 1] = mv;
    data[o + 2] = ma;
    data[o + 3] = sinkMv;
    data[o + 4] = count;
    this.length = o + STEP_FIELDS;
  }

  /** The steps so far, in a buffer of their own (small; the worker transfers it). */
  finish(): PackedSamples {
    return { data: this.data.slice(0, this.length), steps: this.length / STEP_FIELDS, count: this.count, everyUs: this.everyUs };
  }
}

export function createSampleBuffer(everyUs: number): SampleBuffer {
  return new SampleBuffer(everyUs);
}

/** Every sample, four integers a sample (`SAMPLE_FIELDS`), as `[t, mv, ma, sinkMv, t, …]`. */
export function expandSamples(samples: PackedSamples): Int32Array {
  const out = new Int32Array(samples.count * SAMPLE_FIELDS);
  const { data, steps, everyUs } = samples;
  let o = 0;
  for (let s = 0; s < steps; s++) {
    const i = s * STEP_FIELDS;
    const mv = data[i + 1]!;
    const ma = data[i + 2]!;
    const sinkMv = data[i + 3]!;
    for (let n = 0, t = data[i]!; n < data[i + 4]!; n++, t += everyUs, o += SAMPLE_FIELDS) {
      out[o] = t;
      out[o + 1] = mv;
      out[o + 2] = ma;
      out[o + 3] = sinkMv;
    }
  }
  return out;
}

/** The samples as arrays (the CLI's JSON `samples: [[t, mv, ma, sinkMv], …]`, one a sample). */
export function sampleRows(samples: PackedSamples): [number, number, number, number][] {
  const flat = expandSamples(samples);
  const rows: [number, number, number, number][] = [];
  for (let o = 0; o < flat.length; o += SAMPLE_FIELDS) rows.push([flat[o]!, flat[o + 1]!, flat[o + 2]!, flat[o + 3]!]);
  return rows;
}

/**
 * Samples by index and by time without expanding the steps (the Bench's chart reads a window of a
 * ten-minute run this way): O(log steps) a look-up.
 */
export class SampleReader {
  /** Index of each step's first sample, then `count`. */
  private readonly firsts: Float64Array;

  constructor(readonly samples: PackedSamples) {
    const { data, steps } = samples;
    this.firsts = new Float64Array(steps + 1);
    for (let s = 0; s < steps; s++) this.firsts[s + 1] = this.firsts[s]! + data[s * STEP_FIELDS + 4]!;
  }

  get count(): number {
    return this.samples.count;
  }

  /** The step holding sample `index` (0 ≤ index < count). */
  stepOf(index: number): number {
    let low = 0;
    let high = this.samples.steps - 1;
    while (low < high) {
      const middle = (low + high + 1) >>> 1;
      if (this.firsts[middle]! <= index) low = middle;
      else high = middle - 1;
    }
    return low;
  }

  /** Sample `index`'s time, µs. */
  timeOf(index: number): number {
    const s = this.stepOf(index);
    return this.samples.data[s * STEP_FIELDS]! + (index - this.firsts[s]!) * this.samples.everyUs;
  }

  /** Sample `index`'s field: 1 mV at the source, 2 mA, 3 mV at the sink. */
  valueOf(index: number, field: 1 | 2 | 3): number {
    return this.samples.data[this.stepOf(index) * STEP_FIELDS + field]!;
  }

  /** Index of the first sample at or after `tUs` (`count` when none is). */
  indexAtOrAfter(tUs: number): number {
    const { data, steps, everyUs } = this.samples;
    let low = 0;
    let high = steps;
    // The first step whose last sample is at or after tUs.
    while (low < high) {
      const middle = (low + high) >>> 1;
      const o = middle * STEP_FIELDS;
      if (data[o]! + (data[o + 4]! - 1) * everyUs < tUs) low = middle + 1;
      else high = middle;
    }
    if (low === steps) return this.samples.count;
    return this.firsts[low]! + Math.max(0, Math.ceil((tUs - data[low * STEP_FIELDS]!) / everyUs));
  }
}
