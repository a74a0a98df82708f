import { useParams } from 'react-router';
import './trace-report.css';
import { DocumentTitle } from '../../../components/page-header.tsx';
import { ParleyMark } from '../../../components/parley-mark.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { useSharedReport } from '../api/get-shared-report.ts';
import { ReportView } from '../components/report-view.tsx';
import { formatBytes } from '../lib/format.ts';

/** A report opened by its read-only link (`/shared/reports/:token`): no account, no app around it. */
export function SharedReportRoute() {
  const { token = '' } = useParams();
  const shared = useSharedReport(token);
  if (shared.isError) {
    const message = isApiError(shared.error) && shared.error.status === 404 ? shared.error.message : 'The report could not be loaded. Check the link, or ask the sender for a new one.';
    return (
      <main className="mx-auto flex max-w-xl flex-col items-start gap-3 p-10">
        <DocumentTitle title="Report link not valid" />
        <ParleyMark className="size-8" />
        <h1 className="text-lg font-semibold text-slate-900 dark:text-slate-50">This report is not available</h1>
        <p className="text-sm text-slate-700 dark:text-slate-300" role="alert">
          {message}
        </p>
      </main>
    );
  }
  if (!shared.data) return <p className="p-8 text-xs text-slate-500">Loading the report…</p>;
  const { report, timeline, aroundFindings, expiresAt } = shared.data;
  const t = report.trace;
  return (
    <>
      <DocumentTitle title={`Report — ${t.title}`} />
      <ReportView
        data={{
          title: t.title,
          about: [[t.device, t.customerRef && `customer ${t.customerRef}`, `${t.fileName} (${formatBytes(t.sizeBytes)}, ${t.format})`].filter(Boolean).join(' · ')],
          summary: report.summary,
          messages: report.messages,
          counts: report.counts,
          contracts: report.contracts,
          findings: report.findings,
          findingsOmitted: report.findingsOmitted,
          timeline,
          aroundFindings: aroundFindings.items,
          notes: t.notes,
          banner: `A read-only report shared with you; the link works until ${expiresAt.slice(0, 10)}.`,
        }}
      />
    </>
  );
}
