/**
 * Counting words the same way on every page: "1 error", "2 errors", and one word per severity,
 * the one docs/rules.md gives (`info` stays "info", as the command line prints it: "2 info").
 */
export type SeverityName = 'error' | 'warning' | 'info';

export const SEVERITY_WORD: Record<SeverityName, string> = { error: 'error', warning: 'warning', info: 'info' };

/** "1 message", "3 messages"; `many` for irregular plurals. */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count.toLocaleString('en-GB')} ${count === 1 ? one : many}`;
}

/** "24 messages · 1 error · 0 warnings · 2 info". */
export function countsText(messages: number, counts: Record<SeverityName, number>): string {
  return [plural(messages, 'message'), plural(counts.error, SEVERITY_WORD.error), plural(counts.warning, SEVERITY_WORD.warning), plural(counts.info, SEVERITY_WORD.info, SEVERITY_WORD.info)].join(
    ' · ',
  );
}
