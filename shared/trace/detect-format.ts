/**
 * Which reader a trace needs, from its first bytes (content, not the file name): VCD files open
 * with `$` declaration keywords (IEEE 1364 §18.2: `$date`, `$timescale`, `$scope`, `$var`, …),
 * JSON Lines with `{`, anything else is read as plain text.
 */
export type TraceFormat = 'jsonl' | 'text' | 'vcd';

export const TRACE_FORMATS: readonly TraceFormat[] = ['jsonl', 'text', 'vcd'];

export function detectFormat(head: string): TraceFormat {
  let i = head.charCodeAt(0) === 0xfeff ? 1 : 0;
  // Skip blank lines and leading white space.
  while (i < head.length && /\s/.test(head[i]!)) i++;
  const c = head[i];
  if (c === '$') return 'vcd';
  if (c === '{') return 'jsonl';
  return 'text';
}
