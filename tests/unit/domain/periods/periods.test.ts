import { describe, expect, it } from 'vitest';
import { billingPeriods, expectedIntervals, monthlyPeriods, unwrap } from '../../../../src/lib/domain';

const MONTH_2025 = { fromMs: Date.UTC(2025, 0, 15), toMs: Date.UTC(2025, 11, 15) };

describe('calendar months in the site zone', () => {
  it.each([
    // zone, month id, hours, source
    ['America/New_York', '2025-03', 743, 'IANA tz database: US DST starts 9 Mar 2025 (743-hour month)'],
    ['America/New_York', '2025-11', 721, 'IANA tz database: US DST ends 2 Nov 2025 (30-day month + 1 hour)'],
    ['America/New_York', '2025-10', 744, 'IANA tz database: October 2025 in New York has no change'],
    ['America/New_York', '2025-06', 720, 'common practice: a 30-day month without a clock change'],
    ['Australia/Sydney', '2025-04', 721, 'IANA tz database: NSW DST ends 6 Apr 2025 (southern hemisphere, 721 hours)'],
    ['Australia/Sydney', '2025-10', 743, 'IANA tz database: NSW DST starts 5 Oct 2025 (743 hours)'],
    ['Australia/Sydney', '2025-03', 744, 'IANA tz database: March 2025 in Sydney has no change'],
    ['Europe/London', '2025-03', 743, 'IANA tz database: EU summer time starts 30 Mar 2025'],
    ['Europe/London', '2025-10', 745, 'IANA tz database: EU summer time ends 26 Oct 2025'],
  ])('%s %s has %s hours', (zone, id, hours) => {
    const months = unwrap(monthlyPeriods(MONTH_2025, zone));
    expect(months.find((m) => m.id === id)?.hours).toBe(hours);
  });

  it.each([
    ['America/New_York', Date.UTC(2025, 2, 1, 5), Date.UTC(2025, 3, 1, 4), 'IANA tz database: EST (UTC-5) on 1 Mar, EDT (UTC-4) on 1 Apr'],
    ['Australia/Sydney', Date.UTC(2025, 2, 31, 13), Date.UTC(2025, 3, 30, 14), 'IANA tz database: AEDT (UTC+11) on 1 Apr, AEST (UTC+10) on 1 May'],
  ])('%s: month boundaries are local midnights', (zone, startMs, endMs) => {
    const month = unwrap(monthlyPeriods(MONTH_2025, zone)).find((m) => m.startMs === startMs);
    expect(month?.endMs).toBe(endMs);
  });

  it.each([
    ['UTC', 696, 2784, 'common practice: 29 days in February 2024 (leap year), 2,784 quarter-hours'],
    ['America/Chicago', 696, 2784, 'IANA tz database: no clock change in February'],
  ])('leap-year February in %s', (zone, hours, quarterHours) => {
    const feb = unwrap(monthlyPeriods({ fromMs: Date.UTC(2024, 1, 10), toMs: Date.UTC(2024, 1, 11) }, zone))[0];
    expect(feb.id).toBe('2024-02');
    expect(feb.hours).toBe(hours);
    expect(expectedIntervals(feb, 15)).toBe(quarterHours);
  });

  it('covers every month the span touches, labelled in English', () => {
    const months = unwrap(monthlyPeriods({ fromMs: Date.UTC(2025, 0, 31, 12), toMs: Date.UTC(2025, 2, 1, 12) }, 'UTC'));
    expect(months.map((m) => m.label)).toEqual(['January 2025', 'February 2025', 'March 2025']);
  });

  it('rejects an unknown zone with a readable message', () => {
    const r = monthlyPeriods(MONTH_2025, 'Mars/Olympus');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].message).toMatch(/Unknown time zone/);
  });
});

describe('billing periods from bill dates (both dates inclusive)', () => {
  it.each([
    // from, to, zone, hours, source
    ['2025-03-09', '2025-03-09', 'America/New_York', 23, 'IANA tz database: the spring-forward day has 23 hours (92 quarter-hours)'],
    ['2025-11-02', '2025-11-02', 'America/New_York', 25, 'IANA tz database: the fall-back day has 25 hours (100 quarter-hours)'],
    ['2025-04-06', '2025-04-06', 'Australia/Sydney', 25, 'IANA tz database: NSW fall-back day, southern hemisphere'],
    ['2025-10-05', '2025-10-05', 'Australia/Sydney', 23, 'IANA tz database: NSW spring-forward day'],
    ['2025-01-15', '2025-02-13', 'UTC', 720, 'common practice: a 30-day bill, 15 Jan to 13 Feb inclusive'],
  ])('%s to %s in %s', (from, to, zone, hours) => {
    const [p] = unwrap(billingPeriods([{ from, to }], zone));
    expect(p.hours).toBe(hours);
    expect(expectedIntervals(p, 15)).toBe(hours * 4);
  });

  it('rejects overlapping bills and reversed ranges, each with its position', () => {
    const r = billingPeriods(
      [
        { from: '2025-01-15', to: '2025-02-13' },
        { from: '2025-02-10', to: '2025-03-12' },
        { from: '2025-04-10', to: '2025-04-01' },
      ],
      'UTC',
    );
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => [e.code, e.index])).toEqual([['range-overlap', 1], ['range-reversed', 2]]);
  });

  it('warns about a gap between bills but keeps both', () => {
    const r = billingPeriods([{ from: '2025-01-15', to: '2025-02-13' }, { from: '2025-02-20', to: '2025-03-19' }], 'UTC');
    expect(r.ok && r.value.length).toBe(2);
    expect(r.warnings.map((w) => w.code)).toEqual(['range-gap']);
  });

  it('rejects dates that are not YYYY-MM-DD', () => {
    const r = billingPeriods([{ from: '15/01/2025', to: '2025-02-13' }], 'UTC');
    expect(r.ok).toBe(false);
  });
});

describe('months of a series', () => {
  it('takes a series directly, covering its first to last interval (IANA tz database: Chicago is UTC-6 in January)', () => {
    const series = { startMs: Float64Array.of(Date.UTC(2025, 0, 1, 6), Date.UTC(2025, 1, 1, 5, 45)), intervalMinutes: 15, length: 2 };
    expect(unwrap(monthlyPeriods(series, 'America/Chicago')).map((m) => m.id)).toEqual(['2025-01']);
  });
});
