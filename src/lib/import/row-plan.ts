/**
 * The per-row work of a meter import, compiled once from the mapping and the header:
 * column indices, unit factors and readers. `handle` runs for every data row.
 */
import { headerIndex, refLabel, type HeaderIndex } from './columns';
import type { ChannelSet, ColumnRef, MeterMapping } from './mapping-schema';
import { ClockContext, MeterRows } from './meter-accumulator';
import { numberReader, type NumberReader } from './numbers';
import { ProblemList, rowLabel } from './problems';
import { stampReader, type StampOut, type StampReader } from './stamps';
import { unitInfo } from './units';
import type { ZoneResolver } from './zone-resolver';

interface SetPlan {
  set: ChannelSet;
  active: number;
  activeFactor: number;
  /** Column indices of the reactive channels in mapping order (lag, lead / q1..q4 / net). */
  reactive: number[];
  reactiveFactor: number;
  apparent: number;
  apparentFactor: number;
  pf: number;
  rows: MeterRows | null;
}

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'vertical bar' };

export class RowPlan {
  readonly header: HeaderIndex;
  private readonly sets: SetPlan[] = [];
  private stampCol = -1;
  private timeCol = -1;
  private idCol = -1;
  private maxIndex = 0;
  private readonly readNumber: NumberReader;
  private readonly readStamp: StampReader;
  private readonly out: StampOut = { ms: 0, offsetMin: Number.NaN };
  private readonly sharedClock = new ClockContext();
  readonly meters = new Map<string, MeterRows>();
  /** False when the header does not fit the mapping (problems added). */
  readonly usable: boolean;

  constructor(
    private readonly m: MeterMapping,
    headerCells: string[] | null,
    width: number,
    headerLine: number,
    private readonly zone: ZoneResolver | null,
    private readonly problems: ProblemList,
  ) {
    this.header = headerIndex(headerCells, width);
    this.readNumber = numberReader(m.decimalSeparator, m.missingValues);
    this.readStamp = stampReader(m.timestamp, m.decimalSeparator);
    this.usable = this.resolveColumns(width, headerLine);
  }

  private col(ref: ColumnRef, what: string, missing: [string, ColumnRef][]): number {
    const i = this.header.find(ref);
    if (i < 0) missing.push([what, ref]);
    else this.maxIndex = Math.max(this.maxIndex, i);
    return i;
  }

  private resolveColumns(width: number, line: number): boolean {
    const m = this.m;
    // Every mapping needs at least a stamp and an active column, so one column means the wrong delimiter.
    if (width === 1) {
      const cell = this.header.labels[0] ?? '';
      const other = [',', ';', '\t', '|'].find((d) => d !== m.delimiter && cell.includes(d));
      const hint = other ? ` The line contains ${DELIMITER_NAMES[other]}s: set the delimiter to ${DELIMITER_NAMES[other]}.` : ' Check the delimiter setting.';
      this.problems.add('single-column', line, null, cell, `${rowLabel(line)}: the ${m.hasHeader ? 'header' : 'first row'} splits into one column only with the ${DELIMITER_NAMES[m.delimiter]} delimiter.${hint}`);
      return false;
    }
    const missing: [string, ColumnRef][] = [];
    this.stampCol = this.col(m.timestamp.column, 'timestamp', missing);
    if (m.timestamp.timeColumn !== undefined) this.timeCol = this.col(m.timestamp.timeColumn, 'time', missing);
    if (m.meterIdColumn !== undefined) this.idCol = this.col(m.meterIdColumn, 'meter id', missing);
    for (const set of m.meters) {
      const r = set.reactive;
      const refs: [ColumnRef, string][] =
        r.kind === 'none' ? [] : r.kind === 'net' ? [[r.column, 'net reactive']] : r.kind === 'lagging-only' ? [[r.lag, 'lagging reactive']] : r.kind === 'lag-lead' ? [[r.lag, 'lagging reactive'], [r.lead, 'leading reactive']] : [[r.q1, 'Q1'], [r.q2, 'Q2'], [r.q3, 'Q3'], [r.q4, 'Q4']];
      this.sets.push({
        set,
        active: this.col(set.active.column, 'active', missing),
        activeFactor: unitInfo(set.active.unit).toKilo * set.multiplier,
        reactive: refs.map(([ref, what]) => this.col(ref, what, missing)),
        reactiveFactor: r.kind === 'none' ? 0 : unitInfo(r.unit).toKilo * set.multiplier,
        apparent: set.apparent ? this.col(set.apparent.column, 'kVA', missing) : -1,
        apparentFactor: set.apparent ? unitInfo(set.apparent.unit).toKilo * set.multiplier : 0,
        pf: set.powerFactor ? this.col(set.powerFactor.column, 'PF', missing) : -1,
        rows: null,
      });
    }
    if (missing.length) {
      const have = this.header.labels.map((l) => `"${l}"`).join(', ');
      for (const [what, ref] of missing) {
        this.problems.add('column-missing', line, String(ref), null, `${rowLabel(line)}: the ${what} column ${refLabel(ref)} is not in the ${m.hasHeader ? 'header' : 'file'}. The file has ${have}. Correct the mapping or upload the export that has this column.`);
      }
      return false;
    }
    if (this.idCol < 0) {
      for (const s of this.sets) {
        s.rows = new MeterRows(s.set.meterId, this.sharedClock, s.apparent >= 0, s.pf >= 0);
        this.meters.set(s.set.meterId, s.rows);
      }
    }
    return true;
  }

  /** Reads one data row into the meters' columns, adding a problem for every bad cell. */
  handle(fields: string[], line: number): void {
    const problems = this.problems;
    if (fields.length <= this.maxIndex) {
      problems.add('row-too-short', line, null, null, `${rowLabel(line)}: the row has ${fields.length} field${fields.length === 1 ? '' : 's'} but the mapping needs ${this.maxIndex + 1}. Check the delimiter, or remove the line if it is a note or a total.`);
      return;
    }
    const dateText = fields[this.stampCol];
    const timeText = this.timeCol >= 0 ? fields[this.timeCol] : undefined;
    const out = this.out;
    if (!this.readStamp(dateText, timeText, out)) {
      this.badStamp(line, timeText === undefined ? dateText : `${dateText} ${timeText}`);
      return;
    }
    let only: MeterRows | null = null;
    if (this.idCol >= 0) {
      const id = fields[this.idCol].trim();
      if (!id) {
        problems.add('meter-id-missing', line, this.header.labels[this.idCol], '', `${rowLabel(line)}: the meter id cell is empty. Fill it in or remove the row.`);
        return;
      }
      only = this.meters.get(id) ?? null;
      if (!only) {
        const s = this.sets[0];
        only = new MeterRows(id, new ClockContext(), s.apparent >= 0, s.pf >= 0);
        this.meters.set(id, only);
      }
    }
    const instant = this.instant(out, only ? only.clock : this.sharedClock, line, dateText, timeText);
    if (instant !== instant) return;
    for (let k = 0; k < this.sets.length; k++) {
      const s = this.sets[k];
      this.readSet(s, only ?? (s.rows as MeterRows), fields, line, instant);
    }
  }

  private readSet(s: SetPlan, rows: MeterRows, fields: string[], line: number, instant: number): void {
    const a = this.num(fields, s.active, line);
    if (a === null) return;
    let ra = Number.NaN;
    let rb = Number.NaN;
    const kind = s.set.reactive.kind;
    if (kind !== 'none') {
      const v0 = this.num(fields, s.reactive[0], line);
      if (v0 === null) return;
      if (kind === 'net') ra = v0;
      else {
        if (v0 < 0 && !this.negativeRegister(fields, s.reactive[0], line, kind)) return;
        if (kind === 'lagging-only') {
          ra = v0;
          rb = v0 === v0 ? 0 : Number.NaN;
        } else if (kind === 'lag-lead') {
          const v1 = this.num(fields, s.reactive[1], line);
          if (v1 === null || (v1 < 0 && !this.negativeRegister(fields, s.reactive[1], line, kind))) return;
          ra = v0;
          rb = v1;
        } else {
          const q = [v0, 0, 0, 0];
          for (let j = 1; j < 4; j++) {
            const v = this.num(fields, s.reactive[j], line);
            if (v === null || (v < 0 && !this.negativeRegister(fields, s.reactive[j], line, kind))) return;
            q[j] = v;
          }
          ra = q[0] + q[1];
          rb = q[2] + q[3];
          if (q[1] > 0 || q[2] > 0) rows.exportQuadrantRows++;
        }
      }
    }
    let apparent = Number.NaN;
    if (s.apparent >= 0) {
      const v = this.num(fields, s.apparent, line);
      if (v === null) return;
      apparent = v * s.apparentFactor;
    }
    let pf = Number.NaN;
    if (s.pf >= 0) {
      const v = this.num(fields, s.pf, line);
      if (v === null) return;
      pf = v;
    }
    rows.append(instant, line, a * s.activeFactor, ra * s.reactiveFactor, rb * s.reactiveFactor);
    rows.apparent?.push(apparent);
    rows.pf?.push(pf);
  }

  private num(fields: string[], index: number, line: number): number | null {
    const text = fields[index];
    const v = this.readNumber(text);
    if (v !== null) return v;
    const label = this.header.labels[index];
    const t = text.trim();
    let hint = 'Replace it with a number, or leave the cell empty if there was no reading.';
    if (this.m.decimalSeparator === '.' && /^[+-]?\d+,\d+$/.test(t)) hint = 'Set the decimal separator to comma or fix the file.';
    else if (this.m.decimalSeparator === ',' && /^[+-]?\d+\.\d+$/.test(t)) hint = 'Set the decimal separator to point or fix the file.';
    else if (/^[+-]?\d{1,3}([,.'\s]\d{3})+([.,]\d+)?$/.test(t)) hint = 'Remove the thousands separators or fix the file.';
    this.problems.add('number-invalid', line, label, text, `${rowLabel(line)}: ${label} is not a number ("${t}"). ${hint}`);
    return null;
  }

  private negativeRegister(fields: string[], index: number, line: number, kind: string): false {
    const label = this.header.labels[index];
    const what = kind === 'quadrants' ? 'a quadrant register' : kind === 'lagging-only' ? 'a lagging-only register' : 'a lagging or leading register';
    this.problems.add('register-negative', line, label, fields[index], `${rowLabel(line)}: ${label} is negative ("${fields[index].trim()}") but the mapping reads it as ${what}, which cannot go below zero. Map it as a net signed kvarh channel if negative means leading, or fix the file.`);
    return false;
  }

  private badStamp(line: number, text: string): void {
    const t = this.m.timestamp;
    const layout =
      t.format === 'iso'
        ? 'an ISO 8601 date and time like 2025-03-01T00:15 or 2025-03-01 00:15+01:00'
        : t.format === 'excel-serial'
          ? 'a spreadsheet serial date like 45717.0104'
          : `a ${t.dateOrder === 'dmy' ? 'day-first date like 01/03/2025' : t.dateOrder === 'mdy' ? 'month-first date like 03/01/2025' : 'year-first date like 2025/03/01'} with a time like 00:15`;
    const label = this.header.labels[this.stampCol];
    this.problems.add('stamp-invalid', line, label, text, `${rowLabel(line)}: the timestamp "${text.trim()}" is not ${layout}. Check the timestamp format and date order, or fix the file.`);
  }

  /** UTC instant of the stamp as written, or NaN after adding a problem. */
  private instant(out: StampOut, clock: ClockContext, line: number, dateText: string, timeText: string | undefined): number {
    const t = this.m.timestamp;
    if (out.offsetMin === out.offsetMin) return out.ms;
    if (t.zone === 'utc') return out.ms;
    if (t.zone === 'offset-in-stamp') {
      const text = writtenStamp(dateText, timeText);
      this.problems.add('stamp-offset-missing', line, this.header.labels[this.stampCol], text, `${rowLabel(line)}: the timestamp "${text}" has no UTC offset, but the mapping expects Z or +HH:MM on every stamp. Set the timestamps to UTC or to local time for this file.`);
      return Number.NaN;
    }
    const zone = this.zone as ZoneResolver;
    if (t.zone === 'local-standard') return out.ms - zone.standardOffset(out.ms) * 60_000;
    const unique = zone.resolveUnique(out.ms);
    if (unique === unique) return unique;
    const r = zone.resolve(out.ms);
    if (r.kind === 'unique') return r.ms;
    if (r.kind === 'skipped') {
      const text = writtenStamp(dateText, timeText);
      this.problems.add('stamp-in-dst-gap', line, this.header.labels[this.stampCol], text, `${rowLabel(line)}: ${text} does not exist in ${zone.zoneName}: the clocks went forward over it. If the file is in standard time all year, set the timestamps to local standard time; otherwise remove the row.`);
      return Number.NaN;
    }
    const seen = clock.repeatedSeen.get(out.ms) ?? 0;
    clock.repeatedSeen.set(out.ms, seen + 1);
    if (clock.firstRows.length < 10) clock.firstRows.push(line);
    if (seen === 0) {
      clock.readEarlier++;
      return r.earlier;
    }
    clock.readLater++;
    return r.later;
  }
}

/** The stamp as written, for messages (date and time joined when they are two columns). */
function writtenStamp(dateText: string, timeText: string | undefined): string {
  return (timeText === undefined ? dateText : `${dateText} ${timeText}`).trim();
}

export { headerIndex };
