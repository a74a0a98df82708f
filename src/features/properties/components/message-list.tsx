import { useMemo, useState } from 'react';
import { laneMessagesOf } from '../../../components/timeline/lane-messages.ts';
import { MessagePanel } from '../../../components/timeline/message-detail.tsx';
import { MessageList } from '../../../components/timeline/message-list.tsx';
import type { MessageRecord } from '../../../../shared/trace/records.ts';

/**
 * The counterexample's messages as the trace page and the Bench list them (the timeline's list):
 * time, direction, MessageID, type, a one-line decode and the GoodCRC state; a row opens its bit fields.
 */
export function CounterexampleMessages({ records }: { records: readonly MessageRecord[] }) {
  const { lanes, messages } = useMemo(() => laneMessagesOf(records), [records]);
  const [selected, setSelected] = useState<number | null>(null);
  if (lanes.length === 0) return <p className="text-sm text-slate-500">No message was sent.</p>;
  const message = selected === null ? undefined : messages[selected];
  return (
    <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <MessageList messages={lanes} foldGoodCrc={false} selectedIndex={selected ?? undefined} onSelect={setSelected} heightPx={320} />
      {message ? (
        <MessagePanel selected={message} onClose={() => setSelected(null)} />
      ) : (
        <p className="text-xs text-slate-500 dark:text-slate-400">Select a message to see its header and data objects bit by bit.</p>
      )}
    </div>
  );
}
