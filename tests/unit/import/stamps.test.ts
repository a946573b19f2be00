/** Timestamp readers: ISO 8601 layouts and offsets, stated date orders, 24:00, spreadsheet serials. */
import { describe, expect, it } from 'vitest';
import { dateTimeReader, excelSerialReader, readIso, type StampOut } from '@/lib/import/stamps';

const out = (): StampOut => ({ ms: 0, offsetMin: Number.NaN });

describe('readIso', () => {
  // [text, expected UTC instant or wall reading, offset minutes or null, source]
  it.each([
    ['2025-03-01T00:15:00Z', '2025-03-01T00:15:00.000Z', 0, 'ISO 8601 / RFC 3339 UTC designator'],
    ['2025-03-01T00:15Z', '2025-03-01T00:15:00.000Z', 0, 'ISO 8601 reduced precision (no seconds)'],
    ['2025-03-01 00:15:00+01:00', '2025-02-28T23:15:00.000Z', 60, 'RFC 3339 section 5.6 allows a space for T'],
    ['2025-07-01T08:00:00-05:00', '2025-07-01T13:00:00.000Z', -300, 'ISO 8601 negative offset'],
    ['2025-07-01T08:00:00+0530', '2025-07-01T02:30:00.000Z', 330, 'ISO 8601 basic-format offset'],
    ['2025-07-01T08:00:00+05', '2025-07-01T03:00:00.000Z', 300, 'ISO 8601 hour-only offset'],
    ['2025-07-01T08:00:00.250Z', '2025-07-01T08:00:00.250Z', 0, 'ISO 8601 decimal fraction of a second'],
    ['2024-02-29T12:00:00Z', '2024-02-29T12:00:00.000Z', 0, 'ISO 8601 / Gregorian leap day'],
    ['2025-03-01T24:00:00Z', '2025-03-02T00:00:00.000Z', 0, 'ISO 8601 24:00 as the end of a day'],
    ['2025-03-01 00:15', '2025-03-01T00:15:00.000Z', null, 'no offset: a wall reading to resolve in a zone'],
  ])('%s', (text, instant, offset, _source) => {
    const o = out();
    expect(readIso(text, undefined, o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe(instant);
    if (offset === null) expect(Number.isNaN(o.offsetMin)).toBe(true);
    else expect(o.offsetMin).toBe(offset);
  });

  it.each([
    ['2025-02-29T00:00:00Z', '2025 is not a leap year (Gregorian calendar)'],
    ['2025-13-01T00:00:00Z', 'month 13'],
    ['2025-04-31T00:00:00Z', '30 days in April'],
    ['2025-03-01T25:00:00Z', 'hour 25'],
    ['2025-03-01T24:15:00Z', '24:xx other than 24:00 (ISO 8601)'],
    ['2025-03-01T00:60:00Z', 'minute 60'],
    ['2025-03-01', 'date only'],
    ['01/03/2025 00:15', 'not ISO 8601'],
    ['2025-03-01T00:15:00+25:00', 'offset beyond 18 hours'],
    ['2025-03-01T00:15:00 UTC', 'zone name instead of an offset'],
  ])('refuses %s (%s)', (text) => {
    expect(readIso(text, undefined, out())).toBe(false);
  });

  it('joins a separate date and time column', () => {
    const o = out();
    expect(readIso('2025-06-02', '13:45', o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe('2025-06-02T13:45:00.000Z');
  });
});

describe('dateTimeReader: the stated order is the only one tried', () => {
  it.each([
    ['dmy', '03/02/2025 10:30', '2025-02-03T10:30:00.000Z', 'day-first, common practice in the UK and Australia'],
    ['mdy', '03/02/2025 10:30', '2025-03-02T10:30:00.000Z', 'month-first, common practice in the US'],
    ['ymd', '2025/02/03 10:30', '2025-02-03T10:30:00.000Z', 'year-first'],
    ['dmy', '31.12.2025 23:45:00', '2025-12-31T23:45:00.000Z', 'dotted day-first dates, common practice in Europe'],
    ['mdy', '12/31/2025 11:45 PM', '2025-12-31T23:45:00.000Z', '12-hour clock with PM'],
    ['mdy', '12/31/2025 12:00 AM', '2025-12-31T00:00:00.000Z', '12 AM is midnight (common practice)'],
    ['dmy', '31/12/2025 24:00', '2026-01-01T00:00:00.000Z', '24:00 ends the day (ISO 8601)'],
    ['dmy', '29/02/2024 0:15', '2024-02-29T00:15:00.000Z', 'leap day, one-digit hour'],
  ] as const)('%s %s', (order, text, iso, _source) => {
    const o = out();
    expect(dateTimeReader(order)(text, undefined, o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe(iso);
  });

  it.each([
    ['mdy', '13/01/2025 00:00', 'no month 13'],
    ['dmy', '01/13/2025 00:00', 'no month 13'],
    ['dmy', '29/02/2025 00:00', 'not a leap year'],
    ['dmy', '03/02/25 00:00', 'two-digit years are refused rather than guessed'],
    ['dmy', '03/02/2025', 'no time'],
    ['mdy', '12/31/2025 13:00 PM', '13 PM'],
  ] as const)('%s refuses %s (%s)', (order, text, _why) => {
    expect(dateTimeReader(order)(text, undefined, out())).toBe(false);
  });
});

describe('dateTimeReader with a separate time column (fixed-width fast path)', () => {
  it.each([
    ['dmy', '31/12/2025', '24:00', '2026-01-01T00:00:00.000Z'],
    ['dmy', '31.12.2025', '23:45:30', '2025-12-31T23:45:30.000Z'],
    ['mdy', '02/29/2024', '00:15', '2024-02-29T00:15:00.000Z'],
    ['ymd', '2025-06-02', '13:45', '2025-06-02T13:45:00.000Z'],
    ['dmy', '3/2/2025', '7:05', '2025-02-03T07:05:00.000Z'],
  ] as const)('%s %s %s', (order, date, time, iso) => {
    const o = out();
    expect(dateTimeReader(order)(date, time, o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe(iso);
  });
  it.each([
    ['dmy', '31/02/2025', '00:00'],
    ['mdy', '31/12/2025', '00:00'],
    ['dmy', '01/01/2025', '24:15'],
    ['dmy', '01/01/2025', '12h00'],
    ['dmy', '01-01/2025', '00:00'],
  ] as const)('%s refuses %s %s', (order, date, time) => {
    expect(dateTimeReader(order)(date, time, out())).toBe(false);
  });
});

describe('excelSerialReader (1900 date system: serial 25569 = 1970-01-01, common practice)', () => {
  it.each([
    ['45658', '2025-01-01T00:00:00.000Z'],
    ['45658.5', '2025-01-01T12:00:00.000Z'],
    ['45658.010417', '2025-01-01T00:15:00.000Z'],
    ['45351', '2024-02-29T00:00:00.000Z'],
  ])('%s', (text, iso) => {
    const o = out();
    expect(excelSerialReader('.')(text, undefined, o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe(iso);
  });
  it('reads a decimal comma when told to', () => {
    const o = out();
    expect(excelSerialReader(',')('45658,5', undefined, o)).toBe(true);
    expect(new Date(o.ms).toISOString()).toBe('2025-01-01T12:00:00.000Z');
  });
  it('refuses serials before 1900-03-01, where the 1900 leap-year bug distorts them (from memory)', () => {
    expect(excelSerialReader('.')('59', undefined, out())).toBe(false);
    expect(excelSerialReader('.')('abc', undefined, out())).toBe(false);
  });
});
