import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime } from './formatDate.js';

describe('one date format with its time zone', () => {
  // 2026-12-02T04:05:00Z; zone offsets from the IANA tz database (common practice):
  // Europe/Berlin is UTC+1 in December, America/New_York UTC−5 (written GMT-5 where the locale has no abbreviation).
  const t = Date.UTC(2026, 11, 2, 4, 5);
  it('writes day, short month, year, 24-hour time and the zone', () => {
    expect(formatDateTime(t, { timeZone: 'UTC' })).toBe('2 Dec 2026, 04:05 UTC');
    expect(formatDateTime(new Date(t).toISOString(), { timeZone: 'Europe/Berlin' })).toBe('2 Dec 2026, 05:05 CET');
    expect(formatDateTime(t, { timeZone: 'America/New_York' })).toBe('1 Dec 2026, 23:05 GMT-5');
    expect(formatDateTime(Date.UTC(2026, 0, 1, 12, 0), { timeZone: 'UTC' })).toBe('1 Jan 2026, 12:00 UTC');
  });
  it('dates alone in the same order, and a dash for nothing', () => {
    expect(formatDate(t, { timeZone: 'UTC' })).toBe('2 Dec 2026');
    expect(formatDateTime(null)).toBe('—');
    expect(formatDateTime('not a date')).toBe('—');
    expect(formatDate(undefined)).toBe('—');
  });
});
