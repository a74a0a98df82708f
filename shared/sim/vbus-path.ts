/**
 * The power path of one run: VBUS as a slew-limited ramp towards what the supply is set to (after
 * a programmable supply's current limit), the sink's draw, and the samples. Pure functions of the
 * physics live in power.ts; this keeps the state and schedules the ramp's end and VBUS crossings.
 */
import type { Contract } from '../core/contract.ts';
import type { TraceRecord } from '../trace/records.ts';
import type { SimClock } from './clock.ts';
import type { Scheduler } from './entries.ts';
import type { SinkMode } from './pe-types.ts';
import * as power from './power.ts';
import type { SampleBuffer } from './sample-buffer.ts';
import type { Side } from './types.ts';

export type RampOwner = 'typec' | 'pe' | 'load';

export class VbusPath {
  ramp: power.VbusRamp;
  gen = 0;
  owner: RampOwner = 'typec';
  /** The port whose supply command the ramp follows (its policy engine hears `supply-ready`). */
  supplier: Side = 'source';
  setMv = 0;
  limitMa: number | null = null;
  /** A programmable supply's lowest voltage in current limit (the offer's minimum), else 0. */
  floorMv = 0;
  sinkMode: SinkMode = 'off';
  sinkVbusPresent = false;
  loadMa: number | null;
  contract: Contract | null = null;
  private nextSampleUs = 0;

  constructor(
    private readonly clock: SimClock,
    private readonly schedule: Scheduler,
    private readonly records: TraceRecord[],
    private readonly slewMvPerUs: number,
    private readonly rpMa: number,
    private readonly cableMohm: number,
    loadMa: number | undefined,
  ) {
    this.ramp = { startUs: 0, fromMv: 0, toMv: 0, mvPerUs: slewMvPerUs };
    this.loadMa = loadMa ?? null;
  }

  vbusMv(tUs = this.clock.nowUs): number {
    return power.vbusAtUs(this.ramp, tUs);
  }
  operatingMa(): number {
    return this.loadMa ?? this.contract?.currentMa ?? power.SINK_DEFAULT_MA;
  }
  drawMa(mv: number): number {
    return power.sinkDrawMa(this.sinkMode, this.operatingMa(), mv, this.rpMa);
  }
  ibusAt(mv: number): number {
    const draw = this.drawMa(mv);
    return this.limitMa === null ? draw : Math.min(draw, this.limitMa);
  }
  measure(): void {
    const mv = this.vbusMv();
    this.records.push({ t: this.clock.nowUs, vbus: { mv, ma: this.ibusAt(mv) } });
  }

  startRamp(toMv: number, owner: RampOwner): void {
    const nowUs = this.clock.nowUs;
    const fromMv = this.vbusMv();
    this.ramp = { startUs: nowUs, fromMv, toMv, mvPerUs: toMv < fromMv && this.setMv === 0 ? power.DISCHARGE_MV_PER_US : this.slewMvPerUs };
    this.owner = owner;
    const gen = ++this.gen;
    this.schedule(power.rampEndUs(this.ramp), { kind: 'ramp-end', gen });
    const crossing = power.crossingUs(this.ramp, this.sinkVbusPresent ? power.VSAFE0V_MAX_MV : power.VSAFE5V_MIN_MV);
    if (crossing !== null) this.schedule(crossing, { kind: 'vbus-cross', present: !this.sinkVbusPresent, gen });
  }

  /**
   * The supply's output for its setting and the load (fold-back in current limit, not below the
   * floor). Returns true when the limit would pull VBUS below the floor: the source must protect itself.
   */
  target(): { voltageMv: number; overload: boolean } {
    const folded = power.foldBack(this.setMv, this.limitMa, power.sinkDrawMa(this.sinkMode, this.operatingMa(), this.setMv, this.rpMa)).voltageMv;
    if (this.limitMa !== null && folded < this.floorMv) return { voltageMv: this.floorMv, overload: true };
    return { voltageMv: folded, overload: false };
  }

  /** A new supply setting from a policy engine. */
  supply(supplier: Side, voltageMv: number, limitMa: number | null, floorMv: number): boolean {
    this.supplier = supplier;
    this.setMv = voltageMv;
    this.limitMa = limitMa;
    this.floorMv = limitMa === null ? 0 : floorMv;
    const { voltageMv: toMv, overload } = this.target();
    this.startRamp(toMv, 'pe');
    return overload;
  }

  /** The load moved: a new ramp when the current limit moves the output. Returns the overload flag. */
  retarget(): boolean {
    const { voltageMv, overload } = this.target();
    if (voltageMv === this.ramp.toMv) return overload;
    const stillPe = this.owner === 'pe' && this.clock.nowUs < power.rampEndUs(this.ramp);
    this.startRamp(voltageMv, stillPe ? 'pe' : 'load');
    return overload;
  }

  /** Samples `[t, mv, ma, sinkMv]` for every sample time before `tUs` (the power path is piecewise linear). */
  sampleUntil(buffer: SampleBuffer, everyUs: number, tUs: number, durationUs: number): void {
    const lastUs = Math.min(tUs - 1, durationUs);
    const rampEndUs = power.rampEndUs(this.ramp);
    while (this.nextSampleUs <= lastUs) {
      const t = this.nextSampleUs;
      if (t >= rampEndUs) {
        // Nothing changes before the next event once the ramp is over: one computation for the stretch.
        const mv = this.ramp.toMv;
        const ma = this.ibusAt(mv);
        const count = Math.floor((lastUs - t) / everyUs) + 1;
        buffer.repeat(t, count, mv, ma, power.sinkSideMv(mv, ma, this.cableMohm));
        this.nextSampleUs = t + count * everyUs;
        return;
      }
      const mv = power.vbusAtUs(this.ramp, t);
      const ma = this.ibusAt(mv);
      buffer.push(t, mv, ma, power.sinkSideMv(mv, ma, this.cableMohm));
      this.nextSampleUs = t + everyUs;
    }
  }
}
