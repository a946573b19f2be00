/**
 * Writes the invented meter-data and bill fixtures and their catalogue. Run once after a
 * change: `npx tsx tests/unit/import/support/write-fixtures.ts`. Expected outcomes are
 * written from how each file is built (row counts, where the fault was put), never from
 * running the importer.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { DateTime } from 'luxon';

const ROOT = new URL('../../../../', import.meta.url).pathname;
const METER_DIR = `${ROOT}fixtures/meter-data/`;
const BILL_DIR = `${ROOT}fixtures/bills/`;
mkdirSync(METER_DIR, { recursive: true });
mkdirSync(BILL_DIR, { recursive: true });

type Json = Record<string, unknown>;
const meterEntries: Json[] = [];
const billEntries: Json[] = [];

const Q = 15 * 60_000;
const DAY0 = Date.UTC(2025, 5, 2); // Monday 2 June 2025, 00:00 UTC
const iso = (ms: number) => new Date(ms).toISOString().replace('.000Z', 'Z');
const isoNoZ = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');
/** kWh, lagging kvarh of quarter-hour k: kWh 20..27, kvarh 10..14, lagging PF 0.80-0.94. */
const kwh = (k: number) => 20 + (k % 8);
const lag = (k: number) => 10 + (k % 5);
const sum = (n: number, f: (k: number) => number) => Array.from({ length: n }, (_, k) => f(k)).reduce((a, b) => a + b, 0);

function meter(file: string, content: string | Uint8Array, description: string, mapping: Json | null, expect: Json, extra: Json = {}) {
  writeFileSync(METER_DIR + file, content);
  meterEntries.push({ file: `fixtures/meter-data/${file}`, description, mapping, ...extra, expect });
}
function bill(file: string, content: string, description: string, mapping: Json, expect: Json) {
  writeFileSync(BILL_DIR + file, content);
  billEntries.push({ file: `fixtures/bills/${file}`, description, mapping, expect });
}

const BASE = { version: 1, delimiter: ',', decimalSeparator: '.' };
const ISO_START = { column: 'Interval start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' };
const LAG_LEAD = { kind: 'lag-lead', lag: 'kvarh lag', lead: 'kvarh lead', unit: 'kvarh' };
const M1 = (reactive: Json = LAG_LEAD, active: Json = { column: 'kWh', unit: 'kWh' }) => [{ meterId: 'M1', active, reactive }];
const STD_MAPPING = { ...BASE, timestamp: ISO_START, meters: M1() };
const HEADER = 'Interval start,kWh,kvarh lag,kvarh lead';
const dayRows = (n = 96, from = DAY0) => Array.from({ length: n }, (_, k) => `${iso(from + k * Q)},${kwh(k)},${lag(k)},0`);
const okMeter = (n: number, first: number, minutes: number, findings: string[], more: Json = {}) => ({
  meterId: 'M1',
  intervals: n,
  intervalMinutes: minutes,
  firstStartUtc: iso(first),
  lastEndUtc: iso(first + n * minutes * 60_000),
  findingCodes: findings,
  ...more,
});

// ---- well-formed baselines
meter('ok-utc-15min.csv', [HEADER, ...dayRows()].join('\n') + '\n', 'One day of 15-minute ISO 8601 UTC stamps with lagging and leading kvarh.', STD_MAPPING, {
  ok: true,
  meters: [okMeter(96, DAY0, 15, [], { totalImportKwh: sum(96, kwh), totalLagKvarh: sum(96, lag) })],
});
meter('bom.csv', '\uFEFF' + [HEADER, ...dayRows()].join('\n') + '\n', 'Same day with a UTF-8 byte-order mark before the header.', STD_MAPPING, { ok: true, meters: [okMeter(96, DAY0, 15, [])] });
meter('crlf.csv', [HEADER, ...dayRows()].join('\r\n') + '\r\n', 'Same day with CRLF line endings (RFC 4180).', STD_MAPPING, { ok: true, meters: [okMeter(96, DAY0, 15, [])] });
meter(
  'quoted-fields.csv',
  ['"Interval start","kWh","kvarh lag","kvarh lead"', ...dayRows(8).map((r) => r.split(',').map((c) => `"${c}"`).join(','))].join('\n') + '\n',
  'Every field quoted (RFC 4180 section 2).',
  STD_MAPPING,
  { ok: true, meters: [okMeter(8, DAY0, 15, [])] },
);

// ---- unreadable files
meter('empty.csv', '', 'Zero bytes.', STD_MAPPING, { ok: false, problemCodes: ['file-empty'], firstProblemRow: null, totalProblems: 1 });
meter('header-only.csv', HEADER + '\n', 'A header and no readings.', STD_MAPPING, { ok: false, problemCodes: ['header-only'], firstProblemRow: 1, totalProblems: 1 });
meter('binary.csv', new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00, 0x08, 0x00, 0x00, 0x00, 0x21, 0x00, 0x8c, 0x9a]), 'A zip archive renamed to .csv: NUL bytes on line 1.', STD_MAPPING, {
  ok: false,
  problemCodes: ['file-binary'],
  firstProblemRow: 1,
  totalProblems: 1,
});
{
  // "Zähler" written in ISO 8859-1: 0xE4 is not valid UTF-8 on its own.
  const text = `${HEADER}\n${dayRows(2).join('\n')}\n`;
  const bytes = Buffer.concat([Buffer.from(text, 'utf8'), Buffer.from([0x5a, 0xe4, 0x68, 0x6c, 0x65, 0x72, 0x0a])]);
  meter('latin1.csv', bytes, 'A Latin-1 byte on line 4 (not UTF-8).', STD_MAPPING, { ok: false, problemCodes: ['file-not-utf8'], firstProblemRow: 4, totalProblems: 1 });
}
meter('wrong-delimiter.csv', [HEADER.replaceAll(',', ';'), ...dayRows(4).map((r) => r.replaceAll(',', ';'))].join('\n') + '\n', 'Semicolon-separated, mapped with a comma delimiter.', STD_MAPPING, {
  ok: false,
  problemCodes: ['single-column'],
  firstProblemRow: 1,
  totalProblems: 1,
});

// ---- number formats
const commaRows = dayRows(8).map((r, k) => `${iso(DAY0 + k * Q)};${kwh(k)},5;${lag(k)},25;0`);
meter('decimal-comma.csv', ['Interval start;kWh;kvarh lag;kvarh lead', ...commaRows].join('\n') + '\n', 'Semicolons and decimal commas.', { ...STD_MAPPING, delimiter: ';', decimalSeparator: ',' }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, [], { totalImportKwh: sum(8, kwh) + 8 * 0.5, totalLagKvarh: sum(8, lag) + 8 * 0.25 })],
});
meter('decimal-comma-unset.csv', ['Interval start;kWh;kvarh lag;kvarh lead', ...commaRows].join('\n') + '\n', 'Decimal commas read with the point setting: every row fails on kWh.', { ...STD_MAPPING, delimiter: ';' }, {
  ok: false,
  problemCodes: ['number-invalid'],
  firstProblemRow: 2,
  totalProblems: 8,
});
{
  const rows = dayRows(12);
  rows[5] = `${iso(DAY0 + 5 * Q)},n/a,${lag(5)},0`;
  meter('text-in-number.csv', [HEADER, ...rows].join('\n') + '\n', '"n/a" in the kWh column on line 7.', STD_MAPPING, { ok: false, problemCodes: ['number-invalid'], firstProblemRow: 7, totalProblems: 1 });
}
meter('missing-kvarh-column.csv', ['Interval start,kWh', ...dayRows(4).map((r) => r.split(',').slice(0, 2).join(','))].join('\n') + '\n', 'No kvarh columns although the mapping names two.', STD_MAPPING, {
  ok: false,
  problemCodes: ['column-missing'],
  firstProblemRow: 1,
  totalProblems: 2,
});
{
  const rows = Array.from({ length: 12 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)},${k === 8 ? -3.5 : lag(k)}`);
  meter('negative-lagging.csv', ['Interval start,kWh,kvarh', ...rows].join('\n') + '\n', 'A negative value on line 10 under a lagging-only mapping.', { ...STD_MAPPING, meters: M1({ kind: 'lagging-only', lag: 'kvarh', unit: 'kvarh' }) }, {
    ok: false,
    problemCodes: ['register-negative'],
    firstProblemRow: 10,
    totalProblems: 1,
  });
}
{
  const rows = dayRows(12);
  rows.push(`Total,${sum(12, kwh)}`);
  meter('trailing-total-line.csv', [HEADER, ...rows].join('\n') + '\n', 'A totals line after the data (line 14) with two fields.', STD_MAPPING, { ok: false, problemCodes: ['row-too-short'], firstProblemRow: 14, totalProblems: 1 });
}

// ---- stamps
{
  const rows = dayRows(12);
  rows.splice(6, 0, `${iso(DAY0 + 5 * Q)},99,${lag(5)},0`);
  meter('duplicate-conflict.csv', [HEADER, ...rows].join('\n') + '\n', 'The 01:15 interval twice (lines 7 and 8) with different kWh.', STD_MAPPING, { ok: false, problemCodes: ['duplicate-conflict'], firstProblemRow: 8, totalProblems: 1 });
}
{
  const rows = dayRows(96);
  rows.splice(41, 0, rows[40]);
  meter('duplicate-identical.csv', [HEADER, ...rows].join('\n') + '\n', 'Line 42 repeated exactly on line 43.', STD_MAPPING, {
    ok: true,
    meters: [okMeter(96, DAY0, 15, ['duplicates-identical'], { duplicatesDropped: 1 })],
  });
}
{
  const rows = dayRows(96).filter((_, k) => k < 40 || k >= 48);
  meter('gap.csv', [HEADER, ...rows].join('\n') + '\n', 'Two hours (8 intervals, 10:00-12:00 UTC) missing after line 41.', STD_MAPPING, {
    ok: true,
    meters: [{ ...okMeter(88, DAY0, 15, ['gaps']), lastEndUtc: iso(DAY0 + 96 * Q), expectedIntervals: 96, gaps: [{ afterRow: 41, beforeRow: 42, fromUtc: iso(DAY0 + 40 * Q), toUtc: iso(DAY0 + 48 * Q), missingIntervals: 8 }] }],
  });
}
{
  const stamps = [...Array.from({ length: 32 }, (_, k) => DAY0 + k * Q), ...Array.from({ length: 10 }, (_, j) => DAY0 + 31 * Q + (j + 1) * 2 * Q)];
  meter('mixed-intervals.csv', [HEADER, ...stamps.map((t, k) => `${iso(t)},${kwh(k)},${lag(k)},0`)].join('\n') + '\n', '15-minute stamps to 07:45, then 30-minute stamps from line 34.', STD_MAPPING, {
    ok: false,
    problemCodes: ['interval-mixed'],
    firstProblemRow: 34,
    totalProblems: 1,
  });
}
{
  const rows = dayRows(12);
  rows.splice(6, 0, `${iso(DAY0 + 5 * Q + 5 * 60_000)},${kwh(5)},${lag(5)},0`);
  meter('off-grid-stamp.csv', [HEADER, ...rows].join('\n') + '\n', 'A stamp 5 minutes after a quarter-hour (line 8) in a 15-minute file.', STD_MAPPING, {
    ok: false,
    problemCodes: ['interval-mixed'],
    firstProblemRow: 8,
    totalProblems: 2,
  });
}
{
  const rows = dayRows(8).reverse();
  meter('rows-descending.csv', [HEADER, ...rows].join('\n') + '\n', 'Newest first.', STD_MAPPING, { ok: true, meters: [okMeter(8, DAY0, 15, ['rows-reordered'], { rowsOutOfOrder: 7 })] });
}
meter('offset-missing.csv', [HEADER, ...Array.from({ length: 4 }, (_, k) => `${isoNoZ(DAY0 + k * Q)},${kwh(k)},${lag(k)},0`)].join('\n') + '\n', 'ISO stamps without Z or offset, mapped as carrying offsets.', STD_MAPPING, {
  ok: false,
  problemCodes: ['stamp-offset-missing'],
  firstProblemRow: 2,
  totalProblems: 4,
});
{
  const rows = ['2025-02-28T23:30:00Z', '2025-02-28T23:45:00Z', '2025-02-30T00:00:00Z', '2025-03-01T00:15:00Z'].map((t, k) => `${t},${kwh(k)},${lag(k)},0`);
  meter('impossible-date.csv', [HEADER, ...rows].join('\n') + '\n', '30 February on line 4.', STD_MAPPING, { ok: false, problemCodes: ['stamp-invalid'], firstProblemRow: 4, totalProblems: 1 });
}
{
  const leap = Date.UTC(2024, 1, 28, 22, 0);
  const rows = Array.from({ length: 16 }, (_, k) => `${iso(leap + k * 15 * 60_000 * 4)},${kwh(k)},${lag(k)},0`);
  meter('leap-day-hourly.csv', [HEADER, ...rows].join('\n') + '\n', 'Hourly stamps across 29 February 2024 (ISO 8601 leap year).', STD_MAPPING, {
    ok: true,
    meters: [okMeter(16, leap, 60, [])],
  });
}
{
  // Offsets written in the stamps: +02:00 summer time in Central Europe.
  const rows = Array.from({ length: 8 }, (_, k) => {
    const dt = DateTime.fromMillis(DAY0 + k * Q, { zone: 'Europe/Berlin' });
    return `${dt.toFormat("yyyy-MM-dd'T'HH:mm:ssZZ")},${kwh(k)},${lag(k)},0`;
  });
  meter('iso-offset-plus0200.csv', [HEADER, ...rows].join('\n') + '\n', 'Local stamps with a +02:00 offset (ISO 8601).', STD_MAPPING, { ok: true, meters: [okMeter(8, DAY0, 15, [])] });
}

// Local wall-clock days around the clock changes (common practice: 100 and 92 quarter-hours).
function localDay(zone: string, date: string, file: string, description: string, kind: 'clocks-back' | 'clocks-forward', hours: number) {
  const start = DateTime.fromISO(`${date}T00:00`, { zone }).toMillis();
  const end = DateTime.fromISO(`${date}T00:00`, { zone }).plus({ days: 1 }).toMillis();
  const n = (end - start) / Q;
  const rows = Array.from({ length: n }, (_, k) => `${DateTime.fromMillis(start + k * Q, { zone }).toFormat('yyyy-MM-dd HH:mm')},${kwh(k)},${lag(k)},0`);
  const repeated = kind === 'clocks-back' ? 8 : 0;
  meter(
    file,
    [HEADER, ...rows].join('\n') + '\n',
    description,
    { ...STD_MAPPING, timestamp: { column: 'Interval start', format: 'iso', zone: 'local', timeZone: zone, stampAt: 'start' } },
    {
      ok: true,
      meters: [okMeter(n, start, 15, kind === 'clocks-back' ? ['dst-repeated-hour'] : [], { dstDays: [{ localDate: date, kind, hours, expectedIntervals: n, presentIntervals: n }], repeatedHourStamps: repeated, readAsEarlierOffset: repeated / 2 })],
    },
  );
  return n;
}
localDay('America/Chicago', '2025-11-02', 'dst-fall-back-chicago.csv', 'America/Chicago local time on the 25-hour fall-back day: 100 quarter-hours, 01:00-01:45 twice.', 'clocks-back', 25);
localDay('America/Chicago', '2025-03-09', 'dst-spring-forward-chicago.csv', 'America/Chicago local time on the 23-hour spring-forward day: 92 quarter-hours, no 02:xx.', 'clocks-forward', 23);
localDay('Australia/Sydney', '2025-04-06', 'dst-fall-back-sydney.csv', 'Australia/Sydney local time on the 25-hour day clocks go back (southern hemisphere, April).', 'clocks-back', 25);
localDay('Australia/Sydney', '2025-10-05', 'dst-spring-forward-sydney.csv', 'Australia/Sydney local time on the 23-hour day clocks go forward (October).', 'clocks-forward', 23);
{
  // Interval-ending local stamps through the fall-back: 01:00-01:45 appear twice, the first pass in CDT.
  const zone = 'America/Chicago';
  const start = DateTime.fromISO('2025-11-02T00:00', { zone }).toMillis();
  const rows = Array.from({ length: 100 }, (_, k) => `${DateTime.fromMillis(start + (k + 1) * Q, { zone }).toFormat('yyyy-MM-dd HH:mm')},${kwh(k)},${lag(k)},0`);
  meter('dst-fall-back-chicago-ending.csv', [HEADER.replace('Interval start', 'Interval end'), ...rows].join('\n') + '\n', 'America/Chicago local interval-ending stamps on the fall-back day: 100 quarter-hours, the last ending at 00:00 the next day.', { ...STD_MAPPING, timestamp: { column: 'Interval end', format: 'iso', zone: 'local', timeZone: zone, stampAt: 'end' } }, {
    ok: true,
    meters: [okMeter(100, start, 15, ['dst-repeated-hour'], { dstDays: [{ localDate: '2025-11-02', kind: 'clocks-back', hours: 25, expectedIntervals: 100, presentIntervals: 100 }], repeatedHourStamps: 8, readAsEarlierOffset: 4 })],
  });
}
{
  const rows = ['2025-03-09 01:30', '2025-03-09 01:45', '2025-03-09 02:15', '2025-03-09 03:00'].map((t, k) => `${t},${kwh(k)},${lag(k)},0`);
  meter('dst-nonexistent-stamp.csv', [HEADER, ...rows].join('\n') + '\n', '02:15 on the Chicago spring-forward day (line 4) does not exist.', { ...STD_MAPPING, timestamp: { column: 'Interval start', format: 'iso', zone: 'local', timeZone: 'America/Chicago', stampAt: 'start' } }, {
    ok: false,
    problemCodes: ['stamp-in-dst-gap'],
    firstProblemRow: 4,
    totalProblems: 1,
  });
}
{
  // London standard time (GMT) all year across the October change: no repeated hour.
  const start = Date.UTC(2025, 9, 26);
  const rows = Array.from({ length: 96 }, (_, k) => `${isoNoZ(start + k * Q)},${kwh(k)},${lag(k)},0`);
  meter('local-standard-time.csv', [HEADER, ...rows].join('\n') + '\n', 'Europe/London standard time all year on 26 October 2025: 96 rows, no hour repeated.', { ...STD_MAPPING, timestamp: { column: 'Interval start', format: 'iso', zone: 'local-standard', timeZone: 'Europe/London', stampAt: 'start' } }, {
    ok: true,
    // The file covers the GMT day, not the 25-hour local day (which starts at 23:00 UTC the day before), so no clock-change day is counted.
    meters: [okMeter(96, start, 15, [], { dstDays: [], repeatedHourStamps: 0 })],
  });
}
{
  const rows = Array.from({ length: 96 }, (_, k) => {
    const end = DAY0 + (k + 1) * Q;
    const d = new Date(end - 60_000);
    const time = (k + 1) % 96 === 0 ? '24:00' : new Date(end).toISOString().slice(11, 16);
    return `${d.toISOString().slice(0, 10)},${time},${kwh(k)},${lag(k)},0`;
  });
  meter('hour-24-ending.csv', ['Date,Time ending,kWh,kvarh lag,kvarh lead', ...rows].join('\n') + '\n', 'Interval-ending stamps in date and time columns; the last interval of the day ends at 24:00.', { ...STD_MAPPING, timestamp: { column: 'Date', timeColumn: 'Time ending', format: 'date-time', dateOrder: 'ymd', zone: 'utc', stampAt: 'end' } }, {
    ok: true,
    meters: [okMeter(96, DAY0, 15, [])],
  });
}
meter('interval-ending-iso.csv', [HEADER.replace('Interval start', 'Interval end'), ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + (k + 1) * Q)},${kwh(k)},${lag(k)},0`)].join('\n') + '\n', 'ISO stamps marking the end of each interval: the first, 00:15, covers 00:00-00:15.', { ...STD_MAPPING, timestamp: { ...ISO_START, column: 'Interval end', stampAt: 'end' } }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, [])],
});
{
  // 1900 date system serials: 45810 is 2025-06-02 (45810 - 25569 = 20241 days after 1970-01-01).
  const rows = Array.from({ length: 8 }, (_, k) => `${(45810 + k / 96).toFixed(6)},${kwh(k)},${lag(k)},0`);
  meter('excel-serial.csv', ['Serial date,kWh,kvarh lag,kvarh lead', ...rows].join('\n') + '\n', 'Spreadsheet serial dates (1900 date system) in UTC.', { ...STD_MAPPING, timestamp: { column: 'Serial date', format: 'excel-serial', zone: 'utc', stampAt: 'start' } }, {
    ok: true,
    meters: [okMeter(8, DAY0, 15, [])],
  });
}

// Ambiguous and settled day/month order.
{
  const start = Date.UTC(2025, 1, 3, 23, 0); // 3 February 2025 23:00
  const rows = Array.from({ length: 8 }, (_, k) => {
    const d = new Date(start + k * Q);
    return `${String(d.getUTCDate()).padStart(2, '0')}/${String(d.getUTCMonth() + 1).padStart(2, '0')}/${d.getUTCFullYear()} ${d.toISOString().slice(11, 16)};${kwh(k)},0;${lag(k)},0`;
  });
  const mapping = { ...BASE, delimiter: ';', decimalSeparator: ',', timestamp: { column: 'Reading start', format: 'date-time', dateOrder: 'dmy', zone: 'utc', stampAt: 'start' }, meters: M1({ kind: 'net', column: 'kvarh', unit: 'kvarh' }) };
  meter('date-order-ambiguous.csv', ['Reading start (UTC);kWh;kvarh', ...rows].join('\n') + '\n', 'Dates 03/02/2025 and 04/02/2025 only: day-first and month-first both fit, so the proposal asks.', { ...mapping, timestamp: { ...mapping.timestamp, column: 'Reading start (UTC)' } }, {
    ok: true,
    meters: [okMeter(8, start, 15, ['reactive-net-only'])],
  }, { proposal: { delimiter: ';', decimalSeparator: ',', needs: ['timestamp.dateOrder'] } });
  const proof = Array.from({ length: 8 }, (_, k) => {
    const d = new Date(Date.UTC(2025, 0, 13) + k * Q);
    return `${String(d.getUTCDate()).padStart(2, '0')}/${String(d.getUTCMonth() + 1).padStart(2, '0')}/${d.getUTCFullYear()} ${d.toISOString().slice(11, 16)};${kwh(k)},0;${lag(k)},0`;
  });
  meter('date-order-day-first.csv', ['Reading start (UTC);kWh;kvarh', ...proof].join('\n') + '\n', '13/01/2025 can only be day-first.', { ...mapping, timestamp: { ...mapping.timestamp, column: 'Reading start (UTC)' } }, {
    ok: true,
    meters: [okMeter(8, Date.UTC(2025, 0, 13), 15, ['reactive-net-only'])],
  }, { proposal: { delimiter: ';', decimalSeparator: ',', needs: [], dateOrder: 'dmy', zone: 'utc' } });
  meter('date-order-wrong-statement.csv', ['Reading start (UTC);kWh;kvarh', ...proof].join('\n') + '\n', 'The same day-first file read as month-first: 13 is not a month.', { ...mapping, timestamp: { ...mapping.timestamp, column: 'Reading start (UTC)', dateOrder: 'mdy' } }, {
    ok: false,
    problemCodes: ['stamp-invalid'],
    firstProblemRow: 2,
    totalProblems: 8,
  });
}

// Units and multipliers.
meter('units-wh-varh.csv', ['Interval start,Energy (Wh),Reactive (varh)', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k) * 1000},${lag(k) * 1000}`)].join('\n') + '\n', 'Wh and varh in the header; values in Wh.', { ...STD_MAPPING, meters: M1({ kind: 'net', column: 'Reactive (varh)', unit: 'varh' }, { column: 'Energy (Wh)', unit: 'Wh' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['reactive-net-only'], { totalImportKwh: sum(8, kwh), totalLagKvarh: sum(8, lag) })],
}, { proposal: { activeUnit: 'Wh', reactiveUnit: 'varh' } });
meter('units-mwh.csv', ['Interval start,Energy [MWh],Reactive [Mvarh]', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${(kwh(k) / 1000).toFixed(3)},${(lag(k) / 1000).toFixed(3)}`)].join('\n') + '\n', 'MWh and Mvarh in the header (a power-of-ten slip waiting to happen).', { ...STD_MAPPING, meters: M1({ kind: 'net', column: 'Reactive [Mvarh]', unit: 'Mvarh' }, { column: 'Energy [MWh]', unit: 'MWh' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['reactive-net-only'], { totalImportKwh: sum(8, kwh), totalLagKvarh: sum(8, lag) })],
}, { proposal: { activeUnit: 'MWh', reactiveUnit: 'Mvarh' } });
meter('meter-multiplier.csv', [HEADER, ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${(kwh(k) / 640).toFixed(6)},${(lag(k) / 640).toFixed(6)},0`)].join('\n') + '\n', 'Secondary-side values; CT 800:5 x PT 480:120 = 640 (common practice).', { ...STD_MAPPING, meters: [{ meterId: 'M1', active: { column: 'kWh', unit: 'kWh' }, reactive: LAG_LEAD, multiplier: 640 }] }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, [], { totalImportKwh: sum(8, kwh), totalLagKvarh: sum(8, lag), tolerance: 0.01 })],
});
meter('kw-demand-cross-checks.csv', ['Interval start,kW,kvar,kVA,PF', ...Array.from({ length: 8 }, (_, k) => {
  const p = kwh(k) * 4;
  const q = lag(k) * 4;
  return `${iso(DAY0 + k * Q)},${p},${q},${Math.hypot(p, q).toFixed(2)},${(p / Math.hypot(p, q)).toFixed(3)}`;
})].join('\n') + '\n', 'Average kW and kvar demand with kVA and PF columns that agree.', { ...STD_MAPPING, meters: [{ meterId: 'M1', active: { column: 'kW', unit: 'kW' }, reactive: { kind: 'net', column: 'kvar', unit: 'kvar' }, apparent: { column: 'kVA', unit: 'kVA' }, powerFactor: { column: 'PF' } }] }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['reactive-net-only'], { totalImportKwh: sum(8, kwh), totalLagKvarh: sum(8, lag) })],
});

// Several meters.
meter('multi-meter-columns.csv', ['Interval start,North kWh,North kvarh lag,South kWh,South kvarh lag', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)},${lag(k)},${kwh(k) * 2},${lag(k) * 2}`)].join('\n') + '\n', 'Two meters side by side, one column set each.', {
  ...BASE,
  timestamp: ISO_START,
  meters: [
    { meterId: 'North', active: { column: 'North kWh', unit: 'kWh' }, reactive: { kind: 'lagging-only', lag: 'North kvarh lag', unit: 'kvarh' } },
    { meterId: 'South', active: { column: 'South kWh', unit: 'kWh' }, reactive: { kind: 'lagging-only', lag: 'South kvarh lag', unit: 'kvarh' } },
  ],
}, {
  ok: true,
  meters: [
    { ...okMeter(8, DAY0, 15, []), meterId: 'North', totalImportKwh: sum(8, kwh) },
    { ...okMeter(8, DAY0, 15, []), meterId: 'South', totalImportKwh: 2 * sum(8, kwh) },
  ],
}, { proposal: { meters: ['North', 'South'] } });
meter('multi-meter-id-column.csv', ['Meter,Interval start,kWh,kvarh lag,kvarh lead', ...Array.from({ length: 8 }, (_, k) => [`FEEDER-A,${iso(DAY0 + k * Q)},${kwh(k)},${lag(k)},0`, `FEEDER-B,${iso(DAY0 + k * Q)},${kwh(k) + 1},${lag(k)},0`]).flat()].join('\n') + '\n', 'Two meters stacked, named by a meter-id column.', { ...STD_MAPPING, meterIdColumn: 'Meter' }, {
  ok: true,
  meters: [
    { ...okMeter(8, DAY0, 15, []), meterId: 'FEEDER-A', totalImportKwh: sum(8, kwh) },
    { ...okMeter(8, DAY0, 15, []), meterId: 'FEEDER-B', totalImportKwh: sum(8, kwh) + 8 },
  ],
}, { proposal: { meterIdColumn: 'Meter' } });
meter('header-rows-above.csv', ['Site,Quarry Lane Pumping Station', 'Meter serial,QL-7731', 'Exported,2025-06-03', 'Channels,standard', '', HEADER, ...dayRows(8)].join('\n') + '\n', 'Four title lines and a blank line above the header (skip 5 lines).', { ...STD_MAPPING, skipRows: 5 }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, [])],
}, { proposal: { skipRows: 5 } });
meter('units-row-below-header.csv', ['Interval start,Active,Lagging,Leading', ',kWh,kvarh,kvarh', ...dayRows(8)].join('\n') + '\n', 'A units row between the header and the data.', { ...STD_MAPPING, skipRowsAfterHeader: 1, meters: M1({ kind: 'lag-lead', lag: 'Lagging', lead: 'Leading', unit: 'kvarh' }, { column: 'Active', unit: 'kWh' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, [])],
}, { proposal: { skipRowsAfterHeader: 1 } });

// Reactive layouts and warnings.
meter('four-quadrant.csv', ['Interval start,kWh,Q1 kvarh,Q2 kvarh,Q3 kvarh,Q4 kvarh', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)},${k < 6 ? lag(k) : 0},0,0,${k < 6 ? 0 : 4}`)].join('\n') + '\n', 'Four quadrant registers; the last two intervals leading (Q4).', { ...STD_MAPPING, meters: M1({ kind: 'quadrants', q1: 'Q1 kvarh', q2: 'Q2 kvarh', q3: 'Q3 kvarh', q4: 'Q4 kvarh', unit: 'kvarh' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['leading-intervals'], { totalLagKvarh: sum(6, lag), totalLeadKvarh: 8, leadingIntervals: 2 })],
}, { proposal: { reactiveKind: 'quadrants' } });
meter('export-solar.csv', ['Interval start,kWh,Net kvarh', ...Array.from({ length: 12 }, (_, k) => `${iso(DAY0 + k * Q)},${k >= 4 && k < 8 ? -(k - 3) * 2 : kwh(k)},${lag(k)}`)].join('\n') + '\n', 'Four midday intervals exporting (negative kWh) with net signed kvarh.', { ...STD_MAPPING, meters: M1({ kind: 'net', column: 'Net kvarh', unit: 'kvarh' }) }, {
  ok: true,
  meters: [okMeter(12, DAY0, 15, ['export-intervals', 'reactive-net-only'], { exportIntervals: 4, exportFirstRows: [6, 7, 8, 9], totalExportKwh: 20 })],
});
meter('net-only-kvarh.csv', ['Interval start,kWh,kvarh net', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)},${k % 4 === 3 ? -2 : lag(k)}`)].join('\n') + '\n', 'One signed net kvarh channel, negative (leading) in two intervals.', { ...STD_MAPPING, meters: M1({ kind: 'net', column: 'kvarh net', unit: 'kvarh' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['leading-intervals', 'reactive-net-only'], { leadingIntervals: 2, totalLeadKvarh: 4 })],
}, { proposal: { reactiveKind: 'net' } });
meter('reactive-missing.csv', [HEADER, ...Array.from({ length: 12 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)},${k >= 3 && k < 7 ? '' : lag(k)},${k >= 3 && k < 7 ? '' : 0}`)].join('\n') + '\n', 'kvarh cells empty on lines 5-8 (4 intervals); never filled.', STD_MAPPING, {
  ok: true,
  meters: [okMeter(12, DAY0, 15, ['reactive-missing'], { reactiveMissing: 4, reactiveMissingRanges: [{ fromRow: 5, toRow: 8, fromUtc: iso(DAY0 + 3 * Q), toUtc: iso(DAY0 + 7 * Q), intervals: 4 }] })],
});
meter('no-reactive.csv', ['Interval start,kWh', ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)}`)].join('\n') + '\n', 'Active energy only.', { ...STD_MAPPING, meters: M1({ kind: 'none' }) }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['reactive-absent'])],
}, { proposal: { reactiveKind: 'none' } });
meter('spike-and-implausible-pf.csv', [HEADER, ...Array.from({ length: 96 }, (_, k) => `${iso(DAY0 + k * Q)},${k === 50 ? 400 : k === 60 ? 0 : k === 70 ? 2 : kwh(k)},${k === 70 ? 30 : lag(k)},0`)].join('\n') + '\n', 'One 400 kWh spike (line 52), zero kWh with kvarh (line 62), PF 0.07 (line 72).', STD_MAPPING, {
  ok: true,
  meters: [okMeter(96, DAY0, 15, ['kvar-with-zero-kw', 'pf-implausible', 'spikes', 'zero-active'], { spikeRows: [52], implausiblePfRows: [72], kvarWithZeroKwRows: [62] })],
});

// ---- more layouts and limits
meter('no-header.csv', dayRows(8).join('\n') + '\n', 'No header row: columns named by position (1 = stamp, 2 = kWh, 3 = lagging, 4 = leading).', {
  ...BASE,
  hasHeader: false,
  timestamp: { ...ISO_START, column: 1 },
  meters: [{ meterId: 'M1', active: { column: 2, unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 3, lead: 4, unit: 'kvarh' } }],
}, { ok: true, meters: [okMeter(8, DAY0, 15, [])] }, { proposal: { hasHeader: false } });
meter('cr-only.csv', [HEADER, ...dayRows(8)].join('\r') + '\r', 'Bare CR line endings (old spreadsheet exports).', STD_MAPPING, { ok: true, meters: [okMeter(8, DAY0, 15, [])] });
meter('missing-marker.csv', [HEADER, ...Array.from({ length: 8 }, (_, k) => `${iso(DAY0 + k * Q)},${k === 2 ? '-' : kwh(k)},${lag(k)},0`)].join('\n') + '\n', '"-" marks a missing kWh reading on line 4 (declared in missingValues).', { ...STD_MAPPING, missingValues: ['', '-'] }, {
  ok: true,
  meters: [okMeter(8, DAY0, 15, ['active-missing'], { totalImportKwh: sum(8, kwh) - kwh(2) })],
});
meter('many-bad-rows.csv', [HEADER, ...Array.from({ length: 150 }, (_, k) => `${iso(DAY0 + k * Q)},${kwh(k)}kWh,${lag(k)},0`)].join('\n') + '\n', '150 rows with a unit glued to the number: the first 100 problems are listed, 150 counted.', STD_MAPPING, {
  ok: false,
  problemCodes: ['number-invalid'],
  firstProblemRow: 2,
  totalProblems: 150,
  listedProblems: 100,
});
meter('interval-mismatch.csv', [HEADER, ...dayRows(8)].join('\n') + '\n', 'The mapping states 30-minute intervals; the stamps are 15 minutes apart.', { ...STD_MAPPING, intervalMinutes: 30 }, {
  ok: false,
  problemCodes: ['interval-mismatch'],
  firstProblemRow: 2,
  totalProblems: 1,
});
meter('single-row.csv', [HEADER, ...dayRows(1)].join('\n') + '\n', 'One reading: the interval length cannot be detected unless the mapping states it.', STD_MAPPING, {
  ok: false,
  problemCodes: ['interval-undetectable'],
  firstProblemRow: 2,
  totalProblems: 1,
});
meter('single-row-stated-interval.csv', [HEADER, ...dayRows(1)].join('\n') + '\n', 'One reading with the interval stated in the mapping.', { ...STD_MAPPING, intervalMinutes: 15 }, { ok: true, meters: [okMeter(1, DAY0, 15, [])] });

// ---- bills
const BILL_HEADER = 'Period from,Period to,kWh,Billed demand kW,kvarh,PF,PF charge,Total';
const BILL_MAPPING = { version: 1, delimiter: ',', decimalSeparator: '.', dateFormat: 'iso', billedDemandUnit: 'kW', currency: 'USD', columns: { periodStart: 'Period from', periodEnd: 'Period to', kwh: 'kWh', billedDemand: 'Billed demand kW', kvarh: 'kvarh', powerFactor: 'PF', pfCharge: 'PF charge', total: 'Total' } };
const billRows = [
  '2025-01-07,2025-02-05,412000,980.5,290000,0.818,1204.50,48120.33',
  '2025-02-06,2025-03-06,398500,975.0,281000,0.817,1190.00,46980.10',
  '2025-03-07,2025-04-04,405200,990.2,270300,0.832,980.25,47511.00',
];
bill('bills-ok.csv', [BILL_HEADER, ...billRows].join('\n') + '\n', 'Three bills on reading dates (7th, 6th, 7th), not calendar months.', BILL_MAPPING, { ok: true, bills: 3, firstPeriod: ['2025-01-07', '2025-02-05'], warnings: [] });
bill('bills-dmy-comma.csv', ['Bill from;Bill to;Units kWh;Maximum demand kVA;PF;PF charge;Total;Currency', '09/01/2025;06/02/2025;316.000;1.117,2;0,846;£1.204,50;£38.200,00;GBP', '07/02/2025;06/03/2025;302.977;1.100,7;0,847;£1.150,00;£36.900,10;GBP'].join('\n') + '\n', 'Semicolons, day-first dates, decimal commas and thousands points, pound signs.', {
  version: 1, delimiter: ';', decimalSeparator: ',', thousandsSeparator: '.', dateFormat: 'dmy', billedDemandUnit: 'kVA', columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Units kWh', billedDemand: 'Maximum demand kVA', powerFactor: 'PF', pfCharge: 'PF charge', total: 'Total', currency: 'Currency' },
}, { ok: true, bills: 2, firstPeriod: ['2025-01-09', '2025-02-06'], firstKwh: 316000, firstDemand: 1117.2, firstPfCharge: 1204.5, warnings: [] });
bill('bills-gap-overlap.csv', [BILL_HEADER, billRows[0], '2025-02-10,2025-03-06,398500,975.0,281000,0.817,1190.00,46980.10', '2025-03-01,2025-04-04,405200,990.2,270300,0.832,980.25,47511.00'].join('\n') + '\n', 'A gap of four days before the second bill and an overlap before the third.', BILL_MAPPING, { ok: true, bills: 3, warnings: ['period-gap', 'period-overlap'] });
bill('bills-pf-percent-unset.csv', [BILL_HEADER, '2025-01-07,2025-02-05,412000,980.5,290000,81.8,1204.50,48120.33'].join('\n') + '\n', 'PF printed as 81.8 (percent) with the fraction setting.', BILL_MAPPING, { ok: false, problemCodes: ['value-out-of-range'], firstProblemRow: 2, totalProblems: 1 });
bill('bills-end-before-start.csv', [BILL_HEADER, '2025-02-05,2025-01-07,412000,980.5,290000,0.818,1204.50,48120.33'].join('\n') + '\n', 'Start and end swapped.', BILL_MAPPING, { ok: false, problemCodes: ['period-invalid'], firstProblemRow: 2, totalProblems: 1 });
bill('bills-text-in-kwh.csv', [BILL_HEADER, billRows[0], '2025-02-06,2025-03-06,see note,975.0,281000,0.817,1190.00,46980.10'].join('\n') + '\n', 'Text in the kWh column on line 3.', BILL_MAPPING, { ok: false, problemCodes: ['number-invalid'], firstProblemRow: 3, totalProblems: 1 });
bill('bills-negative-kwh.csv', [BILL_HEADER, '2025-01-07,2025-02-05,-412000,980.5,290000,0.818,1204.50,48120.33'].join('\n') + '\n', 'Negative billed kWh.', BILL_MAPPING, { ok: false, problemCodes: ['value-out-of-range'], firstProblemRow: 2, totalProblems: 1 });

const catalogue = {
  version: 1,
  description:
    'Invented interval-meter and bill-history files with the mapping that reads each and the outcome the importer must give. Paths are relative to the repository root. For ok files: per meter, interval count (present), interval length, first start and last end (ISO 8601 UTC), and the exact set of quality finding codes; other keys are extra checks. For failing files: the set of problem codes, the first problem row (1-based line, null for whole-file problems) and the total number of problems.',
  meterFiles: meterEntries,
  billFiles: billEntries,
};
writeFileSync(`${METER_DIR}catalogue.json`, JSON.stringify(catalogue, null, 2) + '\n');
console.log(`${meterEntries.length} meter fixtures, ${billEntries.length} bill fixtures written.`);
