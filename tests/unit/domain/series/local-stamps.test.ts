import { describe, expect, it } from 'vitest';
import { localStampsToUtc } from '../../../../src/lib/domain';

const Q = 15 * 60_000;
const quarterHoursFrom = (startMs: number, n: number) => Array.from({ length: n }, (_, k) => startMs + k * Q);

describe('local wall-clock stamps to UTC interval starts', () => {
  it('fall-back hour, interval-ending stamps: the repeated 01:xx hour is read first as EDT, then EST (IANA tz database: New York, 2 Nov 2025)', () => {
    const stamps = ['00:15', '00:30', '00:45', '01:00', '01:15', '01:30', '01:45', '01:00', '01:15', '01:30', '01:45', '02:00'].map((t) => `2025-11-02 ${t}`);
    const r = localStampsToUtc(stamps, { zone: 'America/New_York', stampAt: 'end', intervalMinutes: 15 });
    // Local midnight EDT is 04:00Z; twelve consecutive quarter-hours follow.
    expect(r.ok && Array.from(r.value)).toEqual(quarterHoursFrom(Date.UTC(2025, 10, 2, 4), 12));
  });

  it('fall-back hour, interval-beginning stamps (IANA tz database: London, 26 Oct 2025)', () => {
    const stamps = ['00:45', '01:00', '01:15', '01:30', '01:45', '01:00', '01:15', '01:30', '01:45', '02:00'].map((t) => `2025-10-26 ${t}`);
    const r = localStampsToUtc(stamps, { zone: 'Europe/London', stampAt: 'start', intervalMinutes: 15 });
    // 00:45 BST is 23:45Z the day before.
    expect(r.ok && Array.from(r.value)).toEqual(quarterHoursFrom(Date.UTC(2025, 9, 25, 23, 45), 10));
  });

  it('spring-forward, interval-beginning stamps skip 02:xx (IANA tz database: New York, 9 Mar 2025)', () => {
    const stamps = ['01:30', '01:45', '03:00', '03:15'].map((t) => `2025-03-09 ${t}`);
    const r = localStampsToUtc(stamps, { zone: 'America/New_York', stampAt: 'start', intervalMinutes: 15 });
    expect(r.ok && Array.from(r.value)).toEqual(quarterHoursFrom(Date.UTC(2025, 2, 9, 6, 30), 4));
  });

  it('southern hemisphere spring-forward, half-hour end stamps (IANA tz database: Sydney, 5 Oct 2025, 02:00 -> 03:00)', () => {
    // The interval 01:30-02:00 AEST ends at 03:00 AEDT, so its end stamp reads 03:00.
    const stamps = ['01:30', '03:00', '03:30', '04:00'].map((t) => `2025-10-05 ${t}`);
    const r = localStampsToUtc(stamps, { zone: 'Australia/Sydney', stampAt: 'end', intervalMinutes: 30 });
    // 01:00 AEST = 15:00Z on 4 Oct; 03:00 AEDT = 16:00Z.
    expect(r.ok && Array.from(r.value)).toEqual([Date.UTC(2025, 9, 4, 15), Date.UTC(2025, 9, 4, 15, 30), Date.UTC(2025, 9, 4, 16), Date.UTC(2025, 9, 4, 16, 30)]);
  });

  it.each<[string, 'start' | 'end', number, string]>([
    ['2025-01-01 24:00', 'end', Date.UTC(2025, 0, 1, 23, 45), 'common practice: midnight written as 24:00 ends the last interval of the day'],
    ['2024-02-29 12:00', 'start', Date.UTC(2024, 1, 29, 12), 'common practice: leap day 2024 exists'],
    ['2025-01-01T00:15', 'end', Date.UTC(2025, 0, 1, 0), 'ISO 8601 T separator'],
  ])('%s (%s stamp)', (stamp, stampAt, startMs) => {
    const r = localStampsToUtc([stamp], { zone: 'UTC', stampAt, intervalMinutes: 15 });
    expect(r.ok && r.value[0]).toBe(startMs);
  });

  it.each([
    ['2025-03-09 02:30', 'America/New_York', 'stamp-in-gap', 'IANA tz database: 02:30 does not exist on 9 Mar 2025 in New York'],
    ['2025-02-29 00:00', 'UTC', 'stamp-unreadable', 'common practice: 2025 is not a leap year'],
    ['2025-01-01 24:15', 'UTC', 'stamp-unreadable', 'common practice: 24:00 is the only time after 23:59'],
  ])('%s in %s is reported as %s', (stamp, zone, code) => {
    const r = localStampsToUtc([stamp], { zone, stampAt: 'start', intervalMinutes: 15 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].code).toBe(code);
  });
});
