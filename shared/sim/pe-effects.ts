/**
 * What a policy engine's effects do to the run: a send goes through collision avoidance to the
 * protocol layer, timers start and stop, a Hard Reset clears the port's layers, a supply command
 * moves the power path, a contract is recorded, the sink's mode sets its draw, and the swaps change
 * the port's roles.
 */
import type { PeEffect } from './pe-types.ts';
import type { RunParts } from './run-parts.ts';
import type { Side } from './types.ts';

export function performPeEffect(run: RunParts, port: Side, effect: PeEffect): void {
  const nowUs = run.clock.nowUs;
  const { ports, vbus } = run;
  switch (effect.kind) {
    case 'send':
      run.collision.sendGuarded(port, effect);
      break;
    case 'start-timer':
      run.startTimer(port, port, effect.name, effect.afterGoodCrc ? Math.max(nowUs, run.layers.goodCrcEndUs[port] ?? 0) : nowUs);
      break;
    case 'stop-timer':
      run.timers.stop(port, effect.name, nowUs);
      break;
    case 'hard-reset':
      run.layers.reset(port);
      run.loop.schedule(nowUs, { kind: 'hard-reset-tx', from: port });
      return;
    case 'protocol-reset':
      run.layers.protocolReset(port);
      break;
    case 'supply':
      if (vbus.supply(port, effect.voltageMv, effect.limitMa, effect.floorMv ?? 0)) ports.runPe(port, { kind: 'overload' });
      return;
    case 'contract':
      if (ports.role[port] === 'sink') {
        vbus.contract = effect.contract;
        if (effect.contract) run.record.contracts.push({ ...effect.contract, t: nowUs });
        if (effect.contract && run.untilContract) run.loop.done = true;
      } else if (effect.contract === null) vbus.limitMa = null;
      return;
    case 'sink-mode':
      vbus.sinkMode = effect.mode;
      if (effect.mode === 'operating') {
        if (vbus.retarget()) ports.runPe(ports.portWithRole('source'), { kind: 'overload' });
        vbus.measure();
      }
      return;
    case 'error-recovery':
      run.loop.schedule(nowUs, { kind: 'error-recovery' });
      break;
    case 'data-role-swap':
      // Each port changes its own data role once the Accept has gone over (§6.3.9).
      ports.dfp[port] = !ports.dfp[port];
      run.record.note(`${ports.role[port]} port is now the ${ports.dfp[port] ? 'DFP' : 'UFP'}`);
      break;
    case 'vconn-swap':
      run.record.note(`VCONN swapped (the ${ports.role[port]} port took part)`);
      break;
    case 'become':
      ports.become(port, effect.role);
      break;
    case 'note':
      run.record.note(effect.text);
      break;
  }
}
