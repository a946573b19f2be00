/**
 * Looking at the head of a file: splitting lines, choosing the delimiter and the decimal
 * separator, finding the header row, and saying what each column's cells look like.
 */
import Papa from 'papaparse';
import { numberReader } from '../numbers';
import { dateTimeReader, readIso, type StampOut } from '../stamps';

export const DELIMITERS = [',', ';', '\t', '|'] as const;
export type Delimiter = (typeof DELIMITERS)[number];

/** Splits one line into fields with papaparse (quotes honoured). */
export function splitLine(line: string, delimiter: string): string[] {
  const r = Papa.parse<string[]>(line, { delimiter, newline: '\n' });
  return (r.data[0] ?? ['']).map((f) => f.trim());
}

const DATEISH = /^(\d{1,4})[/.-](\d{1,2})[/.-](\d{1,4})(?:[ T](\d{1,2}):(\d{2})(?::(\d{2}))?\s*([AaPp][Mm])?)?$/;
const TIMEISH = /^(\d{1,2}):(\d{2})(?::(\d{2}))?\s*([AaPp][Mm])?$/;

export type CellKind = 'empty' | 'iso' | 'iso-offset' | 'date-time' | 'date' | 'time' | 'number' | 'text';

const out: StampOut = { ms: 0, offsetMin: Number.NaN };
const dotNumber = numberReader('.', ['']);
const commaNumber = numberReader(',', ['']);

/** What a single cell looks like. */
export function cellKind(cell: string): CellKind {
  const t = cell.trim();
  if (t === '') return 'empty';
  if (/^\d{4}-\d{2}-\d{2}[T ]/.test(t) && readIso(t, undefined, out)) return out.offsetMin === out.offsetMin ? 'iso-offset' : 'iso';
  if (/^\d{4}-\d{2}-\d{2}$/.test(t)) return 'date';
  const m = DATEISH.exec(t);
  if (m) return m[4] !== undefined ? 'date-time' : 'date';
  if (TIMEISH.test(t)) return 'time';
  const dot = dotNumber(t);
  if (dot !== null && dot === dot) return 'number';
  const comma = commaNumber(t);
  if (comma !== null && comma === comma) return 'number';
  return 'text';
}

/** Splits text into lines (LF, CRLF or CR), dropping a final partial line when the head was cut mid-line. */
export function headLines(text: string, cut: boolean): string[] {
  const lines = text.split(/\r\n|\n|\r/);
  if (lines.length > 1 && lines[lines.length - 1] === '') lines.pop();
  else if (cut && lines.length > 1) lines.pop();
  return lines;
}

function modal(values: number[]): [number, number] {
  const counts = new Map<number, number>();
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
  let best = 0;
  let n = 0;
  for (const [v, c] of counts) if (c > n || (c === n && v > best)) [best, n] = [v, c];
  return [best, n];
}

export interface DelimiterGuess {
  delimiter: Delimiter;
  fields: number;
  /** Share of the sampled lines with the modal field count. */
  consistency: number;
  /** Share of the data cells that read as a number or a date. */
  readable: number;
}

/** Scores each delimiter on the last 40 non-blank lines: consistent field count times readable cells. */
export function guessDelimiter(lines: string[]): DelimiterGuess {
  const sample = lines.filter((l) => l.trim() !== '').slice(-40);
  let best: DelimiterGuess = { delimiter: ',', fields: 1, consistency: 0, readable: 0 };
  let bestScore = -1;
  for (const d of DELIMITERS) {
    const rows = sample.map((l) => splitLine(l, d));
    const [fields, n] = modal(rows.map((r) => r.length));
    const consistency = sample.length ? n / sample.length : 0;
    let cells = 0;
    let good = 0;
    for (const r of rows) {
      if (r.length !== fields) continue;
      for (const c of r) {
        const k = cellKind(c);
        if (k === 'empty') continue;
        cells++;
        if (k !== 'text') good++;
      }
    }
    const readable = cells ? good / cells : 0;
    const score = fields > 1 ? consistency * (0.5 + readable) : 0;
    if (score > bestScore) {
      bestScore = score;
      best = { delimiter: d, fields, consistency, readable };
    }
  }
  return best;
}

/** True when a row is mostly numbers and dates (a data row), false for header, units and title rows. */
export function isDataRow(cells: string[]): boolean {
  let filled = 0;
  let readable = 0;
  let stampish = 0;
  for (const c of cells) {
    const k = cellKind(c);
    if (k === 'empty') continue;
    filled++;
    if (k !== 'text') readable++;
    if (k !== 'text' && k !== 'number') stampish++;
  }
  return filled > 0 && readable / filled >= 0.5 && (stampish > 0 || (readable === filled && filled >= 2));
}

/** Parts of a non-ISO date cell: [first, second, third] as written. */
export function dateParts(cell: string): [string, string, string] | null {
  const m = DATEISH.exec(cell.trim());
  return m ? [m[1], m[2], m[3]] : null;
}

export interface DateOrderEvidence {
  order: 'ymd' | 'dmy' | 'mdy' | null;
  /** The cell that settled it, or why it is open. */
  reason: string;
  contradictory: boolean;
}

/** Settles day-first vs month-first only from proof (a part above 12); never from habit. */
export function dateOrderEvidence(cells: string[]): DateOrderEvidence {
  let dayFirst: string | null = null;
  let monthFirst: string | null = null;
  for (const c of cells) {
    const p = dateParts(c);
    if (!p) continue;
    if (p[0].length === 4) return { order: 'ymd', reason: `"${c.trim()}" starts with a four-digit year`, contradictory: false };
    if (Number(p[0]) > 12) dayFirst ??= c.trim();
    if (Number(p[1]) > 12) monthFirst ??= c.trim();
  }
  if (dayFirst && monthFirst) return { order: null, reason: `"${dayFirst}" reads only day-first but "${monthFirst}" only month-first`, contradictory: true };
  if (dayFirst) return { order: 'dmy', reason: `"${dayFirst}" can only be day-first`, contradictory: false };
  if (monthFirst) return { order: 'mdy', reason: `"${monthFirst}" can only be month-first`, contradictory: false };
  return { order: null, reason: 'no date in the sample has a day above 12, so day-first and month-first both fit', contradictory: false };
}

/** Whether the numbers of the sample use a decimal comma (only possible when the delimiter is not a comma). */
export function usesDecimalComma(cells: string[], delimiter: Delimiter): boolean {
  if (delimiter === ',') return false;
  return cells.some((c) => /^[+-]?\d+,\d+$/.test(c.trim()));
}

export { dateTimeReader };
