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

export interface SampleBuffer {
  push(tUs: number, mv: number, ma: number, sinkMv: number): void;
  /** The rows so far, trimmed to their count (the buffer is not used afterwards). */
  finish(): PackedSamples;
}

export function createSampleBuffer(expectedRows = 1_024): SampleBuffer {
  let data = new Int32Array(Math.max(16, expectedRows) * SAMPLE_FIELDS);
  let length = 0;
  return {
    push(tUs, mv, ma, sinkMv) {
      if (length + SAMPLE_FIELDS > data.length) {
        const grown = new Int32Array(data.length * 2);
        grown.set(data);
        data = grown;
      }
      data[length] = tUs;
      data[length + 1] = mv;
      data[length + 2] = ma;
      data[length + 3] = sinkMv;
      length += SAMPLE_FIELDS;
    },
    finish() {
      return { data: length === data.length ? data : data.slice(0, length), count: length / SAMPLE_FIELDS };
    },
  };
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
