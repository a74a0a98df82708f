// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { SeverityBadge } from '../../../components/badge.tsx';
import { Card, CardHeader } from '../../../components/card.tsx';
import { RatingText } from '../../../components/mono.tsx';
import { RuleLink } from '../../../components/rule-link.tsx';
import type { Finding } from '../../../../shared/core/finding.ts';
import { isRuleId, ruleCatalog } from '../../../../shared/rules/catalog.ts';

const order = { error: 0, warning: 1, info: 2 } as const;

/** Every finding with its explanation, reference and a link to the rule's page. */
export function FindingsPanel({ findings, pdpW, pdpInferred }: { findings: readonly Finding[]; pdpW: number; pdpInferred: boolean }) {
  const sorted = [...findings].sort((a, b) => order[a.severity] - order[b.severity]);
  const errors = findings.filter((f) => f.severity === 'error').length;
  const summary =
    findings.length === 0
      ? 'No findings: the offers follow every rule Parley checks.'
      : `${errors} error${errors === 1 ? '' : 's'}, ${findings.length - errors} other finding${findings.length - errors === 1 ? '' : 's'}`;
  return (
    <Card aria-labelledby="findings-heading">
      <CardHeader
        title={<span id="findings-heading">Findings</span>}
        description={
          <span>
            Checked at a PDP of <span className="font-mono">{pdpW} W</span>
            {pdpInferred ? ' (inferred from the offers)' : ' (declared)'} · {summary}
          </span>
        }
      />
      {sorted.length > 0 && (
        <ul className="divide-y divide-slate-100 dark:divide-slate-800" aria-label="Findings">
          {sorted.map((finding, i) => {
            const entry = isRuleId(finding.rule) ? ruleCatalog[finding.rule] : undefined;
            return (
              <li key={`${finding.rule}-${finding.object ?? ''}-${i}`} className="space-y-1.5 px-5 py-3" data-rule={finding.rule}>
                <div className="flex flex-wrap items-center gap-2">
                  <SeverityBadge severity={finding.severity} />
                  <RuleLink rule={finding.rule} />
                  {finding.object !== undefined && <span className="font-mono text-xs text-slate-500">object {finding.object}</span>}
                </div>
                {/* caps.label-mismatch quotes the printed rating, DC symbol and all. */}
                <p className="text-sm text-slate-900 dark:text-slate-100">
                  <RatingText value={finding.message} />
                </p>
                {entry && (
                  <details className="text-xs text-slate-600 dark:text-slate-400">
                    <summary className="cursor-pointer select-none">Why it matters</summary>
                    <p className="mt-1 max-w-2xl leading-5">{entry.explanation}</p>
                  </details>
                )}
                <p className="text-[11px] text-slate-500 dark:text-slate-500">{finding.ref}</p>
              </li>
            );
          })}
        </ul>
      )}
    </Card>
  );
}
