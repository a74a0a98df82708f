import { useParams } from 'react-router';
import './trace-report.css';
import { DocumentTitle } from '../../../components/page-header.tsx';
import { errorText } from '../../../components/error-message.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import { useTrace } from '../../../lib/api/get-trace.ts';
import { useMessagesAroundFindings } from '../api/get-messages-around-findings.ts';
import { ReportView } from '../components/report-view.tsx';
import { formatBytes } from '../lib/format.ts';

/** A print-styled diagnosis of a stored trace (`/traces/:id/report`), for the team. */
export function TraceReportRoute() {
  const { traceId = '' } = useParams();
  const trace = useTrace(traceId);
  const around = useMessagesAroundFindings(traceId);
  if (trace.isError) return <p className="p-8 text-sm text-red-700">{errorText(trace.error)}</p>;
  if (around.isError) return <p className="p-8 text-sm text-red-700">{errorText(around.error)}</p>;
  if (!trace.data || !around.data) return <p className="p-8 text-xs text-slate-500">Loading the report…</p>;
  const { trace: item, analysis } = trace.data;
  if (!analysis) return <p className="p-8 text-sm">The trace is not analysed yet{item.error ? `: ${item.error.message}` : '.'}</p>;
  return (
    <>
      <DocumentTitle title={`Report — ${item.title}`} />
      <ReportView
        data={{
          title: item.title,
          about: [
            [item.device?.name, item.customerRef && `customer ${item.customerRef}`, `${item.fileName} (${formatBytes(item.sizeBytes)}, ${item.format})`].filter(Boolean).join(' · '),
            `Uploaded by ${item.uploader.name} on ${formatDateTime(item.createdAt)}`,
          ],
          summary: analysis.summary,
          messages: analysis.messages,
          counts: analysis.counts,
          contracts: analysis.contracts,
          findings: analysis.findings,
          findingsOmitted: analysis.findingsOmitted,
          timeline: analysis.timeline,
          aroundFindings: around.data.items,
          notes: item.notes,
        }}
      />
    </>
  );
}
