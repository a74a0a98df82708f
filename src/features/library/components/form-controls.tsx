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

export function TextInput({
  label,
  hint,
  className,
  disabled,
  value,
  onChange,
  mono,
  placeholder,
}: Common & { value: unknown; onChange: (next: string | undefined) => void; mono?: boolean; placeholder?: string }) {
  return (
    <Input
      label={label}
      hint={hint}
      className={className}
      disabled={disabled}
      mono={mono}
      placeholder={placeholder}
      value={typeof value === 'string' ? value : ''}
      onChange={(event) => onChange(event.target.value === '' ? undefined : event.target.value)}
    />
  );
}

export function NumberInput({ label, hint, className, disabled, value, onChange }: Common & { value: unknown; onChange: (next: number | undefined) => void }) {
  return (
    <Input
      label={label}
      hint={hint}
      className={className}
      disabled={disabled}
      mono
      inputMode="numeric"
      value={typeof value === 'number' ? String(value) : ''}
      onChange={(event) => onChange(numberOrUndefined(event.target.value))}
    />
  );
}

export function ListInput({ label, hint, className, disabled, value, onChange, placeholder }: Common & { value: unknown; onChange: (next: string[] | undefined) => void; placeholder?: string }) {
  const canonical = textFromList(value);
  const [draft, setDraft] = useDraft(canonical, (d, c) => textFromList(listFromText(d)) === c);
  return (
    <Input
      label={label}
      hint={hint ?? 'Separate with commas or spaces.'}
      className={className}
      disabled={disabled}
      mono
      placeholder={placeholder}
      value={draft}
      onChange={(event) => {
        setDraft(event.target.value);
        onChange(listFromText(event.target.value));
      }}
    />
  );
}

/** A JSON value (a partial message, a contract); the vector changes only while the text parses. */
export function JsonArea({ label, hint, className, disabled, value, onChange, rows = 5 }: Common & { value: unknown; onChange: (next: unknown) => void; rows?: number }) {
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
      label={label}
      hint={hint}
      className={className}
      disabled={disabled}
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

export function Checkbox({ label, checked, onChange, disabled }: { label: string; checked: boolean; onChange: (next: boolean) => void; disabled?: boolean }) {
  return (
    <label className="inline-flex items-center gap-2 text-sm text-slate-700 dark:text-slate-300">
      <input type="checkbox" className="size-4 accent-amber-500" checked={checked} disabled={disabled} onChange={(event) => onChange(event.target.checked)} />
      {label}
    </label>
  );
}
