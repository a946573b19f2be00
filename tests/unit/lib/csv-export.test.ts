import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from '../../../src/lib/csv-export';

// RFC 4180 quoting; formula-injection escaping as spreadsheet vendors advise (common practice).
describe('CSV export cells', () => {
  it.each([
    ['=HYPERLINK("x")', `"'=HYPERLINK(""x"")"`],
    ['+1', "'+1"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['plain, with comma', '"plain, with comma"'],
    ['line\nbreak', '"line\nbreak"'],
    [-12.5, '-12.5'],
    [null, ''],
    [Number.POSITIVE_INFINITY, ''],
  ])('%j -> %s', (v, out) => expect(csvCell(v)).toBe(out));

  it('joins rows with CRLF', () => expect(toCsv(['a', 'b'], [[1, 'x']])).toBe('a,b\r\n1,x\r\n'));
});
