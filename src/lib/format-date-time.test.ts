import { describe, expect, it } from 'vitest';
import { formatDateTime } from '@/lib/format-date-time';

describe('formatDateTime', () => {
  it('writes a local date and time as YYYY-MM-DD HH:mm, and a dash for nothing', () => {
    const date = new Date(2026, 11, 2, 9, 5, 30);
    expect(formatDateTime(date.toISOString())).toBe('2026-12-02 09:05');
    expect(formatDateTime(null)).toBe('—');
    expect(formatDateTime('not a date')).toBe('—');
  });
});
