import { SeverityBadge } from '../../../components/badge.tsx';
import { Card, CardHeader } from '../../../components/card.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { RuleLink } from '../../../components/rule-link.tsx';
import { ruleCatalog, ruleGroup, ruleIds, type RuleGroup } from '../../../../shared/rules/catalog.ts';

const groups: { group: RuleGroup; title: string; description: string }[] = [
  { group: 'caps', title: 'Source capabilities', description: 'Structure of the offers and the Power Rules for the PDP.' },
  { group: 'request', title: 'Requests', description: 'What a sink asks for, against what was offered.' },
  { group: 'timing', title: 'Timing', description: 'Answers and transitions within the specification’s timers.' },
  { group: 'protocol', title: 'Protocol', description: 'Acknowledgements, message counters, resets and message order.' },
  { group: 'epr', title: 'EPR mode', description: 'Entering and holding Extended Power Range mode (above 20 V).' },
  { group: 'vbus', title: 'VBUS', description: 'Measured voltage and current against the contract.' },
  { group: 'decode', title: 'Decoding', description: 'Whether the bytes form a well-made message.' },
  { group: 'trace', title: 'Trace files', description: 'Whether a trace could be read in full and in order.' },
];

export function RulesIndexRoute() {
  return (
    <>
      <PageHeader eyebrow="Analyse" title="Rules" description="Every check Parley reports as a finding, with what it means, why it matters and where it comes from. Findings everywhere link here." />
      <div className="space-y-6">
        {groups.map(({ group, title, description }) => {
          const ids = ruleIds.filter((id) => ruleGroup(id) === group);
          return (
            <Card key={group}>
              <CardHeader title={title} description={description} />
              <ul className="divide-y divide-slate-100 dark:divide-slate-800">
                {ids.map((id) => (
                  <li key={id} className="flex flex-wrap items-baseline gap-x-3 gap-y-1 px-5 py-2.5">
                    <span className="w-16 shrink-0">
                      <SeverityBadge severity={ruleCatalog[id].severity} />
                    </span>
                    <RuleLink rule={id} className="w-64 shrink-0" />
                    <span className="text-sm text-slate-700 dark:text-slate-300">{ruleCatalog[id].title}</span>
                  </li>
                ))}
              </ul>
            </Card>
          );
        })}
      </div>
    </>
  );
}
