/**
 * "Keep it": an analysed trace as a `trace` vector file (vector.md): the records inline, and as
 * expectations the rule ids the analysis found (`findings.include`, `exclude: []`) and its
 * contracts in order, so a regression in the analyser or a fixed firmware shows up in CI.
 */
import type { Analysis, TraceRecord } from '../../../shared/trace/index.ts';
import { formatVector } from '../../../shared/vectors/index.ts';
import type { PresentedTrace } from './present.ts';

export function vectorIdOf(trace: { id: number; title: string }): string {
  const slug = trace.title
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return `traces/${slug === '' ? 'trace' : slug}-${trace.id}`;
}

export function buildTraceVector(trace: PresentedTrace, analysis: Omit<Analysis, 'timeline'>, records: TraceRecord[]) {
  const include = [...new Set(analysis.findings.map((f) => f.rule))].sort();
  const refs = [...new Set(analysis.findings.filter((f) => f.severity !== 'info').map((f) => f.ref))];
  return {
    vector: 1,
    id: vectorIdOf(trace),
    title: `${trace.title} (trace ${trace.id}${trace.device ? `, ${trace.device.name}` : ''})`,
    tags: ['trace', 'field', trace.format],
    ref: refs.length > 0 ? refs.join('; ') : 'common practice',
    kind: 'trace',
    input: { trace: records },
    expect: {
      findings: { include, exclude: [] as string[] },
      contracts: analysis.contracts.map(({ kind, objectPosition, voltageMv, currentMa, powerMw }) => ({ kind, objectPosition, voltageMv, currentMa, powerMw })),
    },
  };
}

/** The file text, byte-stable (vector.md: key order, two-space indent, final newline). */
export function traceVectorText(trace: PresentedTrace, analysis: Omit<Analysis, 'timeline'>, records: TraceRecord[]): string {
  return formatVector(buildTraceVector(trace, analysis, records));
}
