/**
 * CSV cells for downloads. A cell that a spreadsheet would read as a formula (starting with
 * = + - @, tab or carriage return) is prefixed with a single quote so it stays text.
 */
/** Text a spreadsheet would evaluate (= + - @, tab, carriage return first) gets a leading quote. */
export function escapeFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** Quotes a CSV field when it holds a comma, quote or line break (RFC 4180). */
export function quoteCsv(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  return quoteCsv(escapeFormula(String(value)));
}

export function toCsv(header: string[], rows: unknown[][]): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
