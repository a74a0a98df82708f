/**
 * What VBUS must do after a Hard Reset, checked from the trace's VBUS readings (USB PD R3.2 V1.1
 * §7.1.5 Response to Hard Resets, §6.8.3, Time Values table; from memory):
 * the source starts taking VBUS down tPSHardReset after the reset, reaches vSafe0V within tSafe0V,
 * keeps it there for tSrcRecover, turns it back on to vSafe5V within tSrcTurnOn and sends
 * Source_Capabilities within tFirstSourceCap of that. A port gives up after nHardResetCount Hard
 * Resets the partner never answered (§6.7.3, §8.3.3.2 PE_SRC_Disabled).
 *
 * Readings are samples: each check only fires when the samples prove the limit was crossed
 * (e.g. "back on too soon" needs the last reading above vSafe0V and the first one after the gap to
 * be closer than tSrcRecover's minimum), so a sparse log never gives a false error.
 */
import { countersFor, timersFor } from '../core/timers.ts';
import { millis, seconds, volts } from './format.ts';
import type { TraceSide } from './records.ts';
import type { Report } from './seen.ts';

/** vSafe0V: at most 0.8 V; vSafe5V: at least 4.75 V (§7.1.x, Source Electrical Parameters; from memory). */
export const VSAFE0V_MAX_MV = 800;
export const VSAFE5V_MIN_MV = 4_750;

type Phase = 'idle' | 'falling' | 'off' | 'rising' | 'on';

export interface HardResetRecovery {
  onHardReset(t: number, from: TraceSide | undefined): void;
  onVbus(t: number, mv: number): void;
  /** Source_Capabilities from the source at `t`. */
  onSourceCaps(t: number): void;
  /** Any GoodCRC: the partner answers, so the Hard Reset count starts again. */
  onGoodCrc(): void;
  onAttach(t: number): void;
  /** Why a sink's Hard Reset at `t` came, when the source never offered (tSinkWaitCap). */
  hardResetCause(t: number, from: TraceSide | undefined): string | undefined;
}

export function createHardResetRecovery(report: Report): HardResetRecovery {
  const timers = timersFor('3.0');
  const { tPSHardReset, tSafe0V, tSrcRecover, tSrcTurnOn, tFirstSourceCap, tSinkWaitCap } = timers;
  let phase: Phase = 'idle';
  let resetUs = 0;
  let lastAboveUs: number | undefined;
  let lastAboveMv = 0;
  let onAtUs: number | undefined;
  let firstHighUs = 0;
  let reported = false;
  let unanswered = 0;
  let giveUpReported = false;
  /** When VBUS was last seen at vSafe5V with no offer since (attach or after a reset). */
  let waitingCapsSinceUs: number | undefined;
  let waitingWhat = '';

  const powered = (t: number): void => {
    phase = 'on';
    onAtUs = t;
    waitingCapsSinceUs = t;
    waitingWhat = `VBUS came back at ${seconds(t)}`;
  };
  const fail = (t: number, message: string, ref: string): void => {
    if (reported) return;
    reported = true;
    report('timing.hard-reset-recovery', message, { t, ref });
  };

  return {
    onHardReset(t, from) {
      unanswered++;
      const { nHardResetCount, ref } = countersFor('3.0');
      if (unanswered > nHardResetCount + 1 && !giveUpReported) {
        giveUpReported = true;
        report(
          'timing.hard-reset-recovery',
          `${from ? `The ${from} sent` : 'There came'} Hard Reset number ${unanswered} at ${seconds(t)} though the partner answered none of the ones before; a port gives up after nHardResetCount (${nHardResetCount}) unanswered retries.`,
          { t, ref },
        );
      }
      phase = 'falling';
      resetUs = t;
      lastAboveUs = undefined;
      onAtUs = undefined;
      reported = false;
      waitingCapsSinceUs = undefined;
    },
    onVbus(t, mv) {
      switch (phase) {
        case 'falling':
          if (mv > VSAFE0V_MAX_MV) {
            lastAboveUs = t;
            lastAboveMv = mv;
            const limitUs = resetUs + tPSHardReset.maxUs + tSafe0V.maxUs;
            if (t > limitUs)
              fail(
                t,
                `VBUS still read ${volts(mv)} at ${seconds(t)}, ${millis(t - resetUs)} after the Hard Reset at ${seconds(resetUs)}; it must reach vSafe0V within tPSHardReset + tSafe0V (${millis(tPSHardReset.maxUs + tSafe0V.maxUs)}).`,
                tSafe0V.ref,
              );
            return;
          }
          phase = 'off';
          return;
        case 'off':
          if (mv <= VSAFE0V_MAX_MV) {
            // By now it should have reached vSafe0V, stayed off for tSrcRecover and been turned on again.
            const latestOnUs = tPSHardReset.maxUs + tSafe0V.maxUs + tSrcRecover.maxUs + tSrcTurnOn.maxUs;
            if (t - resetUs > latestOnUs) {
              fail(
                t,
                `VBUS was still off at ${seconds(t)}, ${millis(t - resetUs)} after the Hard Reset at ${seconds(resetUs)}; the source must turn it back on after tSrcRecover (at most ${millis(tSrcRecover.maxUs)}) within tSrcTurnOn (${millis(tSrcTurnOn.maxUs)}).`,
                tSrcRecover.ref,
              );
            }
            return;
          }
          firstHighUs = t;
          // It reached vSafe0V after the last high reading and came back before this one.
          if (lastAboveUs !== undefined && t - lastAboveUs < tSrcRecover.minUs) {
            fail(
              t,
              `VBUS came back (${volts(mv)} at ${seconds(t)}) only ${millis(t - lastAboveUs)} after it still read ${volts(lastAboveMv)} at ${seconds(lastAboveUs)}; after a Hard Reset it must stay at vSafe0V for tSrcRecover (at least ${millis(tSrcRecover.minUs)}).`,
              tSrcRecover.ref,
            );
          }
          phase = 'rising';
          if (mv >= VSAFE5V_MIN_MV) powered(t);
          return;
        case 'rising':
          if (mv >= VSAFE5V_MIN_MV) powered(t);
          else if (t - firstHighUs > tSrcTurnOn.maxUs) {
            fail(
              t,
              `VBUS read ${volts(mv)} at ${seconds(t)}, ${millis(t - firstHighUs)} after it started to rise again; it must reach vSafe5V within tSrcTurnOn (${millis(tSrcTurnOn.maxUs)}).`,
              tSrcTurnOn.ref,
            );
          }
          return;
        default:
      }
    },
    onSourceCaps(t) {
      if (phase === 'on' && onAtUs !== undefined && t - onAtUs > tFirstSourceCap.maxUs) {
        fail(
          t,
          `The source's first Source_Capabilities after the Hard Reset at ${seconds(resetUs)} came at ${seconds(t)}, ${millis(t - onAtUs)} after VBUS read vSafe5V; tFirstSourceCap allows ${millis(tFirstSourceCap.maxUs)}.`,
          tFirstSourceCap.ref,
        );
      }
      if (phase !== 'idle') phase = 'idle';
      waitingCapsSinceUs = undefined;
    },
    onGoodCrc() {
      unanswered = 0;
    },
    onAttach(t) {
      unanswered = 0;
      phase = 'idle';
      waitingCapsSinceUs = t;
      waitingWhat = `the attach at ${seconds(t)}`;
    },
    hardResetCause(t, from) {
      if (from === 'source' || waitingCapsSinceUs === undefined) return undefined;
      if (t - waitingCapsSinceUs < tSinkWaitCap.minUs) return undefined;
      return `the source sent no Source_Capabilities within tSinkWaitCap (${millis(tSinkWaitCap.minUs)}–${millis(tSinkWaitCap.maxUs)}) after ${waitingWhat}`;
    },
  };
}
