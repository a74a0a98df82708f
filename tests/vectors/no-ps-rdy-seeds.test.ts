/**
 * The no-PS_RDY vector over seeds 0–499: the sink's PSTransitionTimer must run its whole range
 * from the point the analyser measures from. USB PD R3.2 V1.1 §8.3.3.3.6 PE_SNK_Transition_Sink
 * (from memory): the timer starts on entering the state, after the Accept has been received and
 * the protocol layer has sent its GoodCRC; §6.6.5 / Table 6.68 tPSTransition 450–550 ms (from
 * memory, as in shared/core/timers.ts). So the sink's Hard Reset lies 450–550 ms after the end of
 * its GoodCRC for the Accept, and the analyser reports timing.ps-transition every time.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../shared/sim/index.ts';
import { LIBRARY_DIR } from './support.ts';

// A GoodCRC: preamble 64 bits, SOP 4 K-codes (20 bits), header 20 bits, CRC-32 40 bits, EOP 5 bits
// (USB PD R3.2 V1.1 §5.6, §5.8.1 preamble; from memory) at 300 kbit/s (§6.6 fBitRate nominal).
const GOODCRC_US = Math.round(((64 + 20 + 20 + 40 + 5) * 1_000_000) / 300_000);
const T_PS_TRANSITION_MIN_US = 450_000;
const T_PS_TRANSITION_MAX_US = 550_000;

const vector = JSON.parse(readFileSync(join(LIBRARY_DIR, 'negotiation/faults/no-ps-rdy.vector.json'), 'utf8')) as { input: { scenario: Record<string, unknown> } };

type Event = { t: number; from?: string; event?: string; message?: { header: { messageType: string } } };

describe('no-ps-rdy over seeds 0–499', () => {
  it('the sink gives up 450–550 ms after its GoodCRC for the Accept, and timing.ps-transition fires', () => {
    const outside: string[] = [];
    const unreported: number[] = [];
    let fewestUs = Number.POSITIVE_INFINITY;
    let mostUs = 0;
    for (let seed = 0; seed < 500; seed++) {
      const parsed = parseScenario({ ...vector.input.scenario, seed });
      if (!parsed.ok) throw new Error(parsed.error.message);
      const result = simulate(parsed.scenario);
      const events = result.events as Event[];
      const accept = events.findIndex((e) => e.from === 'source' && e.message?.header.messageType === 'Accept');
      const ack = events.slice(accept + 1).find((e) => e.from === 'sink' && e.message?.header.messageType === 'GoodCRC');
      const reset = events.find((e) => e.event === 'hard_reset');
      expect(accept, `seed ${seed}: an Accept`).toBeGreaterThanOrEqual(0);
      expect(ack, `seed ${seed}: the sink's GoodCRC`).toBeDefined();
      expect(reset?.from, `seed ${seed}: the sink's Hard Reset`).toBe('sink');
      const elapsedUs = reset!.t - (ack!.t + GOODCRC_US);
      fewestUs = Math.min(fewestUs, elapsedUs);
      mostUs = Math.max(mostUs, elapsedUs);
      if (elapsedUs < T_PS_TRANSITION_MIN_US || elapsedUs > T_PS_TRANSITION_MAX_US) outside.push(`seed ${seed}: ${elapsedUs} µs`);
      if (!result.findings.some((f) => f.rule === 'timing.ps-transition')) unreported.push(seed);
    }
    expect(outside).toEqual([]);
    expect(unreported).toEqual([]);
    expect(fewestUs).toBeGreaterThanOrEqual(T_PS_TRANSITION_MIN_US);
    expect(mostUs).toBeLessThanOrEqual(T_PS_TRANSITION_MAX_US);
  });
});
