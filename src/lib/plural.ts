/**
 * Counting words the same way on every page: "1 error", "2 errors", and one word per severity
 * (a finding of severity `info` is called a note everywhere people read it).
 */
export type SeverityName = 'error' | 'warning' | 'info';

export const SEVERITY_WORD: Record<SeverityName, string> = { error: 'error', warning: 'warning', info: 'note' };

/** "1 message", "3 messages"; `many` for irregular plurals. */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count.toLocaleString('en-GB')} ${count === 1 ? one : many}`;
}

/** "24 messages · 1 error · 0 warnings · 2 notes". */
export function countsText(messages: number, counts: Record<SeverityName, number>): string {
  return [plural(messages, 'message'), plural(counts.error, SEVERITY_WORD.error), plural(counts.warning, SEVERITY_WORD.warning), plural(counts.info, SEVERITY_WORD.info)].join(' · ');
}
