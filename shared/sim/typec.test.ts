/**
 * Type-C attach (USB Type-C R2.3 §4.5.2.2) and the return after ErrorRecovery: both ports leave their
 * terminations for tErrorRecovery, then attach again after tCCDebounce (§4.11.2 timing table); the
 * source goes to Attached.SRC only with VBUS at vSafe0V (§4.5.2.2.8.2, from memory), and the sink to
 * Attached.SNK once VBUS is present again (§4.5.2.2.4.2).
 */
import { describe, expect, it } from 'vitest';
import { timersPd3 } from '../core/timers.ts';
import { expandSamples, parseScenario, simulate } from './index.ts';
import { VSAFE0V_MAX_MV } from './power.ts';
import { initialTypec, typecStep } from './typec.ts';

const T = timersPd3;

describe('typecStep', () => {
  it('a source with VBUS still above vSafe0V waits in AttachWait.SRC after tCCDebounce', () => {
    let [state] = typecStep(initialTypec('source', true), { kind: 'cc' });
    expect(state.state).toBe('AttachWait.SRC');
    let effects: ReturnType<typeof typecStep>[1];
    [state, effects] = typecStep(state, { kind: 'debounced' });
    expect(state.state).toBe('AttachWait.SRC');
    expect(effects).toEqual([]);
    [state, effects] = typecStep(state, { kind: 'vbus', present: false });
    expect(state.state).toBe('Attached.SRC');
    expect(effects.map((e) => e.kind)).toEqual(['vbus-on', 'attached']);
  });

  it('a first attach (VBUS at 0 V) goes to Attached.SRC after tCCDebounce', () => {
    const [waiting] = typecStep(initialTypec('source'), { kind: 'cc' });
    expect(typecStep(waiting, { kind: 'debounced' })[0].state).toBe('Attached.SRC');
  });
});

describe('the return after ErrorRecovery', () => {
  // A 15 V source whose every PS_RDY comes 700 ms late: the sink's Hard Resets run out and it takes
  // ErrorRecovery, again and again over 20 s (vectors/negotiation/faults/late-ps-rdy-error-recovery.vector.json).
  const parsed = parseScenario({
    source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c'] } },
    sink: { policy: { kind: 'max-power' } },
    faults: [{ kind: 'delay', from: 'source', messageType: 'PS_RDY', delayMs: 700 }],
    durationMs: 20_000,
  });
  if (!parsed.ok) throw new Error(parsed.error.message);

  it('both ports attach again within tErrorRecovery + tCCDebounce + the discharge to vSafe0V, on every seed', () => {
    // Bound: tErrorRecovery 25 ms + tCCDebounce max 200 ms + discharge from 20 V at the simulated
    // 100 mV/ms (192 ms, inside tSafe0V 650 ms) + the 5 V ramp: under 450 ms. The sink used to stay
    // in AttachWait.SNK for seconds when the source turned VBUS on before it had reached vSafe0V.
    let recoveries = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const result = simulate({ ...parsed.scenario, seed }, { decode: false, analyze: false });
      const detaches = result.events.filter((r) => 'event' in r && r.event === 'detach').map((r) => r.t);
      for (const t of detaches) {
        if (t + 450_000 > result.endUs) continue;
        recoveries++;
        const source = result.lanes.find((l) => l.side === 'source' && l.state === 'Attached.SRC' && l.t > t);
        const sink = result.lanes.find((l) => l.side === 'sink' && l.state === 'Attached.SNK' && l.t > t);
        expect(source, `seed ${seed}, detach at ${t} µs`).toBeDefined();
        expect(sink, `seed ${seed}, detach at ${t} µs`).toBeDefined();
        expect(source!.t - t).toBeGreaterThanOrEqual(T.tErrorRecovery.minUs + T.tCCDebounce.minUs);
        expect(sink!.t - t).toBeLessThan(450_000);
        // VBUS was at vSafe0V when the source attached again: no measurement above it between
        // the end of the discharge and Attached.SRC.
        const attach = result.events.find((r) => 'event' in r && r.event === 'attach' && r.t > t);
        expect(attach!.t - t).toBe(T.tErrorRecovery.minUs);
      }
    }
    expect(recoveries).toBeGreaterThan(12);
  });

  it('the source turns VBUS on again only from vSafe0V', () => {
    const result = simulate({ ...parsed.scenario, seed: 5 }, { samples: true, sampleEveryUs: 1_000, decode: false, analyze: false });
    const data = expandSamples(result.samples!);
    const count = result.samples!.count;
    const detach = result.events.find((r) => 'event' in r && r.event === 'detach')!.t;
    const attached = result.lanes.find((l) => l.side === 'source' && l.state === 'Attached.SRC' && l.t > detach)!.t;
    // The last sample before Attached.SRC shows VBUS at vSafe0V.
    let before = -1;
    for (let i = 0; i < count && data[i * 4]! < attached; i++) before = i;
    expect(data[before * 4 + 1]).toBeLessThanOrEqual(VSAFE0V_MAX_MV);
  });
});
