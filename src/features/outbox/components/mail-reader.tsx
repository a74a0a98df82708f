// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useState } from 'react';
import { Link } from 'react-router';
import { Card } from '../../../components/card.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import { cn } from '../../../lib/cn.ts';
import { useOutboxMail, type OutboxMail } from '../api/get-outbox-mail.ts';
import { mailSrcDoc, splitUrls } from './mail-html.ts';

type View = 'formatted' | 'text';

/** Plain text with links kept only for addresses on this Parley (invitation and reset links). */
function MailText({ text }: { text: string }) {
  return (
    <pre className="overflow-x-auto p-5 font-mono text-xs leading-relaxed whitespace-pre-wrap text-slate-800 dark:text-slate-200">
      {splitUrls(text).map((part, index) => {
        if (part.kind === 'text') return part.value;
        let url: URL | null = null;
        try {
          url = new URL(part.value);
        } catch {
          url = null;
        }
        if (url && url.origin === window.location.origin) {
          return (
            <Link key={index} to={url.pathname + url.search} className="text-amber-700 underline dark:text-amber-400">
              {part.value}
            </Link>
          );
        }
        return part.value;
      })}
    </pre>
  );
}

function MailBody({ mail }: { mail: OutboxMail }) {
  const [view, setView] = useState<View>(mail.html ? 'formatted' : 'text');
  const tabs: { id: View; label: string; available: boolean }[] = [
    { id: 'formatted', label: 'Formatted', available: Boolean(mail.html) },
    { id: 'text', label: 'Plain text', available: true },
  ];
  return (
    <>
      <div role="tablist" aria-label="Mail view" className="flex gap-1 border-b border-slate-200 px-4 dark:border-slate-800">
        {tabs
          .filter((tab) => tab.available)
          .map((tab) => (
            <button
              key={tab.id}
              type="button"
              role="tab"
              aria-selected={view === tab.id}
              onClick={() => setView(tab.id)}
              className={cn(
                '-mb-px border-b-2 px-3 py-2 text-xs font-medium',
                view === tab.id ? 'border-amber-500 text-slate-900 dark:text-slate-100' : 'border-transparent text-slate-500 hover:text-slate-800 dark:hover:text-slate-200',
              )}
            >
              {tab.label}
            </button>
          ))}
      </div>
      <div role="tabpanel">
        {view === 'formatted' && mail.html ? (
          // No allow-scripts and no allow-same-origin: the mail cannot run code or reach the app.
          <iframe title={`Mail: ${mail.subject}`} sandbox="allow-popups allow-popups-to-escape-sandbox" srcDoc={mailSrcDoc(mail.html)} className="h-[26rem] w-full bg-white" />
        ) : (
          <MailText text={mail.text} />
        )}
      </div>
    </>
  );
}

export function MailReader({ mailId }: { mailId: string | null }) {
  const mail = useOutboxMail(mailId);
  if (mailId === null) {
    return <EmptyState title="Choose a mail" description="Pick a message on the left to read it." className="h-full min-h-64" />;
  }
  if (mail.isError) return <ErrorMessage title="The mail could not be opened" error={mail.error} />;
  if (!mail.data) {
    return (
      <Card className="p-6">
        <p role="status" className="text-xs text-slate-500">
          Opening…
        </p>
      </Card>
    );
  }
  const { data } = mail;
  return (
    <Card aria-label="Mail">
      <header className="space-y-1 border-b border-slate-200 px-5 py-4 dark:border-slate-800">
        <h2 className="text-base font-semibold text-slate-900 dark:text-slate-50">{data.subject}</h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
          <dt className="text-slate-500">From</dt>
          <dd className="font-mono text-slate-700 dark:text-slate-300">{data.from}</dd>
          <dt className="text-slate-500">To</dt>
          <dd className="font-mono text-slate-700 dark:text-slate-300">{data.to}</dd>
          <dt className="text-slate-500">Sent</dt>
          <dd className="font-mono text-slate-700 tabular dark:text-slate-300">{formatDateTime(data.sentAt)}</dd>
        </dl>
      </header>
      <MailBody key={String(data.id)} mail={data} />
    </Card>
  );
}
