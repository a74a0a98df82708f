/**
 * VBUS/IBUS samples `[t, mv, ma, sinkMv]` packed four to a row in one growable Int32Array: no
 * object per sample (a 60 s run at 1 ms is 60,001 rows), and the Bench's worker transfers the
 * buffer as it is.
 */
export const SAMPLE_FIELDS = 4;

/** Samples as `simulate` returns them: rows `[t µs, mV at the source, mA, mV at the sink]` in `data[0 … count × 4)`. */
export interface PackedSamples {
  data: Int32Array;
  count: number;
}

/** A growable row buffer (a class: one shape, so the hot loops stay monomorphic). */
export class SampleBuffer {
  private data: Int32Array;
  private length = 0;

  constructor(expectedRows = 1_024) {
    this.data = new Int32Array(Math.max(16, expectedRows) * SAMPLE_FIELDS);
  }

  private room(fields: number): void {
    if (this.length + fields <= this.data.length) return;
    const grown = new Int32Array(Math.max(this.data.length * 2, this.length + fields));
    grown.set(this.data);
    this.data = grown;
  }

  push(tUs: number, mv: number, ma: number, sinkMv: number): void {
    this.room(SAMPLE_FIELDS);
    const o = this.length;
    const data = this.data;
    data[o] = tUs;
    data[o + 1] = mv;
    data[o + 2] = ma;
    data[o + 3] = sinkMv;
    this.length = o + SAMPLE_FIELDS;
  }

  /** `count` rows from `tUs` every `everyUs` with the same values (VBUS flat between events). */
  repeat(tUs: number, everyUs: number, count: number, mv: number, ma: number, sinkMv: number): void {
    this.room(count * SAMPLE_FIELDS);
    const data = this.data;
    let o = this.length;
    for (let i = 0, t = tUs; i < count; i++, t += everyUs, o += SAMPLE_FIELDS) {
      data[o] = t;
      data[o + 1] = mv;
      data[o + 2] = ma;
      data[o + 3] = sinkMv;
    }
    this.length = o;
  }

  /** The rows so far (a view, not a copy: the worker transfers the underlying buffer as it is). */
  finish(): PackedSamples {
    const data = this.length === this.data.length ? this.data : this.data.subarray(0, this.length);
    return { data, count: this.length / SAMPLE_FIELDS };
  }
}

export function createSampleBuffer(expectedRows = 1_024): SampleBuffer {
  return new SampleBuffer(expectedRows);
}

/** The rows as arrays (the CLI's JSON `samples: [[t, mv, ma, sinkMv], …]`). */
export function sampleRows(samples: PackedSamples): [number, number, number, number][] {
  const rows: [number, number, number, number][] = [];
  const { data, count } = samples;
  for (let i = 0; i < count; i++) {
    const o = i * SAMPLE_FIELDS;
    rows.push([data[o]!, data[o + 1]!, data[o + 2]!, data[o + 3]!]);
  }
  return rows;
}
