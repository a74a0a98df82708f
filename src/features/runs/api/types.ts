/** Shapes of the runs API; they live in src/lib because the Library starts runs too. */
export type { Mismatch, Run, RunResult } from '../../../lib/run-types.ts';
