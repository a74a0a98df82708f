/**
 * A run's VBUS/IBUS samples: the power path (vbus-path.ts) writes one every `everyUs` into the step
 * buffer (sample-buffer.ts); the loop fills them up to each entry before the clock moves there.
 */
import { createSampleBuffer, type PackedSamples, type SampleBuffer } from './sample-buffer.ts';
import type { VbusPath } from './vbus-path.ts';

export class RunSamples {
  private readonly buffer: SampleBuffer;

  constructor(
    private readonly vbus: VbusPath,
    private readonly everyUs: number,
    private readonly durationUs: number,
  ) {
    this.buffer = createSampleBuffer(everyUs);
  }

  /** Every sample time before `tUs` (and not past the run's end). */
  until(tUs: number): void {
    this.vbus.sampleUntil(this.buffer, this.everyUs, tUs, this.durationUs);
  }

  /** The last rows up to `endUs` (inclusive) and the packed result. */
  finish(endUs: number): PackedSamples {
    this.until(endUs + 1);
    return this.buffer.finish();
  }
}
