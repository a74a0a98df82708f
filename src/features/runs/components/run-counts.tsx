import { Badge } from '../../../components/badge.tsx';
import type { Run } from '../../../../shared/api/index.ts';

export function RunCounts({ run }: { run: Run }) {
  if (run.status === 'running')
    return (
      <Badge tone="accent">
        running {run.done}/{run.total}
      </Badge>
    );
  return (
    <span className="flex flex-wrap items-center gap-1.5">
      <Badge tone="success" dot>
        {run.passed} passed
      </Badge>
      {run.failed > 0 && (
        <Badge tone="error" dot>
          {run.failed} failed
        </Badge>
      )}
      {run.newFailures > 0 && <Badge tone="warning">{run.newFailures} new</Badge>}
      {run.status === 'failed' && <Badge tone="error">stopped</Badge>}
    </span>
  );
}
