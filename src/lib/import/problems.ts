/**
 * Problems found while importing. Errors block the import (the web layer writes nothing);
 * warnings go into the data-quality report. Messages say what happened and what to do.
 */

export interface ImportProblem {
  /** 1-based line number in the file, or null for a problem of the whole file. */
  row: number | null;
  /** Header text (or `column N`) of the cell concerned, or null. */
  column: string | null;
  /** The cell text as found (cut to 60 characters), or null. */
  value: string | null;
  /** Plain sentence: what is wrong and what to change. */
  message: string;
  /** Stable machine code, e.g. `number-invalid`. */
  code: ProblemCode;
}

export type ProblemCode =
  | 'file-empty'
  | 'header-only'
  | 'file-binary'
  | 'file-not-utf8'
  | 'line-too-long'
  | 'single-column'
  | 'mapping-invalid'
  | 'zone-unknown'
  | 'column-missing'
  | 'row-too-short'
  | 'number-invalid'
  | 'stamp-invalid'
  | 'stamp-offset-missing'
  | 'stamp-in-dst-gap'
  | 'register-negative'
  | 'meter-id-missing'
  | 'meter-id-unknown'
  | 'duplicate-conflict'
  | 'interval-mixed'
  | 'interval-undetectable'
  | 'interval-mismatch'
  | 'no-data-rows'
  | 'value-required'
  | 'period-invalid'
  | 'value-out-of-range';

export const MAX_PROBLEMS = 100;

/** Keeps the first 100 problems and counts all of them. */
export class ProblemList {
  readonly items: ImportProblem[] = [];
  total = 0;

  add(code: ProblemCode, row: number | null, column: string | null, value: string | null, message: string): void {
    this.total++;
    if (this.items.length < MAX_PROBLEMS) {
      this.items.push({ code, row, column, value: value === null ? null : clip(value), message });
    }
  }

  get empty(): boolean {
    return this.total === 0;
  }
}

function clip(text: string): string {
  return text.length > 60 ? `${text.slice(0, 57)}...` : text;
}

/** `Row 1,204` as messages write it. */
export function rowLabel(row: number): string {
  return `Row ${row.toLocaleString('en-US')}`;
}

/** The failure shape returned by every parser of this library. */
export interface ImportFailure {
  ok: false;
  /** The first 100 problems, in file order where they have a row. */
  problems: ImportProblem[];
  /** How many problems there were in all. */
  totalProblems: number;
}

export function failure(list: ProblemList): ImportFailure {
  const problems = [...list.items].sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
  return { ok: false, problems, totalProblems: list.total };
}
