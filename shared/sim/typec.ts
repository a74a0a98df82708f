/**
 * Type-C attach of one side as a pure step (USB Type-C R2.3 §4.5.2.2 connection state machines):
 * Unattached → AttachWait (CC seen) → Attached after tCCDebounce. The source turns VBUS on when
 * Attached.SRC; the sink becomes Attached.SNK once CC is debounced and VBUS is present.
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

export function initialTypec(side: Side): TypecState {
  return { side, state: side === 'source' ? 'Unattached.SRC' : 'Unattached.SNK', debounced: false, vbusPresent: false };
}

export function typecStep(typec: TypecState, event: TypecEvent): [TypecState, TypecEffect[]] {
  const suffix = typec.side === 'source' ? 'SRC' : 'SNK';
  if (event.kind === 'cc' && !typec.state.startsWith('Attached')) {
    return [{ ...typec, state: `AttachWait.${suffix}` }, [{ kind: 'start-debounce' }]];
  }
  if (event.kind === 'vbus') typec = { ...typec, vbusPresent: event.present };
  if (event.kind === 'debounced') typec = { ...typec, debounced: true };
  if (typec.state !== `AttachWait.${suffix}` || !typec.debounced) return [typec, []];
  if (typec.side === 'source') return [{ ...typec, state: 'Attached.SRC' }, [{ kind: 'vbus-on' }, { kind: 'attached' }]];
  if (!typec.vbusPresent) return [typec, []];
  return [{ ...typec, state: 'Attached.SNK' }, [{ kind: 'attached' }]];
}
