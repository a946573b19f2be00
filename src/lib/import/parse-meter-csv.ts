/**
 * `parseMeterCsv`: a streamed interval-meter CSV plus a confirmed mapping -> one
 * `SeriesInput` per meter and a data-quality report, or the problems that block the import.
 */
import type { SeriesInput } from '../domain/series/build-series';
import { finishMeter } from './finish-meter';
import { MeterMappingSchema, type ChannelSet, type MeterMapping, type MeterMappingInput } from './mapping-schema';
import { ProblemList, failure, rowLabel, type ImportFailure } from './problems';
import { meterQuality, type MeterQuality } from './quality';
import { readRecords, type CsvSource, type ReadProgress } from './records';
import { RowPlan } from './row-plan';
import { isKnownZone, ZoneResolver } from './zone-resolver';

export interface MeterImportOptions {
  /** Called after each chunk with the bytes read and the rows processed so far. */
  onProgress?: (p: ReadProgress) => void;
  /**
   * The site's IANA zone, used to count intervals on clock-change days when the stamps
   * themselves are UTC or carry offsets. The mapping's `timeZone` wins when both are set.
   */
  siteTimeZone?: string;
}

export interface ParsedMeter {
  meterId: string;
  /** Ready for the engine's `buildSeries`: interval-start UTC stamps, kWh and kvarh per interval. */
  series: SeriesInput;
  /** 1-based file line of each interval, for pointing back at the file. */
  lines: Int32Array;
  quality: MeterQuality;
}

export interface QualityReport {
  bytesRead: number;
  dataRows: number;
  meters: MeterQuality[];
}

export type MeterImportResult = { ok: true; meters: ParsedMeter[]; quality: QualityReport } | ImportFailure;

/** Turns zod issues on a mapping into problems the user can act on. */
export function mappingProblems(issues: { path: PropertyKey[]; message: string }[], list: ProblemList): void {
  for (const i of issues) {
    const at = i.path.map(String).join('.') || 'mapping';
    list.add('mapping-invalid', null, at, null, `The import mapping is not valid at ${at}: ${i.message}`);
  }
}

/**
 * Reads the file once, streaming, and returns every meter's series and quality report.
 * All-or-nothing: any error (bad number, bad stamp, conflicting duplicate, mixed interval
 * lengths...) gives `{ ok: false, problems, totalProblems }` and no series.
 */
export async function parseMeterCsv(source: CsvSource, mappingInput: MeterMappingInput, options: MeterImportOptions = {}): Promise<MeterImportResult> {
  const problems = new ProblemList();
  const parsed = MeterMappingSchema.safeParse(mappingInput);
  if (!parsed.success) {
    mappingProblems(parsed.error.issues, problems);
    return failure(problems);
  }
  const m: MeterMapping = parsed.data;
  const zoneName = m.timestamp.timeZone ?? options.siteTimeZone ?? null;
  if (zoneName !== null && !isKnownZone(zoneName)) {
    problems.add('zone-unknown', null, null, zoneName, `The time zone "${zoneName}" is not known. Use an IANA name such as Europe/London or America/Chicago.`);
    return failure(problems);
  }
  const zone = zoneName ? new ZoneResolver(zoneName) : null;

  let plan: RowPlan | null = null;
  let toSkipAfterHeader = m.skipRowsAfterHeader;
  let dataRows = 0;
  let records = 0;
  let headerLine = 0;
  const outcome = await readRecords(source, {
    delimiter: m.delimiter,
    onProgress: options.onProgress,
    onRecord(fields, line) {
      records++;
      if (line <= m.skipRows) return;
      if (!plan) {
        headerLine = line;
        plan = new RowPlan(m, m.hasHeader ? fields : null, fields.length, line, zone, problems);
        if (!plan.usable) return false;
        if (m.hasHeader) return;
      }
      if (toSkipAfterHeader > 0) {
        toSkipAfterHeader--;
        return;
      }
      dataRows++;
      plan.handle(fields, line);
    },
  });
  if (!outcome.ok) {
    problems.add(outcome.code, outcome.line, null, null, outcome.message);
    return failure(problems);
  }
  if (records === 0) {
    problems.add('file-empty', null, null, null, 'The file is empty. Export the meter data again and upload the CSV file.');
    return failure(problems);
  }
  const finalPlan = plan as RowPlan | null;
  if (!finalPlan) {
    problems.add('no-data-rows', null, null, null, `The file has ${records} line(s), all of them among the ${m.skipRows} line(s) skipped above the header. Lower the number of lines to skip.`);
    return failure(problems);
  }
  if (!problems.empty) return failure(problems);
  if (dataRows === 0) {
    const what = m.hasHeader ? `only a header row (${rowLabel(headerLine).toLowerCase()})` : 'no data rows';
    problems.add('header-only', headerLine, null, null, `The file has ${what} and no readings. Export a period with data and upload again.`);
    return failure(problems);
  }

  const meters: ParsedMeter[] = [];
  for (const rows of finalPlan.meters.values()) {
    const set: ChannelSet = m.meterIdColumn !== undefined ? m.meters[0] : (m.meters.find((s) => s.meterId === rows.meterId) as ChannelSet);
    if (rows.length === 0) continue;
    const finished = finishMeter(rows, set, m, problems);
    if (!finished) continue;
    meters.push({ meterId: rows.meterId, series: finished.series, lines: finished.lines, quality: meterQuality(finished, m, rows.clock, zone) });
  }
  if (!problems.empty) return failure(problems);
  return { ok: true, meters, quality: { bytesRead: outcome.bytesRead, dataRows, meters: meters.map((x) => x.quality) } };
}
