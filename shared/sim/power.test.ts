import { describe, expect, it } from 'vitest';
import { crossingUs, foldBack, rampEndUs, sinkDrawMa, sinkSideMv, SLEW_MAX_MV_PER_US, vbusAtUs, VSAFE5V_MIN_MV } from './power.ts';

describe('VBUS ramp', () => {
  const ramp = { startUs: 1_000, fromMv: 5_000, toMv: 20_000, mvPerUs: 1 };
  it('moves linearly at its slew rate and holds at the target', () => {
    expect(vbusAtUs(ramp, 0)).toBe(5_000);
    expect(vbusAtUs(ramp, 6_000)).toBe(10_000);
    expect(rampEndUs(ramp)).toBe(16_000);
    expect(vbusAtUs(ramp, 99_000)).toBe(20_000);
  });
  // USB PD R3.2 V1.1 §7.1.4.1: vSrcSlewPos at most 30 mV/µs.
  it('has the specification slew limit as a constant', () => {
    expect(SLEW_MAX_MV_PER_US).toBe(30);
  });
  it('finds threshold crossings in the ramp direction only', () => {
    expect(crossingUs({ startUs: 0, fromMv: 0, toMv: 5_000, mvPerUs: 1 }, VSAFE5V_MIN_MV)).toBe(4_750);
    expect(crossingUs({ startUs: 0, fromMv: 5_000, toMv: 0, mvPerUs: 0.1 }, 800)).toBe(42_000);
    expect(crossingUs(ramp, VSAFE5V_MIN_MV)).toBeNull();
  });
});

describe('loads and the cable', () => {
  it('draws nothing below the converter threshold and at most pSnkStdby in standby', () => {
    expect(sinkDrawMa('operating', 3_000, 2_000, 3_000)).toBe(0);
    // pSnkStdby 2.5 W at 20 V is 125 mA (USB PD R3.2 V1.1 §7.2.3, from memory).
    expect(sinkDrawMa('standby', 3_000, 20_000, 3_000)).toBe(125);
    expect(sinkDrawMa('default', 3_000, 5_000, 900)).toBe(100);
  });
  it('folds a programmable supply back to hold its current limit', () => {
    // A 9 V set point limited to 2 A into a load that would take 3 A: 6 V, 2 A (resistive load).
    expect(foldBack(9_000, 2_000, 3_000)).toEqual({ voltageMv: 6_000, currentMa: 2_000 });
    expect(foldBack(9_000, null, 3_000)).toEqual({ voltageMv: 9_000, currentMa: 3_000 });
  });
  it('drops mA × mΩ / 1000 across the cable', () => {
    // 3 A through 160 mΩ: 480 mV (Ohm's law).
    expect(sinkSideMv(20_000, 3_000, 160)).toBe(19_520);
  });
});
