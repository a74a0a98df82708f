// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { Link } from 'react-router';
import { Badge } from '../../../components/badge.tsx';
import { ButtonLink } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ExpectedActual, JsonBlock, ResultSummary } from '../../../components/expected-actual.tsx';
import { paths } from '../../../config/paths.ts';
import { useVectorRevision } from '../api/get-vector-revision.ts';
import type { RunResult } from '../../../../shared/api/index.ts';
import { benchHref } from '../../../lib/share-url.ts';

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
  // A sweep's broken run carries its shrunk vector: the Bench replays that (and runs it at once).
  const shrunkScenario = result.kind === 'sweep' ? (result.counterexampleVector as { input?: { scenario?: unknown } } | undefined)?.input?.scenario : undefined;
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
            {shrunkScenario !== undefined && (
              <Link className="text-xs font-medium text-amber-700 underline dark:text-amber-400" to={benchHref(shrunkScenario, { run: true })}>
                Replay the shrunk run on the Bench
              </Link>
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
        <ResultSummary ok={result.ok} durationMs={result.durationMs} message={result.message}>
          {result.newFailure && <Badge tone="warning">new since the previous run</Badge>}
          {result.revision !== null && <span className="font-mono text-xs text-slate-500">revision {result.revision}</span>}
        </ResultSummary>
        {result.mismatches && result.mismatches.length > 1 && (
          <ul className="list-disc pl-5 font-mono text-xs text-slate-700 dark:text-slate-300">
            {result.mismatches.map((m, i) => (
              <li key={i}>{m.message}</li>
            ))}
          </ul>
        )}
        {!result.ok && (result.expected !== undefined || result.actual !== undefined) && <ExpectedActual expected={result.expected} actual={result.actual} />}
        {!result.ok && result.expected === undefined && result.actual === undefined && <p className="text-xs text-slate-500">CI reported this failure; the report carries the message only.</p>}
        {result.counterexampleVector !== undefined && (
          <section aria-label="Counterexample">
            <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Counterexample as a negotiation vector</h3>
            <JsonBlock value={result.counterexampleVector} />
          </section>
        )}
      </CardBody>
    </Card>
  );
}
