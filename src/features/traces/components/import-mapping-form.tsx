import { useState, type FormEvent } from 'react';
import { textMappingSchema, TIME_UNITS_US, type TextMappingInput } from '../../../../shared/trace/mapped-text-reader.ts';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { fieldErrorsOf } from '../../../lib/api-client.ts';
import { useSaveImportMapping, type SavedImportMapping } from '../api/import-mappings.ts';

const words = (text: string) =>
  text
    .split(/[,\s]+/)
    .map((w) => w.trim())
    .filter(Boolean);
const UNIT_OPTIONS = (Object.keys(TIME_UNITS_US) as (keyof typeof TIME_UNITS_US)[]).map((unit) => ({ value: unit, label: unit === 'us' ? 'µs' : unit }));

/**
 * A new import mapping for the team: a pattern with named groups (time, dir, data) or column
 * numbers, the time unit, the words for each direction, and whether the message is printed as
 * bytes or as words. Checked with the engine's schema before it is sent.
 */
export function ImportMappingForm({ onSaved }: { onSaved(mapping: SavedImportMapping): void }) {
  const save = useSaveImportMapping();
  const [name, setName] = useState('');
  const [mode, setMode] = useState<'pattern' | 'columns'>('pattern');
  const [pattern, setPattern] = useState(String.raw`^\[\s*(?<time>[\d.]+)\]\s+\S+\s+(?<dir>\S+)\s+(?<data>.+)$`);
  const [columns, setColumns] = useState({ time: '1', direction: '2', data: '3' });
  const [timeUnit, setTimeUnit] = useState<'s' | 'ms' | 'us' | 'ns'>('s');
  const [data, setData] = useState<'bytes' | 'words'>('words');
  const [sourceWords, setSourceWords] = useState('SRC');
  const [sinkWords, setSinkWords] = useState('SNK');
  const [commentPrefix, setCommentPrefix] = useState('#');
  const [problems, setProblems] = useState<Record<string, string>>({});

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input: TextMappingInput = {
      name,
      mode,
      ...(mode === 'pattern' ? { pattern } : { timeColumn: Number(columns.time), directionColumn: Number(columns.direction), dataColumn: Number(columns.data) }),
      timeUnit,
      data,
      sourceWords: words(sourceWords),
      sinkWords: words(sinkWords),
      commentPrefix,
    };
    const checked = textMappingSchema.safeParse(input);
    if (!checked.success) {
      setProblems(Object.fromEntries(checked.error.issues.map((issue) => [String(issue.path[0] ?? 'name'), issue.message])));
      return;
    }
    setProblems({});
    save.mutate(input, { onSuccess: onSaved });
  };
  const errors = { ...fieldErrorsOf(save.error), ...problems };

  return (
    <form aria-label="New import mapping" className="space-y-3" onSubmit={submit} noValidate>
      <Input label="Name" value={name} onChange={(event) => setName(event.target.value)} error={errors.name} placeholder="e.g. K-series console" />
      <Select
        label="Read lines by"
        value={mode}
        onChange={(event) => setMode(event.target.value as 'pattern' | 'columns')}
        options={[
          { value: 'pattern', label: 'a pattern with named groups' },
          { value: 'columns', label: 'columns' },
        ]}
      />
      {mode === 'pattern' ? (
        <Input
          label="Pattern"
          mono
          value={pattern}
          onChange={(event) => setPattern(event.target.value)}
          error={errors.pattern}
          hint="A regular expression with the groups (?<time>…), (?<dir>…) and (?<data>…)."
        />
      ) : (
        <div className="grid grid-cols-3 gap-2">
          <Input label="Time column" inputMode="numeric" value={columns.time} onChange={(event) => setColumns({ ...columns, time: event.target.value })} error={errors.timeColumn} />
          <Input
            label="Direction column"
            inputMode="numeric"
            value={columns.direction}
            onChange={(event) => setColumns({ ...columns, direction: event.target.value })}
            error={errors.directionColumn}
          />
          <Input label="Message from column" inputMode="numeric" value={columns.data} onChange={(event) => setColumns({ ...columns, data: event.target.value })} error={errors.dataColumn} />
        </div>
      )}
      <div className="grid grid-cols-2 gap-2">
        <Select label="Time unit" value={timeUnit} onChange={(event) => setTimeUnit(event.target.value as typeof timeUnit)} options={UNIT_OPTIONS} />
        <Select
          label="Message printed as"
          value={data}
          onChange={(event) => setData(event.target.value as 'bytes' | 'words')}
          options={[
            { value: 'words', label: 'words (16-bit header, 32-bit objects)' },
            { value: 'bytes', label: 'hex bytes in wire order' },
          ]}
        />
      </div>
      <div className="grid grid-cols-3 gap-2">
        <Input label="Source words" value={sourceWords} onChange={(event) => setSourceWords(event.target.value)} error={errors.sourceWords} />
        <Input label="Sink words" value={sinkWords} onChange={(event) => setSinkWords(event.target.value)} error={errors.sinkWords} />
        <Input label="Comment prefix" value={commentPrefix} maxLength={4} onChange={(event) => setCommentPrefix(event.target.value)} />
      </div>
      {save.isError && Object.keys(fieldErrorsOf(save.error)).length === 0 && <ErrorMessage title="The mapping was not saved" error={save.error} />}
      <Button type="submit" size="sm" loading={save.isPending}>
        Save mapping for the team
      </Button>
    </form>
  );
}
