/**
 * Counting words the same way on every page: "1 error", "2 errors", and one word per severity,
 * the one docs/rules.md gives (`info` stays "info", as the command line prints it: "2 info").
 */
export type SeverityName = 'error' | 'warning' | 'info';

export const SEVERITY_WORD: Record<SeverityName, string> = { error: 'error', warning: 'warning', info: 'info' };

/**
 * A count with its thousands grouped as en-GB prints them ("20,085"). Whole numbers are grouped
 * here rather than by Intl: a page's first Intl call loads the locale's data, tens of ms on the
 * main thread of a page that opens (the trace page's first render spent most of its time there).
 */
function groupedCount(count: number): string {
  if (!Number.isSafeInteger(count)) return count.toLocaleString('en-GB');
  return `${count < 0 ? '-' : ''}${String(Math.abs(count)).replace(/\B(?=(\d{3})+$)/g, ',')}`;
}

/** "1 message", "3 messages"; `many` for irregular plurals. */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${groupedCount(count)} ${count === 1 ? one : many}`;
}

/** "24 messages · 1 error · 0 warnings · 2 info". */
export function countsText(messages: number, counts: Record<SeverityName, number>): string {
  return [plural(messages, 'message'), plural(counts.error, SEVERITY_WORD.error), plural(counts.warning, SEVERITY_WORD.warning), plural(counts.info, SEVERITY_WORD.info, SEVERITY_WORD.info)].join(
    ' · ',
  );
}
