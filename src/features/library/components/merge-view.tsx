/**
 * Shown after a 409: the user's version and the one saved meanwhile, side by side, with the
 * line diff between them; the user takes theirs, keeps theirs own, or edits a merge, and saves
 * on top of the latest revision.
 */
import { useMemo, useState } from 'react';
import { diffLines } from 'diff';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { CodeEditor } from '../../../components/code-editor.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import type { StaleDetails } from '../../../../shared/api/index.ts';
import { DiffLines } from './diff-lines.tsx';

export type MergeChoice = { text: string; baseRevision: number };

export function MergeView({
  mine,
  theirs,
  schema,
  onResolve,
  onCancel,
}: {
  mine: string;
  theirs: StaleDetails;
  schema: object;
  onResolve: (choice: MergeChoice & { save: boolean }) => void;
  onCancel: () => void;
}) {
  const changes = useMemo(() => diffLines(theirs.text, mine), [mine, theirs.text]);
  const [merged, setMerged] = useState<string | null>(null);
  const pre = 'max-h-80 overflow-auto rounded-md border border-slate-200 bg-slate-50 p-3 font-mono text-xs whitespace-pre text-slate-700 dark:border-slate-800 dark:bg-slate-950 dark:text-slate-300';
  return (
    <Card role="region" aria-label="Merge your change" className="border-orange-300 dark:border-orange-500/40">
      <CardHeader
        title="Someone saved this vector while you were editing"
        description={`${theirs.updatedBy} saved revision ${theirs.revision} at ${formatDateTime(theirs.updatedAt)}. Your change was not saved. Choose what to keep; it is saved on top of revision ${theirs.revision}.`}
        actions={
          <Button variant="ghost" size="sm" onClick={onCancel}>
            Close
          </Button>
        }
      />
      <CardBody className="flex flex-col gap-4">
        <div className="grid gap-4 lg:grid-cols-2">
          <section aria-label="Your version">
            <h3 className="mb-1.5 text-xs font-semibold text-slate-700 dark:text-slate-300">Yours (not saved)</h3>
            <pre className={pre}>{mine}</pre>
          </section>
          <section aria-label="Their version">
            <h3 className="mb-1.5 text-xs font-semibold text-slate-700 dark:text-slate-300">
              Theirs (revision {theirs.revision}, {theirs.updatedBy})
            </h3>
            <pre className={pre}>{theirs.text}</pre>
          </section>
        </div>
        <div>
          <h3 className="mb-1.5 text-xs font-semibold text-slate-700 dark:text-slate-300">From theirs to yours</h3>
          <DiffLines label="Difference between their version and yours" changes={changes} className="max-h-64" />
        </div>
        {merged !== null && (
          <div className="flex flex-col gap-1.5">
            <h3 className="text-xs font-semibold text-slate-700 dark:text-slate-300">Merged file</h3>
            <CodeEditor language="json" label="Merged vector JSON" path="vector-merge.json" jsonSchema={schema} height="18rem" value={merged} onChange={setMerged} />
          </div>
        )}
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => onResolve({ text: theirs.text, baseRevision: theirs.revision, save: false })}>
            Take theirs
          </Button>
          <Button onClick={() => onResolve({ text: mine, baseRevision: theirs.revision, save: true })}>Keep mine and save</Button>
          {merged === null ? (
            <Button variant="secondary" onClick={() => setMerged(mine)}>
              Edit a merge
            </Button>
          ) : (
            <Button onClick={() => onResolve({ text: merged, baseRevision: theirs.revision, save: true })}>Save the merge</Button>
          )}
        </div>
      </CardBody>
    </Card>
  );
}
