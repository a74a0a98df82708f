// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { fieldCount, fieldValue, formatValue, headerLayout, objectLayout, type FieldLayout, type WordLayout } from '../../../shared/pd/index.ts';
import type { Message } from '../../../shared/pd/types.ts';
import { Badge } from '../badge.tsx';
import { Button } from '../button.tsx';
import { Hex, Mono } from '../mono.tsx';
import { formatTimeUs } from './time-window.ts';

export type SelectedMessage = { t: number; from?: string; hex: string; crcOk: boolean; message: Message };

function bitsOf(field: FieldLayout): string {
  return field.hi === field.lo ? `${field.hi}` : `${field.hi}…${field.lo}`;
}

function fieldValueText(raw: number, field: FieldLayout): string {
  const count = fieldCount(raw, field);
  if (field.type === 'reserved') return count === 0 ? '0' : `${count.toString(2)}b (reserved, set)`;
  if (field.type === 'const') return `${count.toString(2)}b`;
  const value = fieldValue(raw, field);
  return field.type === 'uint' && field.unit ? `${formatValue(field.name, value)} (${count})` : formatValue(field.name, value);
}

function WordTable({ caption, raw, layout }: { caption: string; raw: number; layout: WordLayout }) {
  const digits = layout.bits / 4;
  return (
    <table className="w-full text-left text-xs">
      <caption className="pb-1 text-left text-xs font-medium text-slate-700 dark:text-slate-200">
        {caption}: {layout.title} <Mono className="text-slate-500">0x{raw.toString(16).padStart(digits, '0')}</Mono>
        <span className="block text-[10px] font-normal text-slate-500 dark:text-slate-400">{layout.ref}</span>
      </caption>
      <thead className="text-[10px] text-slate-500 uppercase dark:text-slate-400">
        <tr>
          <th className="py-1 pr-2 font-medium">Bits</th>
          <th className="py-1 pr-2 font-medium">Field</th>
          <th className="py-1 font-medium">Value</th>
        </tr>
      </thead>
      <tbody>
        {layout.fields.map((field) => (
          <tr key={`${field.hi}-${field.lo}`} className="border-t border-slate-100 dark:border-slate-800">
            <td className="py-1 pr-2 font-mono text-slate-500">{bitsOf(field)}</td>
            <td className="py-1 pr-2 text-slate-700 dark:text-slate-300">{field.label}</td>
            <td className="py-1 font-mono text-slate-900 dark:text-slate-100">{fieldValueText(raw, field)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The side panel for one message: decoded JSON and, word by word, the bit fields. */
export function MessagePanel({ selected, onClose }: { selected: SelectedMessage; onClose(): void }) {
  const { message } = selected;
  const header = headerLayout(message);
  return (
    <aside aria-label="Message details" className="flex max-h-[48rem] flex-col gap-3 overflow-auto">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h3 className="text-sm font-semibold text-slate-900 dark:text-slate-50">{message.header.messageType}</h3>
          <p className="text-xs text-slate-500 dark:text-slate-400">
            {selected.from ?? 'unknown'} at <Mono>{formatTimeUs(selected.t)}</Mono> · MessageID {message.header.messageId}
            {!selected.crcOk && (
              <Badge tone="error" className="ml-2">
                bad CRC
              </Badge>
            )}
          </p>
        </div>
        <Button variant="ghost" size="sm" onClick={onClose} aria-label="Close message details">
          ✕
        </Button>
      </div>
      <Hex value={selected.hex} />
      <WordTable caption="Header" raw={parseInt(message.header.raw, 16)} layout={header} />
      {message.objects.map((object, index) => {
        const layout = objectLayout(object, message.header.messageType);
        return layout ? (
          <WordTable key={`${index}-${object.raw}`} caption={`Object ${index + 1}`} raw={parseInt(object.raw, 16) >>> 0} layout={layout} />
        ) : (
          <p key={`${index}-${object.raw}`} className="text-xs text-slate-500">
            Object {index + 1}: <Mono>{object.raw}</Mono> (no field layout)
          </p>
        );
      })}
      <details open>
        <summary className="cursor-pointer text-xs font-medium text-slate-700 dark:text-slate-300">Decoded JSON</summary>
        <pre className="mt-2 overflow-auto rounded-md bg-slate-50 p-2 font-mono text-[11px] text-slate-800 dark:bg-slate-950 dark:text-slate-200" data-testid="message-json">
          {JSON.stringify(message, null, 2)}
        </pre>
      </details>
    </aside>
  );
}
