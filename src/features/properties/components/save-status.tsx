import { Link } from 'react-router';
import { errorText } from '../../../components/error-message.tsx';
import { paths } from '../../../config/paths.ts';
import type { SaveOutcome } from '../../../lib/save-vector.ts';

export type SaveState = { kind: 'idle' } | { kind: 'saving' } | { kind: 'done'; outcome: SaveOutcome } | { kind: 'failed'; error: unknown };

/** One line after a save: where the vector went (with a link into the library), or why it did not. */
export function SaveStatus({ state }: { state: SaveState }) {
  if (state.kind === 'idle' || state.kind === 'saving') return null;
  if (state.kind === 'failed') {
    return (
      <p role="alert" className="text-sm text-red-700 dark:text-red-300">
        Not saved: {errorText(state.error)}
      </p>
    );
  }
  const { outcome } = state;
  return (
    <p role="status" className="text-sm text-emerald-800 dark:text-emerald-300" data-testid="save-status">
      {outcome.kind === 'library' ? (
        <>
          Saved to the team library as{' '}
          <Link className="font-mono underline underline-offset-2" to={paths.library.vector.getHref(outcome.id)}>
            {outcome.id}
          </Link>
          {outcome.revision === undefined ? '' : ` (revision ${outcome.revision})`}.
        </>
      ) : (
        `${outcome.reason}: downloaded ${outcome.fileName} instead.`
      )}
    </p>
  );
}
