import { SeverityBadge } from '../../../components/badge.tsx';
import { Card, CardBody } from '../../../components/card.tsx';
import type { RuleEntry } from '../../../../shared/rules/catalog.ts';

const basisNotes: Record<RuleEntry['basis'], string> = {
  specification: 'Checked against the specification text.',
  'from memory': 'Section and table as recalled; confirm against your copy of the specification.',
  'common practice': 'A rule of thumb, not a requirement of the specification.',
};

/** One catalog entry: severity, explanation and where the rule comes from. */
export function RuleExplanation({ id, entry }: { id: string; entry: RuleEntry }) {
  return (
    <Card>
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-center gap-2">
          <SeverityBadge severity={entry.severity} />
          <code className="font-mono text-sm text-slate-700 dark:text-slate-300">{id}</code>
        </div>
        <p className="max-w-3xl text-sm leading-6 text-slate-700 dark:text-slate-300">{entry.explanation}</p>
        <dl className="grid max-w-3xl gap-1 text-sm sm:grid-cols-[8rem_1fr]">
          <dt className="text-xs font-medium text-slate-500 uppercase dark:text-slate-400">Reference</dt>
          <dd className="text-slate-800 dark:text-slate-200">{entry.ref}</dd>
          <dt className="text-xs font-medium text-slate-500 uppercase dark:text-slate-400">Basis</dt>
          <dd className="text-slate-600 dark:text-slate-400">{basisNotes[entry.basis]}</dd>
        </dl>
      </CardBody>
    </Card>
  );
}
