/**
 * The payback table as CSV or XLSX. Text cells that a spreadsheet would read as a formula
 * (starting with = + - @, or a tab or carriage return) get a leading single quote.
 */
import ExcelJS from 'exceljs';
import { z } from 'zod';
import type { PaybackRow, PaybackTable } from './table';
import { escapeFormula, quoteCsv } from '../csv-export';

export const ExportQuerySchema = z.strictObject({ format: z.enum(['csv', 'xlsx'], { error: 'Use format=csv or format=xlsx.' }).default('csv').describe('csv or xlsx') });

type Column = { header: string; value: (r: PaybackRow) => string | number | null; kind: 'text' | 'money' | 'number' | 'years' | 'fraction' };

/** Columns with their units in the header; money columns carry the row's currency in its own column. */
export const EXPORT_COLUMNS: Column[] = [
  { header: 'Site', value: (r) => r.siteName, kind: 'text' },
  { header: 'Plan', value: (r) => r.planName, kind: 'text' },
  { header: 'Type', value: (r) => r.type, kind: 'text' },
  { header: 'Size (kvar)', value: (r) => r.kvar, kind: 'number' },
  { header: 'Currency', value: (r) => r.currency, kind: 'text' },
  { header: 'Capex (currency)', value: (r) => r.capex, kind: 'money' },
  { header: 'Annual saving (currency/year)', value: (r) => r.annualSaving, kind: 'money' },
  { header: 'O&M (currency/year)', value: (r) => r.omPerYear, kind: 'money' },
  { header: 'Payback (years)', value: (r) => r.paybackYears, kind: 'years' },
  { header: 'NPV (currency)', value: (r) => r.npv, kind: 'money' },
  { header: 'IRR (%)', value: (r) => (r.irr === null ? null : r.irr * 100), kind: 'fraction' },
  { header: 'Payback at 80 % savings (years)', value: (r) => r.paybackLow, kind: 'years' },
  { header: 'NPV at 80 % savings (currency)', value: (r) => r.npvLow, kind: 'money' },
  { header: 'Payback at 120 % savings (years)', value: (r) => r.paybackHigh, kind: 'years' },
  { header: 'NPV at 120 % savings (currency)', value: (r) => r.npvHigh, kind: 'money' },
];

function cellText(c: Column, r: PaybackRow): string {
  const v = c.value(r);
  if (v === null) return c.kind === 'years' ? 'not paid back' : '';
  if (typeof v === 'number') return c.kind === 'money' ? v.toFixed(2) : c.kind === 'fraction' ? v.toFixed(2) : c.kind === 'years' ? v.toFixed(2) : String(Math.round(v * 100) / 100);
  return escapeFormula(v);
}

export function paybackCsv(t: PaybackTable): string {
  const lines = [EXPORT_COLUMNS.map((c) => quoteCsv(c.header)).join(',')];
  for (const r of t.rows) lines.push(EXPORT_COLUMNS.map((c) => quoteCsv(cellText(c, r))).join(','));
  return '\uFEFF' + lines.join('\r\n') + '\r\n';
}

export async function paybackXlsx(t: PaybackTable): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Varledger';
  const ws = wb.addWorksheet('Payback');
  ws.columns = EXPORT_COLUMNS.map((c) => ({ header: c.header, width: c.kind === 'text' ? 28 : 18 }));
  ws.getRow(1).font = { bold: true };
  for (const r of t.rows) {
    const row = ws.addRow(
      EXPORT_COLUMNS.map((c) => {
        const v = c.value(r);
        if (v === null) return c.kind === 'years' ? 'not paid back' : null;
        return typeof v === 'string' ? escapeFormula(v) : v;
      }),
    );
    EXPORT_COLUMNS.forEach((c, i) => {
      const cell = row.getCell(i + 1);
      if (c.kind === 'money') cell.numFmt = '#,##0.00';
      else if (c.kind === 'years' || c.kind === 'fraction') cell.numFmt = '0.00';
    });
  }
  ws.views = [{ state: 'frozen', ySplit: 1 }];
  const totals = wb.addWorksheet('Totals by currency');
  totals.columns = [
    { header: 'Currency', width: 12 },
    { header: 'Plans', width: 10 },
    { header: 'Size (kvar)', width: 14 },
    { header: 'Capex (currency)', width: 18 },
    { header: 'Annual saving (currency/year)', width: 28 },
    { header: 'O&M (currency/year)', width: 20 },
    { header: 'NPV (currency)', width: 18 },
  ];
  totals.getRow(1).font = { bold: true };
  for (const x of t.totals) totals.addRow([x.currency, x.plans, x.kvar, x.capex, x.annualSaving, x.omPerYear, x.npv]);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** `varledger-payback-<workspace>.<ext>` with the name reduced to letters, digits and dashes. */
export function exportFileName(workspaceName: string, ext: 'csv' | 'xlsx'): string {
  const safe = workspaceName.normalize('NFKD').replace(/[^\w\s-]/g, '').trim().replace(/[\s_]+/g, '-').replace(/-+/g, '-').toLowerCase().slice(0, 60) || 'workspace';
  return `varledger-payback-${safe}.${ext}`;
}
