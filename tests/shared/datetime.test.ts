import { describe, it, expect } from 'vitest';
import { calendarDaysBetween, formatCalendarDay, formatClock, formatDateTime, formatDay, siteLocalToIso, zoneLabel } from '@shared/datetime';
import { calibrationStatus } from '@server/modules/probes/calibration-state';
import type { CoefficientSet } from '@shared/core/types';

// A due date is stored as the end of its UTC calendar day (the README: a set is valid through its due day).
const endOfDay = (day: string) => Date.parse(`${day}T23:59:59.999Z`);

describe('calendarDaysBetween: whole UTC calendar days, whatever the hours', () => {
  it('counts 2 Dec to a 14 Dec due date as 12 days and an 11 Nov due date as 21 days overdue (the off-by-one seen on the dashboard)', () => {
    const now = Date.parse('2026-12-02T10:15:00Z');
    expect(calendarDaysBetween(now, endOfDay('2026-12-14'))).toBe(12);
    expect(calendarDaysBetween(now, endOfDay('2026-11-11'))).toBe(-21);
    expect(calendarDaysBetween(now, endOfDay('2026-12-02'))).toBe(0);
  });

  it('crosses a month end: 30 Nov 23:30 to 1 Dec is one day, and 31 Oct to 1 Dec is 31', () => {
    expect(calendarDaysBetween(Date.parse('2026-11-30T23:30:00Z'), endOfDay('2026-12-01'))).toBe(1);
    expect(calendarDaysBetween(Date.parse('2026-10-31T00:00:00Z'), endOfDay('2026-12-01'))).toBe(31);
  });

  it('is not shifted by a clock change: across the end of summer time in Europe (25 Oct 2026) the count is still calendar days', () => {
    // 24 Oct 23:30 in London (BST, UTC+1) is 22:30 UTC; 1 Nov is 8 calendar days later.
    const now = Date.parse('2026-10-24T23:30:00+01:00');
    expect(calendarDaysBetween(now, endOfDay('2026-11-01'))).toBe(8);
    // And across the start of summer time (29 Mar 2026).
    expect(calendarDaysBetween(Date.parse('2026-03-28T12:00:00Z'), endOfDay('2026-03-30'))).toBe(2);
  });

  it('drives the dashboard state: due in 12 days is due soon within 30, overdue the day after the due day', () => {
    const set = (due: string): CoefficientSet => ({ id: '1', effectiveFrom: 0, dueDate: endOfDay(due), tRefMs: 100, alphaPerK: 0, tCalC: 23, gains: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: 0.01 }] });
    const now = Date.parse('2026-12-02T10:15:00Z');
    expect(calibrationStatus([set('2026-12-14')], now, 30)).toMatchObject({ state: 'due_soon', daysUntilDue: 12 });
    expect(calibrationStatus([set('2026-11-11')], now, 30)).toMatchObject({ state: 'overdue', daysUntilDue: -21 });
    expect(calibrationStatus([set('2026-12-02')], now, 30)).toMatchObject({ state: 'due_soon', daysUntilDue: 0 });
    expect(calibrationStatus([set('2027-01-01')], now, 30)).toMatchObject({ state: 'due_soon', daysUntilDue: 30 });
    expect(calibrationStatus([set('2027-01-02')], now, 30)).toMatchObject({ state: 'ok', daysUntilDue: 31 });
  });
});

describe('one date format, in a named zone, labelled', () => {
  const summer = Date.parse('2026-06-15T08:30:00Z');
  const winter = Date.parse('2026-12-02T01:06:00Z');

  it('writes a day as "2 Dec 2026" and a time with its zone label, in the site zone (not the viewer\'s)', () => {
    expect(formatDay(winter, 'Europe/London')).toBe('2 Dec 2026');
    expect(formatDateTime(winter, 'Europe/London')).toBe('2 Dec 2026, 01:06 GMT');
    // Summer time in London: 08:30 UTC is 09:30 local, labelled BST (IANA tzdata abbreviation).
    expect(formatDateTime(summer, 'Europe/London')).toBe('15 Jun 2026, 09:30 BST');
    expect(formatClock(summer, 'Europe/London')).toBe('09:30');
    expect(formatClock(summer, 'Europe/London', { seconds: true })).toBe('09:30:00');
    expect(zoneLabel(summer, 'Europe/London')).toBe('BST');
  });

  it('keeps a calendar day the same everywhere', () => {
    expect(formatCalendarDay('2026-12-02')).toBe('2 Dec 2026');
  });
});

describe('a wall-clock time typed for the site', () => {
  // Offsets from the IANA time zone database: London GMT (+00:00) in November, BST (+01:00) in July;
  // New York EST (−05:00) in November.
  it('becomes ISO 8601 with the site\'s offset at that moment', () => {
    expect(siteLocalToIso('2026-11-18T19:00', 'Europe/London')).toBe('2026-11-18T19:00:00+00:00');
    expect(siteLocalToIso('2026-07-01T12:30', 'Europe/London')).toBe('2026-07-01T12:30:00+01:00');
    expect(siteLocalToIso('2026-11-18T19:00', 'America/New_York')).toBe('2026-11-18T19:00:00-05:00');
    expect(Date.parse(siteLocalToIso('2026-11-18T19:00', 'America/New_York'))).toBe(Date.parse('2026-11-19T00:00:00Z'));
  });

  it('is empty for text that is not a time', () => {
    expect(siteLocalToIso('not a time', 'Europe/London')).toBe('');
  });
});
