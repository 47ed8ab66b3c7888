import { describe, expect, it } from 'vitest';
import { clockOf, instantToLocal, localToInstant, NonexistentLocalTime, zoneOffsetMinutes } from './zoned-time.js';

// Europe/London follows the EU summer-time rule (Directive 2000/84/EC, art. 2–3): summer time
// from 01:00 UTC on the last Sunday of March to 01:00 UTC on the last Sunday of October.
// Last Sundays: 29 March 2026, 25 October 2026, 28 March 2027 (calendar arithmetic).
describe('wall-clock times ↔ instants in the organisation’s zone', () => {
  it('09:00 in London is 08:00 UTC in summer time and 09:00 UTC after the clocks go back', () => {
    expect(localToInstant('2026-10-24', 9 * 60, 'Europe/London').toISOString()).toBe('2026-10-24T08:00:00.000Z');
    expect(localToInstant('2026-10-25', 9 * 60, 'Europe/London').toISOString()).toBe('2026-10-25T09:00:00.000Z');
    expect(localToInstant('2027-03-28', 9 * 60, 'Europe/London').toISOString()).toBe('2027-03-28T08:00:00.000Z');
    expect(localToInstant('2027-03-27', 9 * 60, 'Europe/London').toISOString()).toBe('2027-03-27T09:00:00.000Z');
  });

  it('the change happens at 01:00 UTC', () => {
    expect(zoneOffsetMinutes(new Date('2026-10-25T00:59:00Z'), 'Europe/London')).toBe(60);
    expect(zoneOffsetMinutes(new Date('2026-10-25T01:00:00Z'), 'Europe/London')).toBe(0);
    expect(zoneOffsetMinutes(new Date('2027-03-28T00:59:00Z'), 'Europe/London')).toBe(0);
    expect(zoneOffsetMinutes(new Date('2027-03-28T01:00:00Z'), 'Europe/London')).toBe(60);
  });

  it('round-trips every quarter hour of a clock-change day', () => {
    for (let m = 3 * 60; m < 24 * 60; m += 15) {
      const t = localToInstant('2026-10-25', m, 'Europe/London');
      expect(instantToLocal(t, 'Europe/London')).toEqual({ date: '2026-10-25', minutes: m });
    }
  });

  it('refuses a time the clocks skip (01:30 on 28 March 2027 in London)', () => {
    expect(() => localToInstant('2027-03-28', 90, 'Europe/London')).toThrow(NonexistentLocalTime);
  });

  it('a time that occurs twice resolves to the first: 01:30 BST on 25 October 2026 = 00:30 UTC', () => {
    expect(localToInstant('2026-10-25', 90, 'Europe/London').toISOString()).toBe('2026-10-25T00:30:00.000Z');
  });

  it('other zones: Dublin (same rule, IST in summer) and a zone without summer time (Asia/Kolkata, +05:30)', () => {
    expect(localToInstant('2026-07-01', 10 * 60, 'Europe/Dublin').toISOString()).toBe('2026-07-01T09:00:00.000Z');
    expect(localToInstant('2026-07-01', 10 * 60, 'Asia/Kolkata').toISOString()).toBe('2026-07-01T04:30:00.000Z');
    expect(clockOf(new Date('2026-07-01T04:30:00Z'), 'Asia/Kolkata')).toBe('10:00');
  });
});
