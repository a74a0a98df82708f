import { useParams } from 'react-router';
import { ButtonLink } from '../../../components/button.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { RuleLink } from '../../../components/rule-link.tsx';
import { paths } from '../../../config/paths.ts';
import { isRuleId, ruleCatalog, ruleGroup, ruleIds } from '../../../../shared/rules/catalog.ts';
import { RuleExplanation } from '../components/rule-explanation.tsx';

export function RuleDetailRoute() {
  const { ruleId = '' } = useParams();
  const back = (
    <ButtonLink to={paths.rules.index.getHref()} size="sm">
      All rules
    </ButtonLink>
  );
  if (!isRuleId(ruleId)) {
    return (
      <>
        <PageHeader eyebrow="Rule" title="Unknown rule" actions={back} />
        <EmptyState title={`No rule is called “${ruleId}”`} description="The rule may have been renamed; the list of rules has every current one." action={back} />
      </>
    );
  }
  const entry = ruleCatalog[ruleId];
  const related = ruleIds.filter((id) => id !== ruleId && ruleGroup(id) === ruleGroup(ruleId));
  return (
    <>
      <PageHeader eyebrow={`Rule · ${ruleGroup(ruleId)}`} title={entry.title} actions={back} />
      <div className="space-y-6">
        <RuleExplanation id={ruleId} entry={entry} />
        {related.length > 0 && (
          <section aria-label="Related rules">
            <h2 className="mb-2 text-xs font-medium tracking-wide text-slate-500 uppercase dark:text-slate-400">Related rules</h2>
            <ul className="flex flex-wrap gap-x-5 gap-y-1.5">
              {related.map((id) => (
                <li key={id}>
                  <RuleLink rule={id} />
                </li>
              ))}
            </ul>
          </section>
        )}
      </div>
    </>
  );
}
