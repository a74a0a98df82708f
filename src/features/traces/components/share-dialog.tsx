import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { fieldErrorsOf } from '../../../lib/api-client.ts';
import { useShareTrace } from '../api/share-trace.ts';
import { useCreateShareLink, useRevokeShareLink, useShareLinks } from '../api/share-links.ts';

const LINK_DAYS = [1, 7, 30, 90] as const;

/** Read-only report links: make one for the days chosen, copy it, withdraw it. */
function ReportLinks({ traceId, open, days, onDaysChange }: { traceId: number; open: boolean; days: number; onDaysChange(days: number): void }) {
  const links = useShareLinks(traceId, open);
  const create = useCreateShareLink(traceId);
  const revoke = useRevokeShareLink(traceId);
  const active = (links.data?.items ?? []).filter((link) => link.state === 'active');
  return (
    <section aria-label="Report links" className="space-y-2 border-t border-slate-200 pt-4 dark:border-slate-800">
      <h3 className="text-sm font-semibold">Read-only report link</h3>
      <p className="text-xs text-slate-500 dark:text-slate-400">Anyone with the link reads the report (no account, no comments) until it expires or you withdraw it.</p>
      <div className="flex items-end gap-2">
        <label className="flex flex-col gap-1 text-xs text-slate-700 dark:text-slate-300">
          Valid for
          <select
            value={days}
            onChange={(event) => onDaysChange(Number(event.target.value))}
            className="h-8 rounded-md border border-slate-300 bg-white px-2 text-sm dark:border-slate-700 dark:bg-slate-950"
          >
            {LINK_DAYS.map((d) => (
              <option key={d} value={d}>
                {d === 1 ? '1 day' : `${d} days`}
              </option>
            ))}
          </select>
        </label>
        <Button size="sm" variant="secondary" loading={create.isPending} onClick={() => create.mutate(days)}>
          Make a link
        </Button>
      </div>
      {create.isError && <ErrorMessage title="The link was not made" error={create.error} />}
      {active.length > 0 && (
        <ul className="space-y-1.5" aria-label="Active report links">
          {active.map((link) => (
            <li key={link.id} className="flex items-center gap-2">
              <input
                readOnly
                value={link.url ?? ''}
                aria-label={`Report link until ${link.expiresAt.slice(0, 10)}`}
                onFocus={(event) => event.currentTarget.select()}
                className="h-7 min-w-0 flex-1 rounded border border-slate-300 bg-slate-50 px-2 font-mono text-[11px] dark:border-slate-700 dark:bg-slate-950"
              />
              <span className="shrink-0 text-[11px] text-slate-500">until {link.expiresAt.slice(0, 10)}</span>
              <Button size="sm" variant="ghost" onClick={() => revoke.mutate(link.id)} aria-label={`Withdraw the link until ${link.expiresAt.slice(0, 10)}`}>
                Withdraw
              </Button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

/** "Share diagnosis": an e-mail address and a note; the server mails the readable report. */
export function ShareDialog({ traceId, open, onClose }: { traceId: number; open: boolean; onClose(): void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const share = useShareTrace(traceId);
  const resetShare = share.reset;
  const [to, setTo] = useState('');
  const [message, setMessage] = useState('');
  const [withLink, setWithLink] = useState(true);
  const [days, setDays] = useState(30);

  useEffect(() => {
    const element = dialog.current;
    if (!element) return;
    if (open && !element.open) {
      resetShare();
      // showModal() focuses the first field (the address). No autoFocus: the dialog is mounted
      // closed with the page, and React would focus it then, forcing a layout of the whole page.
      element.showModal();
    } else if (!open && element.open) element.close();
  }, [open, resetShare]);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    share.mutate({ to: to.trim(), message: message.trim() || undefined, ...(withLink ? { linkDays: days } : {}) });
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
          <p className="mt-1 text-xs text-slate-500 dark:text-slate-400">
            Sends the summary, the contracts and every finding with its rule and a plain sentence, with a read-only link to the report for someone without an account.
          </p>
        </div>
        {share.isSuccess ? (
          <p role="status" className="rounded-md bg-emerald-50 px-3 py-2 text-sm text-emerald-900 dark:bg-emerald-500/10 dark:text-emerald-100">
            Sent to {share.data.to}.{share.data.link ? ' The mail carries a read-only report link.' : ''}
          </p>
        ) : (
          <>
            <Input label="E-mail address" type="email" required value={to} onChange={(event) => setTo(event.target.value)} error={fieldErrors.to} placeholder="firmware@kestrel.example" />
            <Textarea label="Note (optional)" rows={4} value={message} maxLength={2000} onChange={(event) => setMessage(event.target.value)} error={fieldErrors.message} />
            <label className="flex items-center gap-2 text-sm text-slate-700 dark:text-slate-300">
              <input type="checkbox" checked={withLink} onChange={(event) => setWithLink(event.target.checked)} className="accent-amber-500" />
              Include a read-only report link, valid {days === 1 ? '1 day' : `${days} days`}
            </label>
            {share.isError && !fieldErrors.to && !fieldErrors.message && <ErrorMessage title="The diagnosis was not sent" error={share.error} />}
          </>
        )}
        <ReportLinks traceId={traceId} open={open} days={days} onDaysChange={setDays} />
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
