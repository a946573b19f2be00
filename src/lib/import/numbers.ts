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
  const hasMissing = missing.size > 0;
  return (raw: string): number | null => {
    let text = raw;
    // Trim only when needed: most cells are clean.
    const c0 = text.charCodeAt(0);
    const cl = text.charCodeAt(text.length - 1);
    if (c0 <= 32 || cl <= 32 || c0 === 34) text = text.trim().replace(/^"(.*)"$/, '$1').trim();
    if (hasMissing && (text.length === 0 || text.length < 8) && missing.has(text)) return MISSING;
    if (text.length === 0) return null;
    if (decimalSeparator === ',') {
      if (text.indexOf('.') !== -1) return null;
      const comma = text.indexOf(',');
      if (comma !== -1) {
        if (text.indexOf(',', comma + 1) !== -1) return null;
        text = text.slice(0, comma) + '.' + text.slice(comma + 1);
      }
    } else if (text.indexOf(',') !== -1) {
      return null;
    }
    const v = +text;
    if (v !== v || v === Infinity || v === -Infinity) return null;
    // `+` accepts 0x10, 0b1 and 1_0-free forms; refuse anything that is not decimal.
    const c = text.charCodeAt(text.length > 1 ? 1 : 0);
    if (c === 120 || c === 88 || c === 98 || c === 66 || c === 111 || c === 79) return null;
    return v;
  };
}

/** Formats a 1-based line number the way messages show it: 1,204. */
export function formatRow(row: number): string {
  return row.toLocaleString('en-US');
}
