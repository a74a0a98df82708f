import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { CodeEditor } from '../../../components/code-editor.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { formatDateTimeSeconds } from '../../../lib/format.ts';
import type { AuditEvent } from '../api/get-audit.ts';

/** One event in full; its details are JSON, shown read-only in the code editor. */
export function AuditDetails({ event }: { event: AuditEvent | null }) {
  if (!event) {
    return <EmptyState title="Choose an event" description="Pick a line to see everything recorded with it." />;
  }
  return (
    <Card aria-label="Audit event">
      <CardHeader
        title={<span className="font-mono">{event.action}</span>}
        description={<span className="font-mono tabular">#{String(event.id)} · {formatDateTimeSeconds(event.at)}</span>}
      />
      <CardBody className="space-y-3">
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-xs">
          <dt className="text-slate-500">By</dt>
          <dd className="text-slate-800 dark:text-slate-200">
            {event.actor ? `${event.actor.name} · ${event.actor.email}` : 'Parley (no signed-in user)'}
          </dd>
          <dt className="text-slate-500">Target</dt>
          <dd className="font-mono text-slate-800 dark:text-slate-200">{event.target ?? '—'}</dd>
        </dl>
        <CodeEditor
          label="Event details (JSON, read-only)"
          language="json"
          path={`audit/event-${String(event.id)}.json`}
          value={JSON.stringify(event.details ?? {}, null, 2)}
          readOnly
          height="12rem"
        />
      </CardBody>
    </Card>
  );
}
