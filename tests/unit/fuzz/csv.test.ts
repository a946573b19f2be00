/**
 * Generated files through the CSV import library: random bytes, random text, and valid meter and
 * bill exports broken a little (a cell, a line, a quote, a BOM, a NUL, a cut), fed in random
 * chunks, with valid and mutated mappings. Each read finishes with the library's own result
 * (ok, or problems), never a throw; every problem has a line of the file or is file-level; an
 * accepted meter series holds finite numbers only. Inputs are bounded (a few KB, two days of
 * quarter-hours), so a run cannot take long; fixed seeds, and the run count is printed.
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DateTime } from 'luxon';
import { parseBillCsv, parseMeterCsv, proposeMapping, MAX_PROBLEMS, type ImportProblem } from '@/lib/import';
import { billCsv, meterCsv, validBillMapping, validMeterMapping } from './examples';
import { edgeValue, mutated } from './mutate';

// FUZZ_RUNS and FUZZ_SEED explore further by hand; CI runs the fixed default.
const RUNS = Number(process.env.FUZZ_RUNS ?? 250);
const SEED = Number(process.env.FUZZ_SEED ?? 0);
let total = 0;
let interrupted = 0;
// A property stopped by its time limit (a slow machine) passes with fewer runs; the count says so.
afterAll(() => console.log(`fuzz-csv: ${total} runs${interrupted ? ` (${interrupted} properties stopped at their time limit)` : ''}`));

async function check<T>(name: string, arb: fc.Arbitrary<T>, prop: (v: T) => Promise<void> | void, runs = RUNS) {
  let seed = 7;
  for (const ch of name) seed = (seed * 31 + ch.charCodeAt(0)) | 0;
  const out = await fc.check(fc.asyncProperty(arb, async (v) => prop(v)), { seed: seed + SEED, numRuns: runs, interruptAfterTimeLimit: 60_000 });
  total += out.numRuns;
  if (out.interrupted) interrupted++;
  if (out.failed) throw new Error(`${name}: seed ${seed + SEED}, path ${out.counterexamplePath}: ${fc.stringify(out.counterexample).slice(0, 2000)}\n${out.errorInstance instanceof Error ? out.errorInstance.stack : String(out.errorInstance)}`);
}

const lineCount = (input: Uint8Array | string) => {
  const text = typeof input === 'string' ? input : Buffer.from(input).toString('latin1');
  return text.split(/\r\n|\r|\n/).length;
};

/** What every failure of the library looks like. */
function problemsAreWellFormed(problems: ImportProblem[], totalProblems: number, lines: number) {
  expect(problems.length).toBeGreaterThan(0);
  expect(problems.length).toBeLessThanOrEqual(MAX_PROBLEMS);
  expect(totalProblems).toBeGreaterThanOrEqual(problems.length);
  for (const p of problems) {
    if (p.row !== null) {
      expect(Number.isInteger(p.row), JSON.stringify(p)).toBe(true);
      expect(p.row, JSON.stringify(p)).toBeGreaterThanOrEqual(1);
      expect(p.row, JSON.stringify(p)).toBeLessThanOrEqual(lines + 1);
    }
    expect(typeof p.code).toBe('string');
    expect(p.message.length, JSON.stringify(p)).toBeGreaterThan(10);
    if (p.value !== null) expect(p.value.length).toBeLessThanOrEqual(61);
  }
}

/** Splits a file into chunks at the given cut points (inside fields, CRLF pairs and multi-byte characters). */
function chunked(bytes: Uint8Array, cuts: number[]): Uint8Array[] {
  const at = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
  const out: Uint8Array[] = [];
  let prev = 0;
  for (const c of [...at, bytes.length]) {
    out.push(bytes.subarray(prev, c));
    prev = c;
  }
  return out;
}

async function meter(input: Uint8Array, cuts: number[], mapping: unknown, zone?: string) {
  const r = await parseMeterCsv(chunked(input, cuts), mapping as never, { siteTimeZone: zone });
  if (!r.ok) return problemsAreWellFormed(r.problems, r.totalProblems, lineCount(input));
  for (const m of r.meters) {
    for (const k of ['stamps', 'active'] as const) for (const v of Array.from(m.series[k])) expect(Number.isFinite(v) || Number.isNaN(v)).toBe(true);
    expect(m.lines.length).toBe(m.series.stamps.length);
  }
}

async function bills(input: Uint8Array, cuts: number[], mapping: unknown) {
  const r = await parseBillCsv(chunked(input, cuts), mapping as never);
  if (!r.ok) return problemsAreWellFormed(r.problems, r.totalProblems, lineCount(input));
  for (const b of r.bills) {
    expect(Number.isFinite(b.kwh)).toBe(true);
    expect(b.periodEnd > b.periodStart).toBe(true);
  }
}

const enc = new TextEncoder();
const cuts = fc.array(fc.nat({ max: 20_000 }), { maxLength: 12 });
const zone = fc.constantFrom(undefined, 'UTC', 'Europe/London', 'America/Chicago', 'Australia/Lord_Howe', 'Asia/Kathmandu', 'Not/AZone');

/** Edits a file line by line: a cell replaced, a line dropped, doubled, moved or cut, bytes that do not belong. */
type Edit = { kind: 'cell' | 'drop' | 'double' | 'swap' | 'insert' | 'cut' | 'bytes'; line: number; col: number; text: string; other: number };
const cellText = fc.oneof(edgeValue.map(String), fc.string({ maxLength: 12 }), fc.constantFrom('"', '""', '"a,b"', ',', ';', '\t', '\r', '\n', '\r\n', '-', '-0', '1,5', '1.2.3', 'NaN', '   ', '2025-03-01T00:00:00', '2025-03-01 00:00', '2025-03-30T01:30:00+01:00', '2025-03-01T00:00:00Z', '45717.5', '12/31/2025 24:00', '﻿'));
const edit: fc.Arbitrary<Edit> = fc.record({ kind: fc.constantFrom('cell', 'cell', 'cell', 'drop', 'double', 'swap', 'insert', 'cut', 'bytes'), line: fc.nat(), col: fc.nat({ max: 8 }), text: cellText, other: fc.nat() });

function applyEdits(file: string, edits: Edit[], delimiter = ','): Uint8Array {
  let lines = file.split('\n');
  let tail: Uint8Array | null = null;
  for (const e of edits) {
    const i = e.line % lines.length;
    const j = e.other % lines.length;
    switch (e.kind) {
      case 'cell': {
        const cells = lines[i]!.split(delimiter);
        cells[e.col % Math.max(cells.length, 1)] = e.text;
        lines[i] = cells.join(delimiter);
        break;
      }
      case 'drop':
        lines.splice(i, 1);
        break;
      case 'double':
        lines.splice(i, 0, lines[i]!);
        break;
      case 'swap':
        [lines[i], lines[j]] = [lines[j]!, lines[i]!];
        break;
      case 'insert':
        lines.splice(i, 0, e.text);
        break;
      case 'cut':
        lines = lines.join('\n').slice(0, e.other % (lines.join('\n').length + 1)).split('\n');
        break;
      case 'bytes':
        tail = Uint8Array.of([0xef, 0xbb, 0xbf, 0x00, 0xc3, 0x28, 0xff, 0x0d][e.col % 8]!);
        break;
    }
    if (lines.length === 0) lines = [''];
  }
  const body = enc.encode(lines.join('\n'));
  if (!tail) return body;
  const out = new Uint8Array(body.length + 1);
  const at = edits[0]!.other % (body.length + 1);
  out.set(body.subarray(0, at));
  out.set(tail, at);
  out.set(body.subarray(at), at + 1);
  return out;
}


/**
 * A meter export generated together with its mapping: zone (clock changes of an hour and of
 * half an hour), stamp layout (ISO with offset, local ISO, day-first or month-first with a
 * separate time column, Excel serials), interval, start or end stamps, units, multiplier and
 * reactive layout, starting shortly before a clock change.
 */
/** The zone's standard-time offset, minutes: the smaller of its January and July offsets. */
const standardOffset = (zone: string) => Math.min(...[1, 7].map((month) => DateTime.fromObject({ year: 2025, month, day: 15 }, { zone }).offset));

const generatedExport = fc
  .record({
    zone: fc.constantFrom('Europe/London', 'America/Chicago', 'Australia/Lord_Howe', 'UTC', 'Asia/Kathmandu'),
    layout: fc.constantFrom('iso-offset', 'iso-local', 'iso-local-standard', 'dmy-split', 'mdy', 'excel', 'utc'),
    start: fc.constantFrom('2025-03-29T22:00:00Z', '2025-10-25T22:00:00Z', '2025-03-09T04:00:00Z', '2025-11-02T03:00:00Z', '2025-04-05T13:00:00Z', '2025-10-04T14:00:00Z', '2024-02-28T20:00:00Z'),
    minutes: fc.constantFrom(5, 15, 30, 60),
    count: fc.integer({ min: 0, max: 300 }),
    stampAt: fc.constantFrom('start', 'end'),
    active: fc.constantFrom('kWh', 'kW', 'Wh', 'MW'),
    reactive: fc.constantFrom('lag-lead', 'net', 'lagging-only', 'quadrants', 'none'),
    multiplier: fc.constantFrom(1, 40, 640, 0.001),
    delimiter: fc.constantFrom(',', ';', '\t'),
    comma: fc.boolean(),
    values: fc.array(fc.oneof(fc.double({ min: -50, max: 500, noNaN: true }), fc.constantFrom(0, 0, 1e-9)), { minLength: 1, maxLength: 20 }),
  })
  .map((g) => {
    const comma = g.comma && g.delimiter !== ',';
    const num = (v: number) => (comma ? String(v).replace('.', ',') : String(v));
    const rows: string[] = [];
    const t0 = Date.parse(g.start);
    const reactiveCols = { 'lag-lead': ['lag', 'lead'], net: ['net'], 'lagging-only': ['lag'], quadrants: ['q1', 'q2', 'q3', 'q4'], none: [] }[g.reactive];
    const split = g.layout === 'dmy-split';
    rows.push([split ? 'Date' : 'Stamp', ...(split ? ['Time'] : []), 'P', ...reactiveCols].join(g.delimiter));
    for (let i = 0; i < g.count; i++) {
      const ms = t0 + (i + (g.stampAt === 'end' ? 1 : 0)) * g.minutes * 60_000;
      const utc = DateTime.fromMillis(ms, { zone: 'utc' });
      const local = utc.setZone(g.zone);
      const standard = utc.plus({ minutes: standardOffset(g.zone) });
      const stamp = {
        'iso-offset': local.toISO({ suppressMilliseconds: true })!,
        'iso-local': local.toFormat("yyyy-LL-dd'T'HH:mm"),
        'iso-local-standard': standard.toFormat("yyyy-LL-dd'T'HH:mm"),
        'dmy-split': `${local.toFormat('dd/LL/yyyy')}${g.delimiter}${local.toFormat('HH:mm')}`,
        mdy: local.toFormat('LL/dd/yyyy h:mm a'),
        excel: num(Math.round(((local.toMillis() + local.offset * 60_000) / 86_400_000 + 25569) * 1e8) / 1e8),
        utc: utc.toFormat('yyyy-LL-dd HH:mm:ss'),
      }[g.layout];
      const v = (k: number) => num(g.values[(i + k) % g.values.length]!);
      rows.push([stamp, v(0), ...reactiveCols.map((_, k) => v(k + 1))].join(g.delimiter));
    }
    const format = g.layout.startsWith('iso') || g.layout === 'utc' ? 'iso' : g.layout === 'excel' ? 'excel-serial' : 'date-time';
    const zoneKind = g.layout === 'iso-offset' ? 'offset-in-stamp' : g.layout === 'utc' ? 'utc' : g.layout === 'iso-local-standard' ? 'local-standard' : 'local';
    const unit = /h$/.test(g.active) ? 'kvarh' : 'kvar';
    const reactive =
      g.reactive === 'none' ? { kind: 'none' } : g.reactive === 'net' ? { kind: 'net', column: 'net', unit } : g.reactive === 'lagging-only' ? { kind: 'lagging-only', lag: 'lag', unit } : g.reactive === 'quadrants' ? { kind: 'quadrants', q1: 'q1', q2: 'q2', q3: 'q3', q4: 'q4', unit } : { kind: 'lag-lead', lag: 'lag', lead: 'lead', unit };
    const mapping = {
      version: 1,
      delimiter: g.delimiter,
      decimalSeparator: comma ? ',' : '.',
      timestamp: { column: split ? 'Date' : 'Stamp', ...(split ? { timeColumn: 'Time' } : {}), format, ...(format === 'date-time' ? { dateOrder: split ? 'dmy' : 'mdy' } : {}), zone: zoneKind, ...(zoneKind.startsWith('local') ? { timeZone: g.zone } : {}), stampAt: g.stampAt },
      meters: [{ meterId: 'Generated', active: { column: 'P', unit: g.active }, reactive, multiplier: g.multiplier }],
    };
    return { text: rows.join('\n') + '\n', mapping, zone: g.zone };
  });

describe('meter export reader', () => {
  it('random bytes, any chunking, a valid mapping: a result, never a throw', () =>
    check('meter bytes', fc.tuple(fc.uint8Array({ maxLength: 4096 }), cuts, zone), ([b, c, z]) => meter(b, c, validMeterMapping(), z)), 120_000);
  it('random text (any code points, CR/LF mixes): a result, never a throw', () =>
    check('meter text', fc.tuple(fc.string({ unit: 'binary', maxLength: 2000 }), cuts), ([t, c]) => meter(enc.encode(t), c, validMeterMapping())), 120_000);
  it('text made of CSV-looking tokens: a result, never a throw', () =>
    check('meter tokens', fc.tuple(fc.array(cellText, { maxLength: 400 }).map((a) => a.join('')), cuts), ([t, c]) => meter(enc.encode(`Start,kWh,kvarh lag,kvarh lead,kVA,PF\n${t}`), c, validMeterMapping())), 120_000);
  it('a valid export edited: a result, never a throw, problems on lines of the file', () =>
    check('meter edited', fc.tuple(fc.array(edit, { minLength: 1, maxLength: 6 }), cuts, zone), ([e, c, z]) => meter(applyEdits(meterCsv(2), e), c, validMeterMapping(), z)), 120_000);
  it('generated exports (zones, clock changes, layouts, units), edited or not: a result, never a throw', () =>
    check('meter generated', fc.tuple(generatedExport, fc.array(edit, { maxLength: 3 }), cuts), async ([g, e, c]) => {
      const bytes = e.length ? applyEdits(g.text, e, g.mapping.delimiter) : enc.encode(g.text);
      await meter(bytes, c, g.mapping, g.zone);
    }), 120_000);
  it('a valid export with a mutated mapping: a result, never a throw', () =>
    check('meter mapping', fc.tuple(mutated(validMeterMapping), cuts), ([m, c]) => meter(enc.encode(meterCsv(1)), c, m)), 120_000);
  it('the mapping step proposes from any head without throwing', () =>
    check('propose', fc.tuple(fc.oneof(fc.string({ unit: 'binary', maxLength: 3000 }), fc.tuple(fc.array(edit, { maxLength: 6 })).map(([e]) => new TextDecoder().decode(applyEdits(meterCsv(1), e)))), fc.boolean(), fc.constantFrom(undefined, 'ymd', 'dmy', 'mdy')), ([head, truncated, dateOrder]) => {
      const p = proposeMapping(head, { timeZone: 'Europe/London', truncated, dateOrder });
      expect(typeof p.ok).toBe('boolean');
      for (const q of p.problems) expect(q.message.length).toBeGreaterThan(10);
    }), 120_000);
});

describe('bill history reader', () => {
  it('random bytes, any chunking: a result, never a throw', () =>
    check('bill bytes', fc.tuple(fc.uint8Array({ maxLength: 4096 }), cuts), ([b, c]) => bills(b, c, validBillMapping())), 120_000);
  it('random text: a result, never a throw', () =>
    check('bill text', fc.tuple(fc.string({ unit: 'binary', maxLength: 2000 }), cuts), ([t, c]) => bills(enc.encode(t), c, validBillMapping())), 120_000);
  it('a valid history edited: a result, never a throw, problems on lines of the file', () =>
    check('bill edited', fc.tuple(fc.array(edit, { minLength: 1, maxLength: 6 }), cuts), ([e, c]) => bills(applyEdits(billCsv(), e), c, validBillMapping())), 120_000);
  it('a valid history with a mutated mapping: a result, never a throw', () =>
    check('bill mapping', fc.tuple(mutated(validBillMapping), cuts), ([m, c]) => bills(enc.encode(billCsv()), c, m)), 120_000);
});
