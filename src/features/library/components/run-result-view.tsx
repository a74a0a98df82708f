import { ExpectedActual, ResultSummary } from '../../../components/expected-actual.tsx';
import type { RunResultRow } from '../api/start-run.ts';

/** One vector's result: pass or fail, why, and for a failure the expected output beside the actual. */
export function RunResultView({ result }: { result: RunResultRow }) {
  return (
    <div className="flex flex-col gap-3" role="status" aria-label="Result of this vector">
      <ResultSummary ok={result.ok} durationMs={result.durationMs} message={result.message} />
      {!result.ok && <ExpectedActual expected={result.expected} actual={result.actual} blockClassName="max-h-72" />}
    </div>
  );
}
