/**
 * Fast number reading for mapped columns (papaparse's dynamic typing is not used: it
 * turns dates into Date objects and costs more than the whole import).
 */

/** Result of reading a cell: a finite number, `MISSING`, or `INVALID`. */
export const MISSING = Number.NaN;

export type NumberReader = (text: string) => number | null;

/**
 * Builds a reader for one decimal separator. It returns the number, NaN for a cell listed
 * in `missingValues` (no reading), or null when the text is not a plain decimal number.
 * Accepts surrounding spaces, a leading sign and an exponent; rejects hex, `Infinity`,
 * thousands separators and the other decimal separator.
 */
export function numberReader(decimalSeparator: '.' | ',', missingValues: readonly string[]): NumberReader {
  const missing = new Set(missingValues.map((v) => v.trim()));
  const emptyIsMissing = missing.has('');
  const comma = decimalSeparator === ',';
  const slow = (raw: string): number | null => {
    const text = raw.trim().replace(/^"(.*)"$/, '$1').trim();
    if (missing.has(text)) return MISSING;
    if (text.length === 0) return null;
    if (!/^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/.test(text)) return null;
    const sep = comma ? ',' : '.';
    if (text.includes(comma ? '.' : ',')) return null;
    const v = Number(comma ? text.replace(sep, '.') : text);
    return Number.isFinite(v) ? v : null;
  };
  const sepCode = comma ? 44 : 46;
  return (text: string): number | null => {
    const len = text.length;
    if (len === 0) return emptyIsMissing ? MISSING : null;
    // Fast path for plain decimals of up to 15 digits: the integer mantissa and the power
    // of ten are exact doubles, so one division gives the correctly rounded value, the
    // same double Number() would return.
    let i = 0;
    let neg = false;
    let c = text.charCodeAt(0);
    if (c === 45 || c === 43) {
      neg = c === 45;
      i = 1;
    }
    let mant = 0;
    let digitsSeen = 0;
    let scale = 0;
    let dot = false;
    for (; i < len; i++) {
      c = text.charCodeAt(i);
      if (c >= 48 && c <= 57) {
        mant = mant * 10 + (c - 48);
        digitsSeen++;
        if (dot) scale++;
      } else if (c === sepCode && !dot) dot = true;
      else return slow(text);
    }
    if (digitsSeen === 0 || digitsSeen > 15) return slow(text);
    const v = scale ? mant / POW10[scale] : mant;
    return neg ? -v : v;
  };
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/** Formats a 1-based line number the way messages show it: 1,204. */
export function formatRow(row: number): string {
  return row.toLocaleString('en-US');
}
