import { Link } from 'react-router';
import { Badge } from '../../../components/badge.tsx';
import { ButtonLink } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { paths } from '../../../config/paths.ts';
import { useVectorRevision } from '../api/get-vector-revision.ts';
import type { RunResult } from '../api/types.ts';
import { benchHref } from '../lib/bench-link.ts';

const pre = 'max-h-96 overflow-auto rounded-md border border-slate-200 bg-slate-50 p-3 font-mono text-xs whitespace-pre text-slate-700 dark:border-slate-800 dark:bg-slate-950 dark:text-slate-300';

/** One result in full: why it failed, expected against actual, and where to go next. */
export function FailureDetail({ result }: { result: RunResult | null }) {
  const isNegotiation = result?.kind === 'negotiation' && result.inLibrary;
  const stored = useVectorRevision(result?.vectorId ?? '', result?.revision ?? null, Boolean(result && isNegotiation));
  if (!result) {
    return (
      <Card>
        <CardBody>
          <p className="text-sm text-slate-500">Choose a result to see what was expected and what came out.</p>
        </CardBody>
      </Card>
    );
  }
  const scenario = (stored.data?.vector.input as { scenario?: unknown } | undefined)?.scenario;
  return (
    <Card role="region" aria-label="Result detail">
      <CardHeader
        title={<span className="font-mono">{result.vectorId}</span>}
        description={result.title ?? undefined}
        actions={
          <>
            {result.inLibrary && (
              <ButtonLink size="sm" to={paths.library.vector.getHref(result.vectorId)}>
                Open the vector
              </ButtonLink>
            )}
            {isNegotiation && scenario !== undefined && (
              <Link className="text-xs font-medium text-amber-700 underline dark:text-amber-400" to={benchHref(scenario)}>
                Replay on the Bench
              </Link>
            )}
          </>
        }
      />
      <CardBody className="flex flex-col gap-3">
        <p className="flex flex-wrap items-center gap-2">
          <Badge tone={result.ok ? 'success' : 'error'} dot>
            {result.ok ? 'Passed' : 'Failed'}
          </Badge>
          {result.newFailure && <Badge tone="warning">new since the previous run</Badge>}
          {result.revision !== null && <span className="font-mono text-xs text-slate-500">revision {result.revision}</span>}
          <span className="font-mono text-xs text-slate-500">{result.durationMs.toFixed(1)} ms</span>
        </p>
        {result.message && <p className="font-mono text-xs whitespace-pre-wrap text-red-700 dark:text-red-300">{result.message}</p>}
        {result.mismatches && result.mismatches.length > 1 && (
          <ul className="list-disc pl-5 font-mono text-xs text-slate-700 dark:text-slate-300">
            {result.mismatches.map((m, i) => (
              <li key={i}>{m.message}</li>
            ))}
          </ul>
        )}
        {!result.ok && (result.expected !== undefined || result.actual !== undefined) && (
          <div className="grid gap-3 lg:grid-cols-2">
            <section aria-label="Expected">
              <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Expected</h3>
              <pre className={pre}>{JSON.stringify(result.expected ?? null, null, 2)}</pre>
            </section>
            <section aria-label="Actual">
              <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Actual</h3>
              <pre className={pre}>{JSON.stringify(result.actual ?? null, null, 2)}</pre>
            </section>
          </div>
        )}
        {!result.ok && result.expected === undefined && result.actual === undefined && <p className="text-xs text-slate-500">CI reported this failure; the report carries the message only.</p>}
        {result.counterexampleVector !== undefined && (
          <section aria-label="Counterexample">
            <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Counterexample as a negotiation vector</h3>
            <pre className={pre}>{JSON.stringify(result.counterexampleVector, null, 2)}</pre>
          </section>
        )}
      </CardBody>
    </Card>
  );
}
