import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { formatDateTimeSeconds } from '../../../lib/format.ts';
import type { AuditEvent } from '../api/get-audit.ts';
import { actionLabel } from '../lib/action-labels.ts';

/** One event in full; its details are a few keys of JSON, shown formatted (no editor needed to read them). */
export function AuditDetails({ event }: { event: AuditEvent | null }) {
  if (!event) {
    return <EmptyState title="Choose an event" description="Pick a line to see everything recorded with it." />;
  }
  const hasDetails = event.details !== null && Object.keys(event.details).length > 0;
  return (
    <Card aria-label="Audit event">
      <CardHeader
        title={actionLabel(event.action)}
        description={
          <span className="font-mono tabular">
            {event.action} · #{String(event.id)} · {formatDateTimeSeconds(event.at)}
          </span>
        }
      />
      <CardBody className="space-y-3">
        <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-1 text-xs">
          <dt className="text-slate-500">By</dt>
          <dd className="break-words text-slate-800 dark:text-slate-200">{event.actor ? `${event.actor.name} · ${event.actor.email}` : 'Parley (no signed-in user)'}</dd>
          <dt className="text-slate-500">Target</dt>
          <dd className="font-mono break-words text-slate-800 dark:text-slate-200">{event.target ?? '—'}</dd>
        </dl>
        <div>
          <h3 className="mb-1 text-xs font-medium text-slate-500 dark:text-slate-400">Details</h3>
          {hasDetails ? (
            <pre
              data-testid="audit-event-details"
              className="max-h-80 overflow-auto rounded-md border border-slate-200 bg-slate-50 px-3 py-2 font-mono text-xs leading-relaxed whitespace-pre-wrap break-words text-slate-800 dark:border-slate-800 dark:bg-slate-950 dark:text-slate-200"
            >
              {JSON.stringify(event.details, null, 2)}
            </pre>
          ) : (
            <p className="text-xs text-slate-500 dark:text-slate-400">Nothing else was recorded with this event.</p>
          )}
        </div>
      </CardBody>
    </Card>
  );
}
