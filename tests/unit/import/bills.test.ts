/** Bill-history reading: amounts and dates as printed, the determinants schema, period warnings. */
import { describe, expect, it } from 'vitest';
import { BillDeterminantsSchema, parseBillCsv, readAmount, readBillDate } from '@/lib/import';

describe('readAmount', () => {
  const point = { decimalSeparator: '.' as const, thousandsSeparator: ',' as const };
  const euro = { decimalSeparator: ',' as const, thousandsSeparator: '.' as const };
  it.each([
    ['1,204.50', point, 1204.5],
    ['$1,204.50', point, 1204.5],
    ['-$12.00', point, -12],
    ['$-12.00', point, -12],
    ['(85.20)', point, -85.2],
    ['AUD 1,000', point, 1000],
    ['A$19.99', point, 19.99],
    ['1.204,50 €', euro, 1204.5],
    ['£1.204,50', euro, 1204.5],
  ])('%s -> %s', (text, m, v) => {
    expect(readAmount(text, m)).toBe(v);
  });
  it.each(['', 'n/a', '12.34.56', '1,2'])('refuses %j with a point decimal and no thousands separator', (text) => {
    expect(readAmount(text, { decimalSeparator: '.', thousandsSeparator: 'none' })).toBeNull();
  });
});

describe('readBillDate (ISO 8601 output)', () => {
  it.each([
    ['2025-01-31', 'iso', '2025-01-31'],
    ['31/01/2025', 'dmy', '2025-01-31'],
    ['01/31/2025', 'mdy', '2025-01-31'],
    ['1.2.2025', 'dmy', '2025-02-01'],
    ['29/02/2024', 'dmy', '2024-02-29'],
  ] as const)('%s (%s) -> %s', (text, f, iso) => {
    expect(readBillDate(text, f)).toBe(iso);
  });
  it.each([
    ['31/01/2025', 'mdy'],
    ['29/02/2025', 'dmy'],
    ['2025-02-30', 'iso'],
    ['31/01/25', 'dmy'],
  ] as const)('refuses %s as %s', (text, f) => {
    expect(readBillDate(text, f)).toBeNull();
  });
});

describe('BillDeterminantsSchema (shared with the manual bill form)', () => {
  const ok = { periodStart: '2025-01-07', periodEnd: '2025-02-05', kwh: 412_000, billedDemand: 980.5, billedDemandUnit: 'kW', powerFactor: 0.818, pfCharge: 1204.5, currency: 'USD' };
  it('accepts a complete bill', () => {
    expect(BillDeterminantsSchema.safeParse(ok).success).toBe(true);
  });
  it.each([
    ['PF above 1', { ...ok, powerFactor: 1.02 }],
    ['PF of 0', { ...ok, powerFactor: 0 }],
    ['negative kWh', { ...ok, kwh: -1 }],
    ['negative kvarh', { ...ok, kvarh: -5 }],
    ['end before start', { ...ok, periodEnd: '2025-01-01' }],
    ['end equal to start', { ...ok, periodEnd: '2025-01-07' }],
    ['demand without its unit', { ...ok, billedDemandUnit: undefined }],
    ['a lower-case currency', { ...ok, currency: 'usd' }],
    ['an impossible date', { ...ok, periodStart: '2025-02-30' }],
    ['an unknown key', { ...ok, discount: 3 }],
  ])('refuses %s', (_what, input) => {
    expect(BillDeterminantsSchema.safeParse(input).success).toBe(false);
  });
  it('lets a PF credit be negative', () => {
    expect(BillDeterminantsSchema.safeParse({ ...ok, pfCharge: -120 }).success).toBe(true);
  });
});

describe('parseBillCsv', () => {
  const mapping = { version: 1 as const, delimiter: ',' as const, decimalSeparator: '.' as const, dateFormat: 'iso' as const, billedDemandUnit: 'kVA' as const, powerFactorScale: 'percent' as const, columns: { periodStart: 'From', periodEnd: 'To', kwh: 'kWh', billedDemand: 'kVA', powerFactor: 'PF %' } };
  it('reads PF printed in percent when told to', async () => {
    const r = await parseBillCsv(['From,To,kWh,kVA,PF %\n2025-01-07,2025-02-05,1000,50,87.5\n'], mapping);
    expect(r.ok && r.bills[0]).toMatchObject({ row: 2, powerFactor: 0.875, billedDemand: 50, billedDemandUnit: 'kVA' });
  });
  it('needs a kWh value on every bill', async () => {
    const r = await parseBillCsv(['From,To,kWh,kVA,PF %\n2025-01-07,2025-02-05,,50,87.5\n'], mapping);
    expect(!r.ok && r.problems.map((p) => [p.code, p.row])).toEqual([['value-required', 2]]);
  });
  it('names the missing column', async () => {
    const r = await parseBillCsv(['From,To,kWh,PF %\n2025-01-07,2025-02-05,1000,87.5\n'], mapping);
    expect(!r.ok && r.problems[0]).toMatchObject({ code: 'column-missing', row: 1, column: 'billed demand' });
  });
  it('refuses an empty file and a header-only file', async () => {
    const empty = await parseBillCsv([''], mapping);
    const header = await parseBillCsv(['From,To,kWh,kVA,PF %\n'], mapping);
    expect([empty.ok ? '' : empty.problems[0].code, header.ok ? '' : header.problems[0].code]).toEqual(['file-empty', 'header-only']);
  });
});
