import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { fieldErrorsOf } from '../../../lib/api-client.ts';
import { useShareTrace } from '../api/share-trace.ts';

/** "Share diagnosis": an e-mail address and a note; the server mails the readable report. */
export function ShareDialog({ traceId, open, onClose }: { traceId: number; open: boolean; onClose(): void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const share = useShareTrace(traceId);
  const [to, setTo] = useState('');
  const [message, setMessage] = useState('');

  useEffect(() => {
    const element = dialog.current;
    if (!element) return;
    if (open && !element.open) {
      share.reset();
      element.showModal();
    } else if (!open && element.open) element.close();
    // Only `open` drives the dialog; `share.reset` is stable.
  }, [open]);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    share.mutate({ to: to.trim(), message: message.trim() || undefined });
  };
  const fieldErrors = fieldErrorsOf(share.error);

  return (
    <dialog
      ref={dialog}
      onClose={onClose}
      aria-labelledby="share-title"
      className="m-auto w-full max-w-md rounded-lg border border-slate-200 bg-white p-0 text-slate-900 shadow-xl backdrop:bg-slate-950/50 dark:border-slate-700 dark:bg-slate-900 dark:text-slate-100"
    >
      <form onSubmit={submit} className="space-y-4 p-5">
        <div>
          <h2 id="share-title" className="text-base font-semibold">
            Share diagnosis
          </h2>
          <p className="mt-1 text-xs text-slate-500 dark:text-slate-400">Sends the summary, the contracts and every finding with its rule and a plain sentence, with a link to this trace.</p>
        </div>
        {share.isSuccess ? (
          <p role="status" className="rounded-md bg-emerald-50 px-3 py-2 text-sm text-emerald-900 dark:bg-emerald-500/10 dark:text-emerald-100">
            Sent to {share.data.to}.
          </p>
        ) : (
          <>
            <Input label="E-mail address" type="email" required value={to} onChange={(event) => setTo(event.target.value)} autoFocus error={fieldErrors.to} placeholder="firmware@kestrel.example" />
            <Textarea label="Note (optional)" rows={4} value={message} maxLength={2000} onChange={(event) => setMessage(event.target.value)} error={fieldErrors.message} />
            {share.isError && !fieldErrors.to && !fieldErrors.message && <ErrorMessage title="The diagnosis was not sent" error={share.error} />}
          </>
        )}
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={onClose}>
            {share.isSuccess ? 'Close' : 'Cancel'}
          </Button>
          {!share.isSuccess && (
            <Button type="submit" loading={share.isPending}>
              Send
            </Button>
          )}
        </div>
      </form>
    </dialog>
  );
}
