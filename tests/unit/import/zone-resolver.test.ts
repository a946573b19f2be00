/** Wall readings in IANA zones, both hemispheres: unique, repeated (clocks back) and skipped (clocks forward). */
import { describe, expect, it } from 'vitest';
import { ZoneResolver } from '@/lib/import/zone-resolver';

const wall = (s: string) => Date.parse(`${s}Z`);
const iso = (ms: number) => `${new Date(ms).toISOString().slice(0, 16)}Z`;

describe('ZoneResolver', () => {
  // Clock-change dates and times are from the zones' published rules (tz database), common practice.
  it.each([
    ['Europe/London', '2025-01-15T12:00', '2025-01-15T12:00Z', 'GMT in winter'],
    ['Europe/London', '2025-07-15T12:00', '2025-07-15T11:00Z', 'BST (UTC+1) in summer'],
    ['Australia/Sydney', '2025-01-15T12:00', '2025-01-15T01:00Z', 'AEDT (UTC+11) in the southern summer'],
    ['Australia/Sydney', '2025-07-15T12:00', '2025-07-15T02:00Z', 'AEST (UTC+10) in the southern winter'],
    ['America/Chicago', '2025-07-15T12:00', '2025-07-15T17:00Z', 'CDT (UTC-5)'],
    ['Asia/Kolkata', '2025-07-15T12:00', '2025-07-15T06:30Z', 'IST (UTC+5:30), no clock changes'],
  ])('%s %s -> %s (%s)', (zone, w, expected) => {
    const r = new ZoneResolver(zone).resolve(wall(w));
    expect(r.kind).toBe('unique');
    if (r.kind === 'unique') expect(iso(r.ms)).toBe(expected);
  });

  it.each([
    ['Europe/London', '2025-10-26T01:30', '2025-10-26T00:30Z', '2025-10-26T01:30Z'],
    ['America/Chicago', '2025-11-02T01:15', '2025-11-02T06:15Z', '2025-11-02T07:15Z'],
    ['Australia/Sydney', '2025-04-06T02:45', '2025-04-05T15:45Z', '2025-04-05T16:45Z'],
  ])('%s %s is repeated when clocks go back', (zone, w, earlier, later) => {
    const r = new ZoneResolver(zone).resolve(wall(w));
    expect(r).toEqual({ kind: 'repeated', earlier: Date.parse(earlier), later: Date.parse(later) });
  });

  it.each([
    ['Europe/London', '2025-03-30T01:30'],
    ['America/Chicago', '2025-03-09T02:00'],
    ['Australia/Sydney', '2025-10-05T02:15'],
  ])('%s %s does not exist when clocks go forward', (zone, w) => {
    expect(new ZoneResolver(zone).resolve(wall(w)).kind).toBe('skipped');
  });

  it('gives the standard-time offset in either hemisphere', () => {
    expect(new ZoneResolver('Europe/London').standardOffset(wall('2025-07-01T00:00'))).toBe(0);
    expect(new ZoneResolver('Australia/Sydney').standardOffset(wall('2025-01-01T00:00'))).toBe(600);
    expect(new ZoneResolver('America/Chicago').standardOffset(wall('2025-07-01T00:00'))).toBe(-360);
  });

  it('resolves readings spread over several years (window reloads)', () => {
    const z = new ZoneResolver('Europe/London');
    const a = z.resolve(wall('2020-07-01T12:00'));
    const b = z.resolve(wall('2030-01-01T12:00'));
    const c = z.resolve(wall('2021-07-01T12:00'));
    expect([a, b, c].map((r) => (r.kind === 'unique' ? iso(r.ms) : r.kind))).toEqual(['2020-07-01T11:00Z', '2030-01-01T12:00Z', '2021-07-01T11:00Z']);
  });

  it('refuses an unknown zone', () => {
    expect(() => new ZoneResolver('Mars/Olympus_Mons')).toThrow(RangeError);
  });
});
