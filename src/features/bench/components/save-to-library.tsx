import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { paths } from '../../../config/paths.ts';
import { useCreateVector } from '../../../lib/api/create-vector.ts';
import { vectorFromRun, vectorIdOf } from '../lib/run-exports.ts';
import type { BenchRun } from '../lib/use-simulation.ts';

export type SaveToLibraryProps = {
  run: BenchRun;
  title: string;
  onTitleChange(title: string): void;
};

/** Tags as typed: words separated by commas or spaces, lower-case, kebab-case within a tag. */
export function tagsOf(text: string): string[] {
  return [
    ...new Set(
      text
        .split(/[,\s]+/)
        .map((tag) =>
          tag
            .trim()
            .toLowerCase()
            .replace(/[^a-z0-9-]+/g, '-'),
        )
        .filter(Boolean),
    ),
  ];
}

/** Saves the run as a negotiation vector in the team Library (title, tags), then links to it. */
export function SaveToLibrary({ run, title, onTitleChange }: SaveToLibraryProps) {
  const [tagText, setTagText] = useState('');
  const id = vectorIdOf(title);
  const save = useCreateVector();
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    const file = JSON.parse(vectorFromRun(run.scenario, run, { id, title: title.trim() || 'Bench scenario', tags: tagsOf(tagText) })) as Record<string, unknown>;
    save.mutate({ file, message: 'Saved from a Bench run' });
  };
  return (
    <form aria-label="Save to Library" className="flex flex-col gap-2" onSubmit={onSubmit}>
      <div className="flex flex-wrap items-start gap-2">
        <Input label="Title" className="min-w-56 flex-1" value={title} onChange={(event) => onTitleChange(event.target.value)} hint={<span className="font-mono">{id}</span>} />
        <Input label="Tags" className="min-w-40 flex-1" value={tagText} placeholder="pps, k65" onChange={(event) => setTagText(event.target.value)} hint="Comma-separated; “bench” is always added." />
        <Button type="submit" size="sm" className="mt-6" loading={save.isPending}>
          Save to Library
        </Button>
      </div>
      {save.isSuccess && (
        <p role="status" className="text-sm text-emerald-800 dark:text-emerald-300">
          Saved as{' '}
          <Link className="font-mono underline" to={paths.library.vector.getHref(save.data.id)}>
            {save.data.id}
          </Link>{' '}
          in the Library.
        </p>
      )}
      {save.isError && (
        <p role="alert" className="text-sm text-red-700 dark:text-red-400">
          {save.error instanceof Error ? save.error.message : 'The vector could not be saved.'}
        </p>
      )}
    </form>
  );
}
