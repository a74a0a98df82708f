/** Colours of the outcome classes in the matrix and the legend (one place). */
import type { OutcomeClass } from '../../../../shared/sweep/outcome.ts';

export const outcomeColour: Record<OutcomeClass, string> = {
  'same-power': 'bg-emerald-500',
  'different-power': 'bg-sky-500',
  'after-soft-reset': 'bg-amber-400',
  'after-hard-reset': 'bg-orange-600',
  'no-contract': 'bg-slate-500',
};

/** A broken run keeps its class colour and gets a red ring. */
export const brokenRing = 'ring-2 ring-red-600 ring-offset-1 dark:ring-red-400 dark:ring-offset-slate-900';
