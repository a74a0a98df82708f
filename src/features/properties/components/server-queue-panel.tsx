import { Badge } from '../../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { plural } from '../../../lib/plural.ts';
import type { PropertyQueue, SandboxIsolation } from '../../../../shared/api/index.ts';
import { usePropertyQueue } from '../api/get-property-queue.ts';

function seconds(ms: number): string {
  return `${Math.round(ms / 100) / 10} s`;
}

/** Where the caller's waiting properties stand: counts of what is ahead, never whose. */
function YoursLine({ queue }: { queue: PropertyQueue }) {
  const { running, waiting } = queue.yours;
  if (running === 0 && waiting.length === 0) return <p>None of your properties is running or waiting on the server.</p>;
  const next = waiting[0];
  return (
    <div className="space-y-1">
      <p>
        Yours: {plural(running, 'property')} running, {waiting.length} waiting.
      </p>
      {next && (
        <p>
          Your next one is <strong>number {next.position}</strong> in the queue:{' '}
          {next.ahead === 0
            ? 'it starts when one of yours ends.'
            : `${plural(next.ahead, 'property', 'properties')} ahead (${next.aheadYours} of them yours, ${next.ahead - next.aheadYours} from other users).`}
        </p>
      )}
      {waiting.length > 1 && <p className="font-mono text-xs text-slate-500 dark:text-slate-400">positions {waiting.map((w) => w.position).join(', ')}</p>}
    </div>
  );
}

function isolationText(isolation: SandboxIsolation): string[] {
  return [
    isolation.files === 'minimal' ? 'sees only Node and the checker, no host files' : "host files behind Node's permission model",
    isolation.network === 'isolated' ? 'no network' : 'shares the network (the child refuses sockets itself)',
    isolation.pidNamespace ? 'sees no other process' : 'sees other processes',
    isolation.diesWithParent ? 'dies with the server' : 'may outlive a killed server until its CPU limit',
    isolation.user === 'nobody' ? 'runs as nobody' : "runs as the server's user",
  ];
}

/**
 * The server's property sandbox on the Properties page: its mode and limits, and the fair queue
 * of property vectors the server runs (library runs, CI). The page's own Run button checks in
 * the browser and never queues here.
 */
export function ServerQueuePanel() {
  const { data: queue, error, isPending } = usePropertyQueue();
  return (
    <Card aria-labelledby="server-queue-heading" data-testid="server-queue">
      <CardHeader
        title={<span id="server-queue-heading">Property vectors on the server</span>}
        description="Library and CI runs check each property in a sandboxed process on the server, one of yours at a time, taking turns with other users. Run property above checks in your browser instead."
        actions={
          queue && (
            <Badge tone={queue.mode === 'bubblewrap' ? 'success' : 'warning'} dot>
              {queue.mode === 'bubblewrap' ? 'Sandbox: bubblewrap' : 'Sandbox: fallback launcher'}
            </Badge>
          )
        }
      />
      <CardBody className="space-y-3 text-sm text-slate-700 dark:text-slate-300">
        {isPending && <p className="text-slate-500">Asking the server…</p>}
        {error && <ErrorMessage title="The server's property queue is not available" error={error} />}
        {queue && (
          <>
            <YoursLine queue={queue} />
            <p data-testid="queue-totals">
              On the server: {plural(queue.running, 'property', 'properties')} running and {queue.waiting} waiting, from {plural(queue.users, 'user')}.
            </p>
            <p className="text-xs text-slate-500 dark:text-slate-400">
              Each property may take {seconds(queue.limits.timeoutMs)} and {queue.limits.heapMb} MB of heap ({queue.limits.addressSpaceMb} MB of memory in all); {queue.limits.atOnce} run at once,{' '}
              {queue.limits.perUser} per user.
            </p>
            {queue.isolation && (
              <div className="rounded-md border border-slate-200 px-3 py-2 text-xs dark:border-slate-800" data-testid="sandbox-isolation">
                <p className="font-medium text-slate-700 dark:text-slate-200">
                  For admins: {queue.isolation.mode === 'bubblewrap' ? 'bubblewrap is active' : `the fallback launcher is active: ${queue.isolation.fallbackReason}`}
                </p>
                <p className="mt-1 text-slate-500 dark:text-slate-400">
                  The child {isolationText(queue.isolation).join('; ')}. OS limits set with {queue.limits.tool}: CPU {queue.limits.cpuSeconds} s.
                </p>
              </div>
            )}
          </>
        )}
      </CardBody>
    </Card>
  );
}
