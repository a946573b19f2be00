/**
 * The data-quality report of one meter: a plain JSON object the web layer stores with the
 * upload. Only warnings and facts here; errors never reach it (they block the import).
 * Rules are stated in the report itself so a reader knows what was counted.
 */
import type { FinishedMeter } from './finish-meter';
import { fmtMinutes } from './finish-meter';
import type { MeterMapping } from './mapping-schema';
import { isoUtc } from './stamps';
import type { ClockContext } from './meter-accumulator';
import { dstDays, type DstDay } from './dst-days';
import { findings } from './quality-findings';
import type { ZoneResolver } from './zone-resolver';

const FIRST = 10;

/** A count with the first file rows concerned. */
export interface RowCount {
  count: number;
  firstRows: number[];
}

export interface Gap {
  /** Row of the last interval before the gap and of the first after it. */
  afterRow: number;
  beforeRow: number;
  /** Start of the first missing interval and end of the last one, ISO 8601 UTC. */
  fromUtc: string;
  toUtc: string;
  missingIntervals: number;
}

export interface RowRange {
  fromRow: number;
  toRow: number;
  fromUtc: string;
  toUtc: string;
  intervals: number;
}

export interface Finding {
  code: string;
  severity: 'warning' | 'info';
  message: string;
  count: number;
  firstRows: number[];
}

export interface MeterQuality {
  meterId: string;
  intervalMinutes: number;
  intervalSource: 'detected' | 'mapping';
  /** Share of stamp spacings equal to the interval (1 = no gaps). */
  modalShare: number;
  period: { firstStartUtc: string; lastEndUtc: string };
  intervals: { expected: number; present: number; missing: number };
  gaps: { count: number; missingIntervals: number; first: Gap[] };
  duplicates: { identicalDropped: number; first: { row: number; firstRow: number }[] };
  rowsOutOfOrder: number;
  timestamps: {
    zone: MeterMapping['timestamp']['zone'];
    timeZone: string | null;
    stampAt: 'start' | 'end';
    /** Stamps that fell in a repeated (clocks-back) hour and how they were read. */
    repeatedHour: { stamps: number; readAsEarlierOffset: number; readAsLaterOffset: number; firstRows: number[] };
    /** Local days with a clock change in the data's span, with their interval counts. */
    dstDays: DstDay[];
    note: string;
  };
  active: {
    totalImportKwh: number;
    totalExportKwh: number;
    missing: RowCount;
    zero: RowCount;
    /** Intervals with negative kWh (export, e.g. on-site solar). */
    export: RowCount;
    spikes: RowCount & { rule: string; thresholdKwh: number | null };
  };
  reactive: {
    mapping: MeterMapping['meters'][number]['reactive']['kind'];
    netOnly: boolean;
    totalLagKvarh: number;
    totalLeadKvarh: number;
    missing: { count: number; ranges: RowRange[] };
    leadingIntervals: number;
    /** Intervals with Q2 or Q3 energy (reactive while exporting), four-quadrant files only. */
    exportQuadrantIntervals: number;
  };
  pf: {
    /** kWh / sqrt(kWh^2 + kvarh^2) over all importing intervals, lagging kvarh only; null without reactive data. */
    averageLagging: number | null;
    implausible: RowCount & { rule: string };
    kvarWithZeroKw: RowCount;
  };
  crossChecks: {
    apparent: (RowCount & { checked: number; rule: string }) | null;
    printedPf: (RowCount & { checked: number; rule: string }) | null;
  };
  findings: Finding[];
}

function counter(): RowCount {
  return { count: 0, firstRows: [] };
}
function hit(c: RowCount, row: number): void {
  c.count++;
  if (c.firstRows.length < FIRST) c.firstRows.push(row);
}

/** Spike rule: kWh above 5 x the 99th percentile of the meter's importing intervals (and above 1 kWh). */
export const SPIKE_FACTOR = 5;
/** Implausible PF rule: an importing interval with PF below 0.3. */
export const PF_IMPLAUSIBLE = 0.3;

/** The value at rank floor(p x (n - 1)) of `values` (nearest-rank, no interpolation); quickselect on `values` in place. */
export function percentile(values: Float64Array, p: number): number {
  const n = values.length;
  if (n === 0) return Number.NaN;
  const k = Math.min(n - 1, Math.floor(p * (n - 1)));
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >>> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i] = values[j];
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return values[k];
}

export function meterQuality(f: FinishedMeter, m: MeterMapping, clock: ClockContext, zone: ZoneResolver | null): MeterQuality {
  const n = f.startMs.length;
  const step = f.intervalMinutes * 60_000;
  const { startMs, lines, kwh, kvarhA, kvarhB } = f;
  const kind = f.series.reactive.kind;
  const mappingKind = m.meters.find((s) => s.meterId === f.meterId)?.reactive.kind ?? m.meters[0].reactive.kind;

  const gaps: Gap[] = [];
  let gapCount = 0;
  let gapIntervals = 0;
  for (let i = 1; i < n; i++) {
    const d = startMs[i] - startMs[i - 1];
    if (d === step) continue;
    const missing = d / step - 1;
    gapCount++;
    gapIntervals += missing;
    if (gaps.length < 20) gaps.push({ afterRow: lines[i - 1], beforeRow: lines[i], fromUtc: isoUtc(startMs[i - 1] + step), toUtc: isoUtc(startMs[i]), missingIntervals: missing });
  }

  const missingActive = counter();
  const zero = counter();
  const exp = counter();
  let importKwh = 0;
  let exportKwh = 0;
  let positives = 0;
  for (let i = 0; i < n; i++) if (kwh[i] > 0) positives++;
  const pos = new Float64Array(positives);
  for (let i = 0, k = 0; i < n; i++) if (kwh[i] > 0) pos[k++] = kwh[i];
  const p99 = percentile(pos, 0.99);
  const threshold = p99 === p99 ? Math.max(SPIKE_FACTOR * p99, 1) : null;
  const spikes = { ...counter(), rule: `kWh above ${SPIKE_FACTOR} x the meter's 99th-percentile importing interval (and above 1 kWh)`, thresholdKwh: threshold };

  const reactiveMissingRanges: RowRange[] = [];
  let reactiveMissing = 0;
  let runStart = -1;
  let lagTotal = 0;
  let leadTotal = 0;
  let leading = 0;
  let lagForPf = 0;
  let kwhForPf = 0;
  const implausible = { ...counter(), rule: `importing interval with PF below ${PF_IMPLAUSIBLE} (kvarh more than ${(Math.sqrt(1 - PF_IMPLAUSIBLE ** 2) / PF_IMPLAUSIBLE).toFixed(2)} x kWh)` };
  const kvarZero = counter();
  const closeRun = (end: number) => {
    if (runStart < 0) return;
    if (reactiveMissingRanges.length < 20) {
      reactiveMissingRanges.push({ fromRow: lines[runStart], toRow: lines[end], fromUtc: isoUtc(startMs[runStart]), toUtc: isoUtc(startMs[end] + step), intervals: end - runStart + 1 });
    }
    runStart = -1;
  };

  for (let i = 0; i < n; i++) {
    const p = kwh[i];
    if (p !== p) hit(missingActive, lines[i]);
    else if (p === 0) hit(zero, lines[i]);
    else if (p < 0) {
      hit(exp, lines[i]);
      exportKwh -= p;
    } else {
      importKwh += p;
      if (threshold !== null && p > threshold) hit(spikes, lines[i]);
    }
    if (kind === 'none') continue;
    let lag: number;
    let lead: number;
    if (kind === 'net') {
      const q = kvarhA[i];
      lag = q > 0 ? q : 0;
      lead = q < 0 ? -q : 0;
      if (q !== q) lag = lead = Number.NaN;
    } else {
      lag = kvarhA[i];
      lead = kvarhB[i];
    }
    if (lag !== lag || lead !== lead) {
      reactiveMissing++;
      if (runStart < 0) runStart = i;
      continue;
    }
    closeRun(i - 1);
    lagTotal += lag;
    leadTotal += lead;
    if (lead > lag) leading++;
    const q = Math.max(lag, lead);
    if (p === 0 && q > 0) hit(kvarZero, lines[i]);
    if (p > 0) {
      lagForPf += lag;
      kwhForPf += p;
      if (p / Math.sqrt(p * p + q * q) < PF_IMPLAUSIBLE) hit(implausible, lines[i]);
    }
  }
  closeRun(n - 1);

  const apparent = f.kvah ? { ...counter(), checked: 0, rule: 'kVAh differs from sqrt(kWh^2 + kvarh^2) by more than 5% (and 0.01 kVAh)' } : null;
  const printed = f.pfPrinted ? { ...counter(), checked: 0, rule: 'printed PF (percent read as /100, sign ignored) differs from kWh / kVAh by more than 0.02' } : null;
  if ((apparent || printed) && kind !== 'none') {
    for (let i = 0; i < n; i++) {
      const p = kwh[i];
      const q = kind === 'net' ? kvarhA[i] : Math.max(kvarhA[i], kvarhB[i]);
      if (p !== p || q !== q) continue;
      const s = Math.sqrt(p * p + q * q);
      if (apparent && f.kvah) {
        const given = f.kvah[i];
        if (given === given) {
          apparent.checked++;
          if (Math.abs(s - given) > Math.max(0.05 * given, 0.01)) hit(apparent, lines[i]);
        }
      }
      if (printed && f.pfPrinted && s > 0) {
        let given = Math.abs(f.pfPrinted[i]);
        if (given === given) {
          if (given > 1.5) given /= 100;
          printed.checked++;
          if (Math.abs(Math.abs(p) / s - given) > 0.02) hit(printed, lines[i]);
        }
      }
    }
  }

  const first = n ? startMs[0] : 0;
  const last = n ? startMs[n - 1] + step : 0;
  const expected = n ? Math.round((last - first) / step) : 0;
  const days = zone ? dstDays(zone, startMs, f.intervalMinutes) : [];
  const ts = m.timestamp;
  const repeatedStamps = clock.readEarlier + clock.readLater;

  const q: MeterQuality = {
    meterId: f.meterId,
    intervalMinutes: f.intervalMinutes,
    intervalSource: f.intervalSource,
    modalShare: round(f.modalShare, 4),
    period: { firstStartUtc: isoUtc(first), lastEndUtc: isoUtc(last) },
    intervals: { expected, present: n, missing: expected - n },
    gaps: { count: gapCount, missingIntervals: gapIntervals, first: gaps },
    duplicates: { identicalDropped: f.duplicatesIdenticalCount, first: f.duplicatesIdentical },
    rowsOutOfOrder: f.rowsOutOfOrder,
    timestamps: {
      zone: ts.zone,
      timeZone: zone?.zoneName ?? null,
      stampAt: ts.stampAt,
      repeatedHour: { stamps: repeatedStamps, readAsEarlierOffset: clock.readEarlier, readAsLaterOffset: clock.readLater, firstRows: clock.firstRows.slice(0, FIRST) },
      dstDays: days,
      note: timestampNote(ts, zone, repeatedStamps, clock),
    },
    active: { totalImportKwh: round(importKwh, 3), totalExportKwh: round(exportKwh, 3), missing: missingActive, zero, export: exp, spikes },
    reactive: {
      mapping: mappingKind,
      netOnly: kind === 'net',
      totalLagKvarh: round(lagTotal, 3),
      totalLeadKvarh: round(leadTotal, 3),
      missing: { count: reactiveMissing, ranges: reactiveMissingRanges },
      leadingIntervals: leading,
      exportQuadrantIntervals: f.exportQuadrantRows,
    },
    pf: { averageLagging: kind === 'none' || kwhForPf === 0 ? null : round(kwhForPf / Math.sqrt(kwhForPf ** 2 + lagForPf ** 2), 4), implausible, kvarWithZeroKw: kvarZero },
    crossChecks: { apparent, printedPf: printed },
    findings: [],
  };
  q.findings = findings(q);
  return q;
}

function round(v: number, digits: number): number {
  const k = 10 ** digits;
  return Math.round(v * k) / k;
}

function timestampNote(ts: MeterMapping['timestamp'], zone: ZoneResolver | null, repeated: number, clock: ClockContext): string {
  const at = ts.stampAt === 'end' ? 'interval-ending' : 'interval-beginning';
  if (ts.zone === 'utc') return `Stamps read as UTC, ${at}.`;
  if (ts.zone === 'offset-in-stamp') return `Stamps carry their UTC offset, ${at}; no clock-change guessing was needed.`;
  if (ts.zone === 'local-standard') return `Stamps read as ${zone?.zoneName} standard time all year, ${at}; clock changes do not apply.`;
  if (!repeated) return `Stamps read as local time in ${zone?.zoneName}, ${at}; no stamp fell in a repeated hour.`;
  return `Stamps read as local time in ${zone?.zoneName}, ${at}. ${repeated} stamp(s) fell in a repeated clocks-back hour and were read in order of appearance: first as the earlier (summer) offset (${clock.readEarlier}), then as the later (standard) offset (${clock.readLater}).`;
}
