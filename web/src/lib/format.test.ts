import { describe, expect, it } from 'vitest';
import { formatDateInZone, formatPlainDate } from './format';

describe('formatPlainDate', () => {
  // Gregorian calendar: 1 December 2026 is a Tuesday; 29 February 2028 exists (leap year).
  it('shows the organisation-local date as given, whatever the browser zone', () => {
    // The punctuation after the weekday varies between ICU versions; the words must not.
    expect(formatPlainDate('2026-12-01')).toMatch(/^Tuesday,? 1 December 2026$/);
    expect(formatPlainDate('2028-02-29')).toMatch(/^Tuesday,? 29 February 2028$/);
    expect(formatPlainDate('2026-12-01', 'short')).toBe('1 Dec 2026');
  });

  it('returns anything that is not a YYYY-MM-DD date unchanged', () => {
    expect(formatPlainDate('soon')).toBe('soon');
  });
});

describe('formatDateInZone', () => {
  // 23:30 UTC on 31 Aug is already 1 Sep in Auckland (UTC+12 in winter) and still 31 Aug in London (UTC+1, BST).
  it('uses the organisation zone, not UTC', () => {
    expect(formatDateInZone('2026-08-31T23:30:00Z', 'Pacific/Auckland')).toBe('1 Sept 2026');
    expect(formatDateInZone('2026-08-31T23:30:00Z', 'Europe/London')).toBe('1 Sept 2026');
    expect(formatDateInZone('2026-08-31T22:30:00Z', 'Europe/London')).toBe('31 Aug 2026');
  });
});
