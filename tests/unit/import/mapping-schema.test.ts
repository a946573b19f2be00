/** The stored mapping: strict, self-describing, JSON round-trip, and refusing incomplete statements. */
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { MeterMappingSchema, type MeterMappingInput } from '@/lib/import';

const valid: MeterMappingInput = {
  version: 1,
  delimiter: ';',
  decimalSeparator: ',',
  skipRows: 3,
  timestamp: { column: 'Date', timeColumn: 'Time', format: 'date-time', dateOrder: 'dmy', zone: 'local', timeZone: 'Europe/London', stampAt: 'end' },
  meters: [{ meterId: 'M1', active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lagging-only', lag: 'kvarh', unit: 'kvarh' }, multiplier: 640 }],
};

describe('MeterMappingSchema', () => {
  it('accepts a full mapping and fills defaults; survives JSON', () => {
    const parsed = MeterMappingSchema.parse(JSON.parse(JSON.stringify(valid)));
    expect(parsed.hasHeader).toBe(true);
    expect(parsed.missingValues).toEqual(['']);
    expect(MeterMappingSchema.parse(JSON.parse(JSON.stringify(parsed)))).toEqual(parsed);
  });

  it.each([
    ['an unknown key', { ...valid, extra: 1 }],
    ['date-time without a stated date order', { ...valid, timestamp: { ...valid.timestamp, dateOrder: undefined } }],
    ['local time without a zone', { ...valid, timestamp: { ...valid.timestamp, timeZone: undefined } }],
    ['a comma decimal with a comma delimiter', { ...valid, delimiter: ',' }],
    ['a zero multiplier', { ...valid, meters: [{ ...valid.meters[0], multiplier: 0 }] }],
    ['an unknown unit', { ...valid, meters: [{ ...valid.meters[0], active: { column: 'kWh', unit: 'GWh' } }] }],
    ['two channel sets with a meter-id column', { ...valid, meterIdColumn: 'Meter', meters: [valid.meters[0], { ...valid.meters[0], meterId: 'M2' }] }],
    ['the same meter name twice', { ...valid, meters: [valid.meters[0], valid.meters[0]] }],
    ['excel serials said to carry offsets', { ...valid, timestamp: { ...valid.timestamp, format: 'excel-serial', zone: 'offset-in-stamp' } }],
    ['an unknown key inside the reactive mapping', { ...valid, meters: [{ ...valid.meters[0], reactive: { kind: 'none', column: 'x' } }] }],
  ])('refuses %s', (_what, input) => {
    expect(MeterMappingSchema.safeParse(input).success).toBe(false);
  });

  it('describes its fields for forms and the API description', () => {
    const json = JSON.stringify(z.toJSONSchema(MeterMappingSchema, { io: 'input', unrepresentable: 'any' }));
    for (const phrase of ['Meter multiplier', 'day-first', 'month-first', 'beginning or the end', 'Lines above the header']) expect(json).toContain(phrase);
  });
});
