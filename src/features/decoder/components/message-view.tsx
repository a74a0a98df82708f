// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useState } from 'react';
import type { Finding } from '../../../../shared/core/finding.ts';
import { describeFields, EXTENDED_HEADER_LAYOUT, headerLayout, objectLayout, summarizeObject, type Message } from '../../../../shared/pd/index.ts';
import { Badge } from '../../../components/badge.tsx';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { BitField } from './bit-field.tsx';

export type MessageViewProps = { message: Message; warnings: Finding[]; hex: string };

function useCopy(): [string | null, (what: string, text: string) => void] {
  const [copied, setCopied] = useState<string | null>(null);
  const copy = (what: string, text: string) => {
    navigator.clipboard?.writeText(text).then(
      () => setCopied(what),
      () => setCopied(null),
    );
    window.setTimeout(() => setCopied((current) => (current === what ? null : current)), 2_000);
  };
  return [copied, copy];
}

/** The decoded message: what it is, its objects as a readable table, and every word bit by bit. */
export function MessageView({ message, warnings, hex }: MessageViewProps) {
  const [copied, copy] = useCopy();
  const h = message.header;
  const who = h.cablePlug !== undefined ? (h.cablePlug ? 'from a cable plug' : 'to a cable plug') : `from the ${h.powerRole} (${h.dataRole?.toUpperCase()})`;
  const headerRaw = parseInt(h.raw, 16);
  return (
    <div className="space-y-6">
      <Card>
        <CardHeader
          title={
            <span className="font-mono text-base" data-testid="message-type">
              {h.messageType}
            </span>
          }
          description={`${h.category} message on ${message.sop}, ${who} · revision ${h.specRevision} · MessageID ${h.messageId}`}
          actions={
            <>
              <Button size="sm" variant="secondary" onClick={() => copy('json', JSON.stringify(message, null, 2))}>
                {copied === 'json' ? 'Copied' : 'Copy JSON'}
              </Button>
              <Button size="sm" variant="secondary" onClick={() => copy('hex', hex)}>
                {copied === 'hex' ? 'Copied' : 'Copy hex'}
              </Button>
            </>
          }
        />
        <CardBody className="space-y-3 text-sm">
          <div className="flex flex-wrap gap-2">
            <Badge tone="accent" mono>
              header {h.raw}
            </Badge>
            {message.extendedHeader && <Badge mono>extended header {message.extendedHeader.raw}</Badge>}
            {message.crc && (
              <Badge tone={message.crc.ok ? 'success' : 'error'} dot mono>
                CRC {message.crc.value} {message.crc.ok ? 'ok' : 'wrong'}
              </Badge>
            )}
            {warnings.length === 0 && (
              <Badge tone="success" dot>
                No findings
              </Badge>
            )}
          </div>
          {warnings.length > 0 && (
            <ul className="space-y-1" aria-label="Findings">
              {warnings.map((w, i) => (
                <li key={i} className="flex flex-wrap items-baseline gap-2">
                  <Badge tone={w.severity} dot>
                    {w.severity}
                  </Badge>
                  <span className="font-mono text-xs">{w.rule}</span>
                  <span>
                    {w.object ? `Object ${w.object}: ` : ''}
                    {w.message}
                  </span>
                  <span className="text-xs text-slate-500 dark:text-slate-400">{w.ref}</span>
                </li>
              ))}
            </ul>
          )}
        </CardBody>
      </Card>

      {message.objects.length > 0 && (
        <Card>
          <CardHeader title="Data objects" description="Each object with the values that matter; the bit-field view below shows every field." />
          <div className="overflow-x-auto">
            <table className="w-full text-sm" aria-label="Data objects">
              <thead className="bg-slate-50 text-left text-xs text-slate-500 dark:bg-slate-800/60 dark:text-slate-400">
                <tr>
                  <th className="px-4 py-2 font-medium">#</th>
                  <th className="px-4 py-2 font-medium">Kind</th>
                  <th className="px-4 py-2 font-medium">Fields</th>
                  <th className="px-4 py-2 font-medium">Raw</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-slate-100 dark:divide-slate-800">
                {message.objects.map((o, i) => (
                  <tr key={i}>
                    <td className="px-4 py-2 font-mono tabular">{i + 1}</td>
                    <td className="px-4 py-2 font-mono text-xs">{o.kind}</td>
                    <td className="px-4 py-2">{summarizeObject(o) || '—'}</td>
                    <td className="px-4 py-2 font-mono text-xs">{o.raw}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Card>
      )}

      {message.data && (
        <Card>
          <CardHeader title="Data block" description={`The extended message's data (${message.payload?.length ? message.payload.length / 2 : 0} bytes).`} />
          <CardBody>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-sm">
              {describeFields(message.data).map(([name, value]) => (
                <div key={name} className="contents">
                  <dt className="text-slate-500 dark:text-slate-400">{name}</dt>
                  <dd className="font-mono tabular">{value}</dd>
                </div>
              ))}
            </dl>
          </CardBody>
        </Card>
      )}

      <Card>
        <CardHeader title="Bit fields" description="Every 16- and 32-bit word along its bits, most significant first. Dashed boxes are reserved bits; red means a reserved bit is set." />
        <CardBody className="space-y-6">
          <BitField raw={headerRaw} layout={headerLayout(message)} caption="Header" />
          {message.extendedHeader && <BitField raw={parseInt(message.extendedHeader.raw, 16)} layout={EXTENDED_HEADER_LAYOUT} caption="Extended header" />}
          {message.objects.map((o, i) => {
            const layout = objectLayout(o, h.messageType);
            return layout ? (
              <BitField key={i} raw={parseInt(o.raw, 16) >>> 0} layout={layout} caption={`Object ${i + 1}`} />
            ) : (
              <p key={i} className="text-xs text-slate-500 dark:text-slate-400">
                Object {i + 1} <span className="font-mono">{o.raw}</span>: no field layout (vendor data, test data or a reserved type).
              </p>
            );
          })}
          {message.payload !== undefined && !message.data && message.objects.length === 0 && (
            <p className="text-xs text-slate-500 dark:text-slate-400">
              Data block <span className="font-mono break-all">{message.payload || '(empty)'}</span>
            </p>
          )}
        </CardBody>
      </Card>
    </div>
  );
}
