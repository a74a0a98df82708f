/**
 * Type-C attach of one side as a pure step (USB Type-C R2.3 §4.5.2.2 connection state machines):
 * Unattached → AttachWait (CC seen) → Attached after tCCDebounce. The source goes to Attached.SRC
 * only once VBUS is also at vSafe0V (§4.5.2.2.8.2, from memory: after ErrorRecovery it must first
 * have discharged what it drove before), then turns VBUS on; the sink becomes Attached.SNK once CC
 * is debounced and VBUS is present (§4.5.2.2.4.2).
 * `vbusPresent` is what the port sees: above vSafe5V's minimum on the way up, until vSafe0V on the way down.
 */
import type { Side } from './types.ts';

export type TypecEvent = { kind: 'cc' } | { kind: 'debounced' } | { kind: 'vbus'; present: boolean };
export type TypecEffect = { kind: 'start-debounce' } | { kind: 'vbus-on' } | { kind: 'attached' };

export interface TypecState {
  side: Side;
  state: string;
  debounced: boolean;
  vbusPresent: boolean;
}

export function initialTypec(side: Side, vbusPresent = false): TypecState {
  return { side, state: side === 'source' ? 'Unattached.SRC' : 'Unattached.SNK', debounced: false, vbusPresent };
}

export function typecStep(typec: TypecState, event: TypecEvent): [TypecState, TypecEffect[]] {
  const suffix = typec.side === 'source' ? 'SRC' : 'SNK';
  if (event.kind === 'cc' && !typec.state.startsWith('Attached')) {
    return [{ ...typec, state: `AttachWait.${suffix}` }, [{ kind: 'start-debounce' }]];
  }
  if (event.kind === 'vbus') typec = { ...typec, vbusPresent: event.present };
  if (event.kind === 'debounced') typec = { ...typec, debounced: true };
  if (typec.state !== `AttachWait.${suffix}` || !typec.debounced) return [typec, []];
  if (typec.side === 'source') {
    if (typec.vbusPresent) return [typec, []];
    return [{ ...typec, state: 'Attached.SRC' }, [{ kind: 'vbus-on' }, { kind: 'attached' }]];
  }
  if (!typec.vbusPresent) return [typec, []];
  return [{ ...typec, state: 'Attached.SNK' }, [{ kind: 'attached' }]];
}
