/** What each entry of the run's queue (entries.ts) does when its time comes. */
import type { TimerName } from '../core/timers.ts';
import type { Entry, LayerKey } from './entries.ts';
import { withholdsPsRdy } from './faults.ts';
import * as power from './power.ts';
import type { RunParts } from './run-parts.ts';
import { otherSide } from './types.ts';

/** VBUS is measured into the trace once a second while it is above vSafe0V. */
export const MEASURE_EVERY_US = 1_000_000;
const CHUNK_TIMERS = new Set<TimerName>(['tChunkSenderRequest', 'tChunkSenderResponse']);

export function dispatchEntry(run: RunParts, entry: Entry): void {
  const nowUs = run.clock.nowUs;
  const { ports, layers, vbus, scenario } = run;
  switch (entry.kind) {
    case 'cc':
      run.record.records.push({ t: nowUs, event: 'attach', cc: 'CC1', rp: scenario.source.behaviour.rp });
      ports.runTypec('source', { kind: 'cc' });
      ports.runTypec('sink', { kind: 'cc' });
      return;
    case 'debounced':
      ports.runTypec(entry.side, { kind: 'debounced' });
      break;
    case 'timer':
      if (!run.timers.expire(entry.layer, entry.name, entry.gen)) return;
      if (entry.name === 'tReceive') layers.runProtocol(entry.layer as LayerKey, { kind: 'crc-timeout' });
      else if (CHUNK_TIMERS.has(entry.name)) layers.chunkTimer(entry.side, entry.name);
      else ports.runPe(entry.side, { kind: 'timer', name: entry.name });
      return;
    case 'tx':
      run.line.transmit(entry.frame);
      break;
    case 'hard-reset-tx':
      run.line.hardReset(entry.from, ports.role[entry.from]);
      break;
    case 'arrive':
      layers.arrive(entry.frame, entry.corrupt);
      break;
    case 'hard-reset-arrive':
      layers.reset(entry.to);
      if (ports.pe[entry.to].state !== 'idle') ports.runPe(entry.to, { kind: 'hard-reset-received' });
      return;
    case 'ramp-end': {
      if (entry.gen !== vbus.gen) return;
      if (vbus.ramp.toMv > 0 || vbus.ramp.fromMv > 0) vbus.measure();
      if (vbus.owner === 'typec') {
        const sourcePort = ports.portWithRole('source');
        if (ports.pe[sourcePort].state === 'idle' && vbus.setMv > 0) ports.runPe(sourcePort, { kind: 'start' });
      } else if (vbus.owner === 'pe') {
        const supplier = vbus.supplier;
        const psRdyDue = ports.pe[supplier].state === 'PE_SRC_Transition_Supply';
        ports.runPe(supplier, { kind: 'supply-ready', withholdPsRdy: psRdyDue && withholdsPsRdy(run.book, nowUs) });
      }
      return;
    }
    case 'vbus-cross': {
      if (entry.gen !== vbus.gen) return;
      vbus.sinkVbusPresent = entry.present;
      const sinkPort = ports.portWithRole('sink');
      ports.runTypec(sinkPort, { kind: 'vbus', present: entry.present });
      // The source waits in AttachWait.SRC for vSafe0V after ErrorRecovery (typec.ts).
      ports.runTypec(otherSide(sinkPort), { kind: 'vbus', present: entry.present });
      if (ports.pe[sinkPort].state !== 'idle' && ports.role[sinkPort] === 'sink') ports.runPe(sinkPort, { kind: 'vbus', present: entry.present });
      return;
    }
    case 'policy': {
      const change = scenario.sink.changes[entry.index];
      if (change) ports.runPe(ports.portWithRole('sink'), { kind: 'policy', policy: change.policy });
      return;
    }
    case 'action': {
      const action = scenario.actions[entry.index];
      if (action) ports.runPe(ports.portWithRole(action.by), { kind: 'action', action: action.action });
      return;
    }
    case 'load':
      vbus.loadMa = entry.currentMa;
      if (vbus.retarget()) ports.runPe(ports.portWithRole('source'), { kind: 'overload' });
      vbus.measure();
      return;
    case 'deferred-send':
      run.collision.deferredSend(entry.port, entry.effect, entry.gen);
      break;
    case 'cable-answer':
      layers.runProtocol('cable', { kind: 'send', type: 'Vendor_Defined', objects: entry.objects });
      break;
    case 'error-recovery':
      ports.errorRecovery();
      break;
    case 'measure':
      if (vbus.vbusMv() > power.VSAFE0V_MAX_MV) vbus.measure();
      if (nowUs + MEASURE_EVERY_US < run.durationUs) run.loop.schedule(nowUs + MEASURE_EVERY_US, { kind: 'measure' });
      return;
    case 'end':
      run.loop.done = true;
      return;
  }
}
