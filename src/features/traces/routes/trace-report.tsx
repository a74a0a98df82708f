import { useParams } from 'react-router';
import './trace-report.css';
import { ParleyMark } from '../../../components/parley-mark.tsx';
import { errorText } from '../../../components/error-message.tsx';
import { paths } from '../../../config/paths.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { isRuleId, ruleCatalog } from '../../../../shared/rules/catalog.ts';
import { useComments } from '../api/get-comments.ts';
import { useTrace } from '../../../lib/api/get-trace.ts';
import { contractLabel, formatBytes, formatPower, formatSeconds } from '../lib/format.ts';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** A print-styled diagnosis (`/traces/:id/report`): summary, contracts, findings, comments. */
export function TraceReportRoute() {
  const { traceId = '' } = useParams();
  const trace = useTrace(traceId);
  const comments = useComments(traceId);
  if (trace.isError) return <p className="p-8 text-sm text-red-700">{errorText(trace.error)}</p>;
  if (!trace.data) return <p className="p-8 text-xs text-slate-500">Loading the report…</p>;
  const { trace: item, analysis } = trace.data;
  const link = `${window.location.origin}${paths.traces.detail.getHref(item.id)}`;

  return (
    <article className="trace-report mx-auto max-w-4xl bg-white px-8 py-8 text-slate-900" data-testid="trace-report">
      <header className="mb-6 flex items-start justify-between gap-4 border-b-2 border-slate-900 pb-4">
        <div>
          <p className="font-mono text-[11px] tracking-widest text-slate-500 uppercase">Parley · trace diagnosis</p>
          <h1 className="text-2xl font-semibold">{item.title}</h1>
          <p className="mt-1 text-sm text-slate-600">
            {[item.device?.name, item.customerRef && `customer ${item.customerRef}`, `${item.fileName} (${formatBytes(item.sizeBytes)}, ${item.format})`].filter(Boolean).join(' · ')}
          </p>
          <p className="text-sm text-slate-600">
            Uploaded by {item.uploader.name} on {formatDateTime(item.createdAt)} · {link}
          </p>
        </div>
        <div className="flex flex-col items-end gap-2">
          <ParleyMark className="size-9" />
          <button type="button" onClick={() => window.print()} className="no-print rounded-md bg-amber-500 px-3 py-1.5 text-sm font-medium text-slate-950 hover:bg-amber-400">
            Print
          </button>
        </div>
      </header>

      {!analysis ? (
        <p>The trace is not analysed yet{item.error ? `: ${item.error.message}` : '.'}</p>
      ) : (
        <>
          <section className="mb-6">
            <h2 className="mb-1 text-base font-semibold">Summary</h2>
            <p className="text-[15px]">{analysis.summary}</p>
            <p className="mt-1 text-sm text-slate-600">
              {[plural(analysis.messages, 'message'), plural(analysis.counts.error, 'error'), plural(analysis.counts.warning, 'warning'), plural(analysis.counts.info, 'note')].join(' · ')}
            </p>
            {item.notes && <p className="mt-2 text-sm whitespace-pre-wrap">Notes: {item.notes}</p>}
          </section>

          <section className="mb-6">
            <h2 className="mb-1 text-base font-semibold">Contracts</h2>
            {analysis.contracts.length === 0 ? (
              <p className="text-sm">No contract was reached.</p>
            ) : (
              <table>
                <thead>
                  <tr>
                    <th>From</th>
                    <th>Contract</th>
                    <th>Kind</th>
                    <th>Object</th>
                    <th>Power</th>
                  </tr>
                </thead>
                <tbody>
                  {analysis.contracts.map((c, index) => (
                    <tr key={index}>
                      <td className="font-mono">{formatSeconds(c.t)}</td>
                      <td>{contractLabel(c)}</td>
                      <td>{c.kind}</td>
                      <td>{c.objectPosition}</td>
                      <td>{formatPower(c.powerMw)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>

          <section className="mb-6">
            <h2 className="mb-1 text-base font-semibold">Findings</h2>
            {analysis.findings.length === 0 ? (
              <p className="text-sm">No findings: every check passed.</p>
            ) : (
              <table>
                <thead>
                  <tr>
                    <th>Severity</th>
                    <th>Time</th>
                    <th>Rule</th>
                    <th>What happened</th>
                  </tr>
                </thead>
                <tbody>
                  {analysis.findings.map((f, index) => (
                    <tr key={index}>
                      <td className="font-semibold">{f.severity}</td>
                      <td className="font-mono whitespace-nowrap">{f.t === undefined ? (f.line !== undefined ? `line ${f.line}` : '—') : formatSeconds(f.t)}</td>
                      <td>
                        <span className="font-mono">{f.rule}</span>
                        {isRuleId(f.rule) && <span className="block text-xs text-slate-600">{ruleCatalog[f.rule].title}</span>}
                      </td>
                      <td>
                        {f.message}
                        <span className="block text-xs text-slate-500">{f.ref}</span>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
            {analysis.findingsOmitted > 0 && <p className="mt-1 text-xs">{analysis.findingsOmitted} more findings were counted but not listed.</p>}
          </section>

          {(comments.data?.items.length ?? 0) > 0 && (
            <section className="mb-6">
              <h2 className="mb-1 text-base font-semibold">Comments</h2>
              <ul className="space-y-2 text-sm">
                {comments.data!.items.map((c) => (
                  <li key={c.id}>
                    <span className="font-medium">{c.author.name}</span> <span className="font-mono text-xs text-slate-500">{formatDateTime(c.createdAt)}</span>
                    <p className="whitespace-pre-wrap">{c.body}</p>
                  </li>
                ))}
              </ul>
            </section>
          )}
        </>
      )}
      <footer className="mt-8 border-t border-slate-300 pt-3 text-xs text-slate-500">
        Parley analyses captures and simulates; it does not drive hardware. Real adapters deliver up to 48 V and 5 A: defer to the USB PD specification, certified test labs and local codes.
      </footer>
    </article>
  );
}
