import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage, errorText } from '../../../components/error-message.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import { roleLabels, isRole } from '../../../lib/roles.ts';
import { useAddComment } from '../api/add-comment.ts';
import { useComments } from '../api/get-comments.ts';

/** The discussion of one trace: support, QA and firmware note what they found and asked. */
export function CommentThread({ traceId, canWrite }: { traceId: number; canWrite: boolean }) {
  const comments = useComments(traceId);
  const add = useAddComment(traceId);
  const [text, setText] = useState('');

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (text.trim() === '') return;
    add.mutate(text, { onSuccess: () => setText('') });
  };

  return (
    <div className="space-y-4">
      {comments.isError && <ErrorMessage title="The comments could not be loaded" error={comments.error} />}
      <ol className="space-y-3" aria-label="Comments">
        {(comments.data?.items ?? []).map((c) => (
          <li key={c.id} className="rounded-md border border-slate-200 px-3 py-2 dark:border-slate-800">
            <p className="text-xs text-slate-500 dark:text-slate-400">
              <span className="font-medium text-slate-800 dark:text-slate-200">{c.author.name}</span> · {isRole(c.author.role) ? roleLabels[c.author.role] : c.author.role} ·{' '}
              <span className="font-mono">{formatDateTime(c.createdAt)}</span>
            </p>
            <p className="mt-1 text-sm whitespace-pre-wrap text-slate-800 dark:text-slate-200">{c.body}</p>
          </li>
        ))}
        {comments.data?.items.length === 0 && <li className="text-sm text-slate-500">No comments yet.</li>}
      </ol>
      {canWrite && (
        <form onSubmit={submit} className="space-y-2">
          <Textarea label="Add a comment" rows={3} value={text} onChange={(event) => setText(event.target.value)} maxLength={4000} error={add.isError ? errorText(add.error) : undefined} />
          <div className="flex justify-end">
            <Button type="submit" size="sm" loading={add.isPending} disabled={text.trim() === ''}>
              Post comment
            </Button>
          </div>
        </form>
      )}
    </div>
  );
}
