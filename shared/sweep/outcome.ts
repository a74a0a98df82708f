/**
 * How a run ended, in five classes a developer reads at a glance: the reference contract again,
 * a contract at another power, a contract only after a Soft_Reset or a Hard Reset, or none.
 */
import type { Contract } from '../core/contract.ts';
import type { ResetCounts } from './invariants.ts';

export const OUTCOME_CLASSES = ['same-power', 'different-power', 'after-soft-reset', 'after-hard-reset', 'no-contract'] as const;
export type OutcomeClass = (typeof OUTCOME_CLASSES)[number];

export const OUTCOME_LABELS: Record<OutcomeClass, string> = {
  'same-power': 'Contract at the same power',
  'different-power': 'Contract at a different power',
  'after-soft-reset': 'Contract after a Soft_Reset',
  'after-hard-reset': 'Contract after a Hard Reset',
  'no-contract': 'No contract',
};

/** The class of a run from the sink's final contract, the fault-free run's and the resets seen. */
export function classifyOutcome(contract: Contract | null, reference: Contract | null, resets: Pick<ResetCounts, 'hardResets' | 'softResets'>): OutcomeClass {
  if (contract === null) return 'no-contract';
  if (resets.hardResets > 0) return 'after-hard-reset';
  if (resets.softResets > 0) return 'after-soft-reset';
  return reference !== null && reference.powerMw === contract.powerMw && reference.voltageMv === contract.voltageMv ? 'same-power' : 'different-power';
}
