import { Link } from 'react-router';
import { paths } from '../config/paths.ts';
import { cn } from '../lib/cn.ts';
import { isRuleId, ruleCatalog } from '../../shared/rules/catalog.ts';

export type RuleLinkProps = {
  /** A rule id such as `caps.power-rules-missing`. */
  rule: string;
  /** Show the rule's title after the id. */
  withTitle?: boolean;
  className?: string;
};

/** A finding's rule id as a link to its explanation page (/rules/:id); usable from every feature. */
export function RuleLink({ rule, withTitle, className }: RuleLinkProps) {
  const title = isRuleId(rule) ? ruleCatalog[rule].title : undefined;
  return (
    <Link
      to={paths.rules.detail.getHref(rule)}
      title={title ? `${title}: what it means and what to do` : 'What this rule means'}
      className={cn('font-mono text-[0.85em] text-amber-800 underline decoration-amber-500/40 underline-offset-2 hover:decoration-amber-600 dark:text-amber-300', className)}
    >
      {rule}
      {withTitle && title && <span className="ml-1.5 font-sans text-slate-600 no-underline dark:text-slate-400">{title}</span>}
    </Link>
  );
}
