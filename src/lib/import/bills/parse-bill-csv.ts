/**
 * `parseBillCsv`: a bill-history CSV (one row per bill) -> validated bill determinants,
 * or the problems that block the import. Same problem shape as the meter import.
 */
import { headerIndex, refLabel, type HeaderIndex } from '../columns';
import { mappingProblems } from '../parse-meter-csv';
import { ProblemList, failure, rowLabel, type ImportFailure, type ImportProblem } from '../problems';
import { readRecords, type CsvSource } from '../records';
import { BillDeterminantsSchema, BillMappingSchema, type BillDeterminants, type BillMapping, type BillMappingInput } from './bill-schema';

export interface ParsedBill extends BillDeterminants {
  /** 1-based line of the bill in the file. */
  row: number;
}

export interface BillWarning {
  code: 'period-overlap' | 'period-gap' | 'periods-unordered';
  row: number;
  message: string;
}

export type BillImportResult = { ok: true; bills: ParsedBill[]; warnings: BillWarning[] } | ImportFailure;

type Field = keyof BillMapping['columns'];
const NUMERIC: Field[] = ['kwh', 'billedDemand', 'kvarh', 'powerFactor', 'pfCharge', 'total'];
const LABELS: Record<Field, string> = {
  periodStart: 'period start',
  periodEnd: 'period end',
  kwh: 'kWh',
  billedDemand: 'billed demand',
  kvarh: 'kvarh',
  powerFactor: 'power factor',
  pfCharge: 'PF charge',
  total: 'total',
  currency: 'currency',
};

/** Reads an amount or energy as printed: currency signs and codes, thousands separators and (brackets) for negatives allowed. */
export function readAmount(text: string, m: Pick<BillMapping, 'decimalSeparator' | 'thousandsSeparator'>): number | null {
  let t = text.trim();
  if (!t) return null;
  let negative = false;
  if (/^\(.*\)$/.test(t)) {
    negative = true;
    t = t.slice(1, -1).trim();
  }
  // "-$1,204.50", "$-1,204.50", "AUD 12.00", "12,00 €": keep the sign, drop the currency mark.
  t = t
    .replace(/^([+-]?)\s*(?:[A-Z]{3}|[A-Z]{1,2}\$|[$£€¥])\s*/, '$1')
    .replace(/\s*(?:[A-Z]{3}|[$£€¥])$/, '')
    .trim();
  if (m.thousandsSeparator !== 'none') t = t.split(m.thousandsSeparator).join('');
  if (m.decimalSeparator === ',') {
    if (t.includes('.')) return null;
    t = t.replace(',', '.');
  } else if (t.includes(',')) return null;
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(t)) return null;
  const v = Number(t);
  return negative ? -v : v;
}

/** A printed date -> YYYY-MM-DD, or null. Only the stated order is tried. */
export function readBillDate(text: string, format: BillMapping['dateFormat']): string | null {
  const t = text.trim();
  let y: number;
  let mo: number;
  let d: number;
  if (format === 'iso') {
    const m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t);
    if (!m) return null;
    [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  } else {
    const m = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/.exec(t);
    if (!m) return null;
    [d, mo] = format === 'dmy' ? [Number(m[1]), Number(m[2])] : [Number(m[2]), Number(m[1])];
    y = Number(m[3]);
  }
  const iso = `${String(y).padStart(4, '0')}-${String(mo).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
  const check = new Date(`${iso}T00:00:00Z`);
  return !Number.isNaN(check.getTime()) && check.toISOString().slice(0, 10) === iso ? iso : null;
}

/** Parses a bill history. All-or-nothing like the meter import; period overlaps and gaps are warnings. */
export async function parseBillCsv(source: CsvSource, mappingInput: BillMappingInput): Promise<BillImportResult> {
  const problems = new ProblemList();
  const parsed = BillMappingSchema.safeParse(mappingInput);
  if (!parsed.success) {
    mappingProblems(parsed.error.issues, problems);
    return failure(problems);
  }
  const m = parsed.data;
  const bills: ParsedBill[] = [];
  let header: HeaderIndex | null = null;
  const idx = new Map<Field, number>();
  let records = 0;
  let headerLine = 0;
  const outcome = await readRecords(source, {
    delimiter: m.delimiter,
    onRecord(fields, line) {
      records++;
      if (line <= m.skipRows) return;
      if (!header) {
        header = headerIndex(fields, fields.length);
        headerLine = line;
        if (fields.length === 1) {
          problems.add('single-column', line, null, fields[0], `${rowLabel(line)}: the header splits into one column only. Check the delimiter setting.`);
          return false;
        }
        for (const [field, ref] of Object.entries(m.columns) as [Field, string | number | undefined][]) {
          if (ref === undefined) continue;
          const i = header.find(ref);
          if (i < 0) problems.add('column-missing', line, LABELS[field], null, `${rowLabel(line)}: the ${LABELS[field]} column ${refLabel(ref)} is not in the header. The file has ${header.labels.map((l) => `"${l}"`).join(', ')}. Correct the mapping.`);
          idx.set(field, i);
        }
        return problems.empty ? undefined : false;
      }
      readBill(fields, line, header, idx, m, problems, bills);
    },
  });
  if (!outcome.ok) {
    problems.add(outcome.code, outcome.line, null, null, outcome.message);
    return failure(problems);
  }
  if (records === 0) {
    problems.add('file-empty', null, null, null, 'The file is empty. Export the bill history again and upload the CSV file.');
    return failure(problems);
  }
  if (!problems.empty) return failure(problems);
  if (bills.length === 0) {
    problems.add('header-only', headerLine || null, null, null, 'The file has a header but no bills. Add one row per bill and upload again.');
    return failure(problems);
  }
  return { ok: true, bills, warnings: periodWarnings(bills) };
}

function readBill(fields: string[], line: number, header: HeaderIndex, idx: Map<Field, number>, m: BillMapping, problems: ProblemList, out: ParsedBill[]): void {
  const before = problems.total;
  const cell = (f: Field): string | undefined => {
    const i = idx.get(f);
    return i === undefined ? undefined : (fields[i] ?? '');
  };
  const draft: Record<string, unknown> = {};
  for (const f of ['periodStart', 'periodEnd'] as const) {
    const text = cell(f) ?? '';
    const iso = readBillDate(text, m.dateFormat);
    if (iso === null) {
      const example = m.dateFormat === 'iso' ? '2025-01-31' : m.dateFormat === 'dmy' ? '31/01/2025' : '01/31/2025';
      problems.add('stamp-invalid', line, header.labels[idx.get(f) as number], text, `${rowLabel(line)}: the ${LABELS[f]} "${text.trim()}" is not a date like ${example}. Check the date format setting or fix the file.`);
    } else draft[f] = iso;
  }
  for (const f of NUMERIC) {
    const text = cell(f);
    if (text === undefined) continue;
    if (text.trim() === '') {
      if (f === 'kwh') problems.add('value-required', line, header.labels[idx.get(f) as number], '', `${rowLabel(line)}: the kWh cell is empty. Every bill needs its billed kWh.`);
      continue;
    }
    let v = readAmount(text, m);
    if (v === null) {
      const hint = m.decimalSeparator === '.' && /\d,\d{1,2}$/.test(text.trim()) && m.thousandsSeparator !== ',' ? 'Set the decimal separator to comma or fix the file.' : /\d[,. ']\d{3}/.test(text) && m.thousandsSeparator === 'none' ? 'Set the thousands separator or fix the file.' : 'Replace it with a number.';
      problems.add('number-invalid', line, header.labels[idx.get(f) as number], text, `${rowLabel(line)}: ${LABELS[f]} is not a number ("${text.trim()}"). ${hint}`);
      continue;
    }
    if (f === 'powerFactor' && m.powerFactorScale === 'percent') v /= 100;
    draft[f] = v;
  }
  if (draft.billedDemand !== undefined) draft.billedDemandUnit = m.billedDemandUnit;
  const cur = cell('currency')?.trim() || m.currency;
  if (cur) draft.currency = cur.toUpperCase();
  if (problems.total > before) return;
  const checked = BillDeterminantsSchema.safeParse(draft);
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      const f = String(issue.path[0]) as Field;
      const i = idx.get(f);
      const value = i === undefined ? null : (fields[i] ?? null);
      problems.add(f === 'periodEnd' ? 'period-invalid' : 'value-out-of-range', line, i === undefined ? f : header.labels[i], value, `${rowLabel(line)}: ${issue.message}${f === 'powerFactor' && m.powerFactorScale === 'fraction' ? ' If the file prints PF in percent, set the PF scale to percent.' : ''}`);
    }
    return;
  }
  out.push({ row: line, ...checked.data });
}

function periodWarnings(bills: ParsedBill[]): BillWarning[] {
  const warnings: BillWarning[] = [];
  const sorted = [...bills].sort((a, b) => a.periodStart.localeCompare(b.periodStart));
  if (sorted.some((b, i) => b !== bills[i])) warnings.push({ code: 'periods-unordered', row: bills[0].row, message: 'The bills are not in date order; they are read by their period start.' });
  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1];
    const cur = sorted[i];
    const dayAfter = new Date(Date.parse(`${prev.periodEnd}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    if (cur.periodStart < dayAfter) warnings.push({ code: 'period-overlap', row: cur.row, message: `${rowLabel(cur.row)}: this period starts ${cur.periodStart}, before the previous bill's period ended (${prev.periodEnd}). Check for a re-issued bill.` });
    else if (cur.periodStart > dayAfter) warnings.push({ code: 'period-gap', row: cur.row, message: `${rowLabel(cur.row)}: no bill covers ${dayAfter} to the day before ${cur.periodStart}. Add the missing bill if there is one.` });
  }
  return warnings;
}

export type { ImportProblem };
