/** Mapping proposals from the head of a file: layout, stamps, channels, and what the user must state. */
import { describe, expect, it } from 'vitest';
import { proposeMapping } from '@/lib/import';

const TARN_LIKE = [
  'Site;Fellside Tile Works',
  'Meter;FT-0007',
  '',
  'Reading end (local);Active kWh;Reactive kvarh',
  '01/02/2025 00:30;112,5;80,25',
  '01/02/2025 01:00;110,0;79,00',
  '01/02/2025 01:30;108,2;-3,10',
  '',
].join('\n');

describe('proposeMapping', () => {
  it('never guesses day-first against month-first: it asks', () => {
    const p = proposeMapping(TARN_LIKE, { timeZone: 'Europe/London' });
    expect(p.mapping).toBeNull();
    expect(p.needs.map((n) => n.field)).toEqual(['timestamp.dateOrder']);
    expect(p.needs[0].options).toEqual(['dmy', 'mdy']);
    expect(p.draft.timestamp?.dateOrder).toBeUndefined();
    expect(p.preview.rows).toEqual([]);
  });

  it('completes the mapping once the order is stated, and previews the first rows', () => {
    const p = proposeMapping(TARN_LIKE, { timeZone: 'Europe/London', dateOrder: 'dmy' });
    expect(p.needs).toEqual([]);
    expect(p.mapping).toMatchObject({
      delimiter: ';',
      decimalSeparator: ',',
      skipRows: 3,
      timestamp: { column: 'Reading end (local)', format: 'date-time', dateOrder: 'dmy', zone: 'local', timeZone: 'Europe/London', stampAt: 'end' },
      meters: [{ active: { column: 'Active kWh', unit: 'kWh' }, reactive: { kind: 'net', column: 'Reactive kvarh', unit: 'kvarh' } }],
    });
    // 1 February is GMT in Europe/London, so the wall reading equals UTC (tz database).
    expect(p.preview.rows.map((r) => [r.row, r.stampUtc, r.meters[0].active, r.meters[0].reactive])).toEqual([
      [5, '2025-02-01T00:30:00Z', 112.5, 80.25],
      [6, '2025-02-01T01:00:00Z', 110, 79],
      [7, '2025-02-01T01:30:00Z', 108.2, -3.1],
    ]);
  });

  it('takes the order from the data when a day above 12 proves it, and flags a contradicting statement', () => {
    const head = 'Start,kWh\n13/01/2025 00:00,5\n13/01/2025 00:15,6\n';
    expect(proposeMapping(head, { timeZone: 'UTC' }).draft.timestamp?.dateOrder).toBe('dmy');
    const p = proposeMapping(head, { timeZone: 'UTC', dateOrder: 'mdy' });
    expect(p.problems.map((x) => x.code)).toEqual(['stamp-invalid']);
    expect(p.problems[0].message).toContain('13/01/2025');
  });

  it('reports contradicting dates (one only day-first, another only month-first)', () => {
    const p = proposeMapping('Start,kWh\n13/01/2025 00:00,5\n01/13/2025 00:15,6\n', { timeZone: 'UTC' });
    expect(p.needs[0].field).toBe('timestamp.dateOrder');
    expect(p.needs[0].message).toContain('contradict');
  });

  it('reads ISO 8601 stamps with offsets as offset-in-stamp with high confidence', () => {
    const p = proposeMapping('Interval start,kWh,kvarh lagging,kvarh leading\n2025-06-01T00:00:00+10:00,12.5,4,0\n2025-06-01T00:15:00+10:00,12.0,4,0\n');
    expect(p.mapping?.timestamp).toEqual({ column: 'Interval start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' });
    expect(p.choices.find((c) => c.field === 'timestamp.zone')?.confidence).toBe('high');
    expect(p.mapping?.meters[0].reactive).toEqual({ kind: 'lag-lead', lag: 'kvarh lagging', lead: 'kvarh leading', unit: 'kvarh' });
  });

  it('asks for the clock when stamps carry no offset and no site zone is known', () => {
    const p = proposeMapping('Time,kWh\n2025-06-01 00:00,1\n2025-06-01 00:15,2\n');
    expect(p.needs.map((n) => n.field)).toEqual(['timestamp.zone']);
  });

  it('reads 24:00 as interval-ending', () => {
    const p = proposeMapping('Date,Time,kWh\n2025-06-01,23:45,1\n2025-06-01,24:00,2\n', { timeZone: 'UTC' });
    expect(p.draft.timestamp).toMatchObject({ column: 'Date', timeColumn: 'Time', format: 'date-time', dateOrder: 'ymd', stampAt: 'end' });
    expect(p.choices.find((c) => c.field === 'timestamp.stampAt')?.confidence).toBe('high');
  });

  it('finds spreadsheet serial dates by header and range', () => {
    const p = proposeMapping('Serial date,kWh\n45658.0,10\n45658.010417,11\n', { timeZone: 'UTC' });
    expect(p.draft.timestamp?.format).toBe('excel-serial');
  });

  it('reads power and reactive units from the header', () => {
    const p = proposeMapping('Timestamp UTC,Demand (MW),Reactive demand (Mvar),Apparent (MVA),PF\n2025-06-01T00:00Z,1.2,0.6,1.342,0.894\n2025-06-01T00:15Z,1.1,0.5,1.208,0.91\n');
    const set = p.mapping?.meters[0];
    expect(set?.active.unit).toBe('MW');
    expect(set?.reactive).toMatchObject({ kind: 'net', unit: 'Mvar' });
    expect(set?.apparent).toEqual({ column: 'Apparent (MVA)', unit: 'MVA' });
    expect(set?.powerFactor).toEqual({ column: 'PF' });
  });

  it('finds a numeric meter-serial column in a stacked file', () => {
    const head = 'Meter serial,Interval start,kWh,kvarh lag\n40017,2025-06-01T00:00Z,5,1\n40018,2025-06-01T00:00Z,6,1\n40017,2025-06-01T00:15Z,5,1\n40018,2025-06-01T00:15Z,6,1\n40017,2025-06-01T00:30Z,5,1\n40018,2025-06-01T00:30Z,6,1\n';
    const p = proposeMapping(head);
    expect(p.draft.meterIdColumn).toBe('Meter serial');
    expect(p.mapping?.meters[0].active.column).toBe('kWh');
  });

  it.each([
    ['', 'file-empty'],
    ['\0\0PK\u0003', 'file-binary'],
    ['just one column\nand another line\n', 'single-column'],
    ['Interval start,kWh,kvarh\n', 'header-only'],
  ])('refuses %j with %s', (head, code) => {
    const p = proposeMapping(head);
    expect(p.ok).toBe(false);
    expect(p.problems.map((x) => x.code)).toEqual([code]);
  });

  it('ignores a line cut off at the end of the head', () => {
    const p = proposeMapping('Interval start,kWh\n2025-06-01T00:00Z,1\n2025-06-01T00:15Z,2\n2025-06-01T00:3');
    expect(p.preview.rows.map((r) => r.row)).toEqual([2, 3]);
    expect(p.preview.problems).toEqual([]);
  });
});
