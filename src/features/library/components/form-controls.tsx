/**
 * Form controls whose text may be unfinished while typed (a list, a JSON fragment): each keeps
 * its own draft and reports a value when the draft reads; when the vector changes elsewhere
 * (the JSON editor), the draft follows unless it already means the same.
 */
import { useState, type ReactNode } from 'react';
import { Input } from '../../../components/input.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { listFromText, numberOrUndefined, textFromList } from '../lib/vector-model.ts';

function useDraft(canonical: string, same: (draft: string, canonical: string) => boolean) {
  const [draft, setDraft] = useState(canonical);
  const [seen, setSeen] = useState(canonical);
  if (canonical !== seen) {
    setSeen(canonical);
    if (!same(draft, canonical)) setDraft(canonical);
  }
  return [draft, setDraft] as const;
}

type Common = { label: string; hint?: ReactNode; className?: string; disabled?: boolean };

export function TextInput({ value, onChange, ...shown }: Common & { value: unknown; onChange: (next: string | undefined) => void; mono?: boolean; placeholder?: string }) {
  return <Input {...shown} value={typeof value === 'string' ? value : ''} onChange={(event) => onChange(event.target.value === '' ? undefined : event.target.value)} />;
}

export function NumberInput({ value, onChange, ...shown }: Common & { value: unknown; onChange: (next: number | undefined) => void }) {
  return <Input {...shown} mono inputMode="numeric" value={typeof value === 'number' ? String(value) : ''} onChange={(event) => onChange(numberOrUndefined(event.target.value))} />;
}

export function ListInput({ value, onChange, hint, ...shown }: Common & { value: unknown; onChange: (next: string[] | undefined) => void; placeholder?: string }) {
  const canonical = textFromList(value);
  const [draft, setDraft] = useDraft(canonical, (d, c) => textFromList(listFromText(d)) === c);
  return (
    <Input
      {...shown}
      hint={hint ?? 'Separate with commas or spaces.'}
      mono
      value={draft}
      onChange={(event) => {
        setDraft(event.target.value);
        onChange(listFromText(event.target.value));
      }}
    />
  );
}

/** A JSON value (a partial message, a contract); the vector changes only while the text parses. */
export function JsonArea({ value, onChange, rows = 5, ...shown }: Common & { value: unknown; onChange: (next: unknown) => void; rows?: number }) {
  const canonical = value === undefined ? '' : JSON.stringify(value, null, 2);
  const [draft, setDraft] = useDraft(canonical, (d, c) => {
    try {
      return JSON.stringify(JSON.parse(d), null, 2) === c;
    } catch {
      return false;
    }
  });
  const [error, setError] = useState<string | undefined>();
  return (
    <Textarea
      {...shown}
      mono
      rows={rows}
      error={error}
      value={draft}
      spellCheck={false}
      onChange={(event) => {
        const text = event.target.value;
        setDraft(text);
        if (text.trim() === '') {
          setError(undefined);
          onChange(undefined);
          return;
        }
        try {
          onChange(JSON.parse(text) as unknown);
          setError(undefined);
        } catch {
          setError('Not JSON yet: the vector keeps the last value that read.');
        }
      }}
    />
  );
}
