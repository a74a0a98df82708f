import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import { useDiff } from '../api/get-diff.ts';
import { useRevisions } from '../api/get-revisions.ts';
import { useRestoreVector } from '../api/restore-vector.ts';
import { DiffLines } from './diff-lines.tsx';

/** Every revision of a vector, a diff between any two, and Restore (a new revision). */
export function HistoryPanel({ vectorId, canWrite, onRestored }: { vectorId: string; canWrite: boolean; onRestored: () => void }) {
  const revisions = useRevisions(vectorId);
  const latest = revisions.data?.latest ?? null;
  const [picked, setPicked] = useState<{ from: number | null; to: number | null }>({ from: null, to: null });
  const to = picked.to ?? latest;
  const from = picked.from ?? (to !== null && to > 1 ? to - 1 : null);
  const diff = useDiff(vectorId, from, to);
  const restore = useRestoreVector();

  if (revisions.isError) return <ErrorMessage title="The history could not be loaded" error={revisions.error} />;
  const radio = 'size-3.5 accent-amber-500';
  return (
    <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <table aria-label="Revisions" className="w-full text-left text-sm">
        <thead className="text-[11px] tracking-wide text-slate-500 uppercase">
          <tr>
            <th className="py-1.5 pr-2 font-semibold" title="Diff from">
              From
            </th>
            <th className="py-1.5 pr-2 font-semibold" title="Diff to">
              To
            </th>
            <th className="py-1.5 pr-2 font-semibold">Revision</th>
            <th className="py-1.5 pr-2 font-semibold">By, when, why</th>
            <th />
          </tr>
        </thead>
        <tbody className="divide-y divide-slate-100 dark:divide-slate-800">
          {(revisions.data?.items ?? []).map((r) => (
            <tr key={r.revision} className="align-top">
              <td className="py-2 pr-2">
                <input
                  type="radio"
                  name="diff-from"
                  aria-label={`Diff from revision ${r.revision}`}
                  className={radio}
                  checked={from === r.revision}
                  onChange={() => setPicked({ from: r.revision, to })}
                />
              </td>
              <td className="py-2 pr-2">
                <input type="radio" name="diff-to" aria-label={`Diff to revision ${r.revision}`} className={radio} checked={to === r.revision} onChange={() => setPicked({ from, to: r.revision })} />
              </td>
              <td className="py-2 pr-2 font-mono text-xs">
                r{r.revision}
                {r.revision === latest && <span className="ml-1 text-amber-700 dark:text-amber-400">latest</span>}
              </td>
              <td className="py-2 pr-2">
                <p className="text-slate-800 dark:text-slate-200">{r.message}</p>
                <p className="text-xs text-slate-500">
                  {r.author.name} · {formatDateTime(r.createdAt)}
                </p>
              </td>
              <td className="py-2 text-right">
                {canWrite && r.revision !== latest && (
                  <Button
                    size="sm"
                    variant="secondary"
                    loading={restore.isPending && restore.variables?.revision === r.revision}
                    onClick={() => restore.mutate({ id: vectorId, revision: r.revision }, { onSuccess: onRestored })}
                  >
                    Restore r{r.revision}
                  </Button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex flex-col gap-2">
        <h3 className="text-xs font-semibold text-slate-700 dark:text-slate-300">{from !== null && to !== null ? `Changes from revision ${from} to ${to}` : 'Pick two revisions to compare'}</h3>
        {restore.isError && <ErrorMessage title="Not restored" error={restore.error} />}
        {diff.isError && <ErrorMessage title="The diff could not be loaded" error={diff.error} />}
        {from !== null && to !== null && from === to && <p className="text-xs text-slate-500">The same revision on both sides.</p>}
        {diff.data && from !== to && <DiffLines label={`Diff from revision ${from} to ${to}`} changes={diff.data.changes} className="max-h-[32rem]" />}
      </div>
    </div>
  );
}
