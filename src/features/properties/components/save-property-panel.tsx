import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { describeZodError, vectorSchema } from '../../../../shared/vectors/schema.ts';
import { downloadVector, saveVector } from '../../../lib/save-vector.ts';
import { SaveStatus, type SaveState } from './save-status.tsx';

export type PropertyMeta = { id: string; title: string; ref: string; tags: string[]; holds: boolean };

/** The property vector file for the page's code, runs, seed and metadata. */
export function propertyVectorOf(meta: PropertyMeta, code: string, runs: number, seed: number): Record<string, unknown> {
  return { vector: 1, id: meta.id, title: meta.title, tags: meta.tags, ref: meta.ref, kind: 'property', input: { code, runs, seed }, expect: { holds: meta.holds } };
}

/** "field: message" for the first problems, or undefined when the vector is valid. */
export function vectorProblem(vector: Record<string, unknown>): string | undefined {
  const parsed = vectorSchema.safeParse(vector);
  return parsed.success ? undefined : describeZodError(parsed.error);
}

export type SavePropertyPanelProps = {
  meta: PropertyMeta;
  onMeta: (next: PropertyMeta) => void;
  /** The vector to save, or the reason there is none (runs or seed invalid). */
  vector: Record<string, unknown> | null;
};

export function SavePropertyPanel({ meta, onMeta, vector }: SavePropertyPanelProps) {
  const [save, setSave] = useState<SaveState>({ kind: 'idle' });
  const problem = vector ? vectorProblem(vector) : 'runs and seed must be whole numbers';
  const onSave = () => {
    if (!vector) return;
    setSave({ kind: 'saving' });
    saveVector(vector).then(
      (outcome) => setSave({ kind: 'done', outcome }),
      (error: unknown) => setSave({ kind: 'failed', error }),
    );
  };
  return (
    <Card aria-labelledby="save-property-heading" role="region">
      <CardHeader title={<span id="save-property-heading">Save as property vector</span>} description="The code above with these runs and seed, and whether it must hold." />
      <CardBody className="space-y-3">
        <Input label="Vector id" mono value={meta.id} onChange={(e) => onMeta({ ...meta, id: e.target.value })} hint="Lower-case words separated by /" />
        <Input label="Title" value={meta.title} onChange={(e) => onMeta({ ...meta, title: e.target.value })} />
        <Input label="Reference" value={meta.ref} onChange={(e) => onMeta({ ...meta, ref: e.target.value })} hint='A specification section, "common practice" or "from memory: …"' />
        <Select
          label="Expected outcome"
          value={meta.holds ? 'holds' : 'fails'}
          onChange={(e) => onMeta({ ...meta, holds: e.target.value === 'holds' })}
          options={[
            { value: 'holds', label: 'Holds for every run' },
            { value: 'fails', label: 'Fails (a known counterexample exists)' },
          ]}
        />
        {problem && (
          <p role="alert" className="text-xs text-red-700 dark:text-red-300">
            {problem}
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <Button size="sm" onClick={onSave} disabled={problem !== undefined} loading={save.kind === 'saving'}>
            Save to library
          </Button>
          <Button size="sm" variant="secondary" disabled={problem !== undefined} onClick={() => vector && downloadVector(vector)}>
            Download
          </Button>
        </div>
        <SaveStatus state={save} />
      </CardBody>
    </Card>
  );
}
