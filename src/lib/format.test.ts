import { describe, expect, it } from 'vitest';
import { formatDateTime, formatDateTimeSeconds } from './format.ts';

describe('formatDateTime', () => {
  it('writes local time as YYYY-MM-DD HH:mm, padding each part', () => {
    const local = new Date(2025, 0, 5, 7, 3, 9);
    expect(formatDateTime(local.toISOString())).toBe('2025-01-05 07:03');
    expect(formatDateTimeSeconds(local.toISOString())).toBe('2025-01-05 07:03:09');
  });

  it('shows a dash for missing or unreadable values', () => {
    expect(formatDateTime(null)).toBe('—');
    expect(formatDateTime('not a date')).toBe('—');
  });
});
