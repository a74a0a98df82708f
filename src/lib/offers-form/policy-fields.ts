/**
 * How the sink-policy forms (Offers page's contract, Bench) show vector.md's sink policies: a
 * short label for the drop-down, a sentence of help under it, the numeric fields of each kind and
 * typical values when the kind changes. The policy's schema is the engine's `sinkPolicySchema`.
 */
import type { SinkPolicy } from '../../../shared/rules/sink-policy.ts';
import type { NumberFieldSpec } from './offer-fields.ts';

export type PolicyKind = SinkPolicy['kind'];
export type PolicyNumberKey = 'voltageMv' | 'currentMa' | 'minVoltageMv' | 'maxVoltageMv' | 'powerMw';

/** Short enough for a narrow drop-down; the detail is in `policyKindHelp`. */
export const policyKindOptions: readonly { value: PolicyKind; label: string }[] = [
  { value: 'max-power', label: 'Most power' },
  { value: 'fixed', label: 'Fixed voltage' },
  { value: 'pps', label: 'Programmable (PPS)' },
  { value: 'avs', label: 'Adjustable (AVS)' },
  { value: 'range', label: 'Voltage range' },
];

// As shared/rules/choose-request.ts picks (its comment has the details and references).
export const policyKindHelp: Record<PolicyKind, string> = {
  'max-power': 'The fixed, variable or battery offer with the most power within the cable’s rating; on a tie, the lower voltage.',
  fixed: 'The fixed offer at this voltage, at this current; offered with less, its full current with Capability Mismatch.',
  pps: 'A PPS offer whose range holds this voltage, at this current (rounded down to 20 mV and 50 mA).',
  avs: 'An adjustable-voltage offer (SPR AVS or EPR AVS) whose range holds this voltage, at this current (rounded down to 100 mV and 50 mA).',
  range: 'The lowest-voltage fixed or variable offer inside the range that gives this power.',
};

// Steps follow the request fields: 50 mV / 10 mA for fixed, 20 mV / 50 mA for PPS, 250 mW for power.
export const policyFields: Record<PolicyKind, readonly NumberFieldSpec<PolicyNumberKey>[]> = {
  'max-power': [],
  fixed: [
    { name: 'voltageMv', label: 'Voltage (mV)', step: 50 },
    { name: 'currentMa', label: 'Current (mA)', step: 10 },
  ],
  pps: [
    { name: 'voltageMv', label: 'Voltage (mV)', step: 20 },
    { name: 'currentMa', label: 'Current (mA)', step: 50 },
  ],
  avs: [
    { name: 'voltageMv', label: 'Voltage (mV)', step: 100 },
    { name: 'currentMa', label: 'Current (mA)', step: 50 },
  ],
  range: [
    { name: 'minVoltageMv', label: 'Min voltage (mV)', step: 50 },
    { name: 'maxVoltageMv', label: 'Max voltage (mV)', step: 50 },
    { name: 'powerMw', label: 'Power (mW)', step: 250 },
  ],
};

/** Typical values of a policy kind, for the kind selector. */
export function defaultPolicy(kind: PolicyKind): SinkPolicy {
  switch (kind) {
    case 'max-power':
      return { kind };
    case 'fixed':
      return { kind, voltageMv: 9_000, currentMa: 3_000 };
    case 'pps':
      return { kind, voltageMv: 8_400, currentMa: 2_500 };
    case 'avs':
      return { kind, voltageMv: 36_000, currentMa: 5_000 };
    case 'range':
      return { kind, minVoltageMv: 9_000, maxVoltageMv: 20_000, powerMw: 45_000 };
  }
}
