/**
 * `proposeMapping`: a first guess at the mapping of a meter CSV from its head (the first
 * few kilobytes), with a confidence and a note per choice, the statements the user must
 * make (day-first or month-first is never guessed), and a preview of the first rows.
 */
import { MeterMappingSchema, type ChannelSet, type MeterMapping, type MeterMappingInput } from '../mapping-schema';
import { ProblemList } from '../problems';
import { isKnownZone } from '../zone-resolver';
import { channelSet } from './channel-set';
import { headerChannel, looksLikeMeterIdHeader, stampAtHint, zoneHint, type HeaderChannel } from './channels';
import { previewRows } from './preview';
import { cellKind, dateOrderEvidence, guessDelimiter, headLines, isDataRow, splitLine, usesDecimalComma, type CellKind } from './sniff';
import type { ColumnProfile, Confidence, MappingProposal, ProposalChoice, ProposalNeed, ProposeOptions } from './types';

export type { Confidence, ProposalChoice, ProposalNeed, ColumnProfile, PreviewRow, MappingProposal, ProposeOptions } from './types';

const SAMPLE_ROWS = 60;

/** Proposes a mapping from the first part of a file. Pure and synchronous. */
export function proposeMapping(headText: string, options: ProposeOptions = {}): MappingProposal {
  const problems = new ProblemList();
  const choices: ProposalChoice[] = [];
  const needs: ProposalNeed[] = [];
  const empty = (): MappingProposal => ({ ok: false, problems: problems.items, mapping: null, draft: {}, choices, needs, columns: [], preview: { rows: [], problems: [] } });
  const choose = (field: string, value: unknown, confidence: Confidence, note: string) => choices.push({ field, value, confidence, note });

  if (headText.includes('\0')) {
    problems.add('file-binary', null, null, null, 'The file contains NUL bytes, so it is not a CSV text file. Export the meter data as CSV and upload that.');
    return empty();
  }
  const text = headText.charCodeAt(0) === 0xfeff ? headText.slice(1) : headText;
  const cut = options.truncated ?? !/[\r\n]$/.test(text);
  const lines = headLines(text, cut);
  if (lines.every((l) => l.trim() === '')) {
    problems.add('file-empty', null, null, null, 'The file is empty. Export the meter data again and upload the CSV file.');
    return empty();
  }

  const guess = guessDelimiter(lines);
  const delimiter = guess.delimiter;
  if (guess.fields < 2) {
    problems.add('single-column', 1, null, null, 'Every line reads as one column with comma, semicolon, tab or vertical-bar delimiters. Check that this is a CSV export of interval data.');
    return empty();
  }
  const names: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'vertical bar' };
  choose('delimiter', delimiter, guess.consistency >= 0.95 ? 'high' : 'medium', `${Math.round(guess.consistency * 100)}% of the sampled lines split into ${guess.fields} fields with the ${names[delimiter]} delimiter.`);

  const rows = lines.map((l) => (l.trim() === '' ? null : splitLine(l, delimiter)));
  const firstData = rows.findIndex((r, i) => r !== null && r.length === guess.fields && isDataRow(r) && rows.slice(i + 1, i + 3).every((n) => n === null || isDataRow(n)));
  if (firstData === -1) {
    problems.add('header-only', null, null, null, 'No data rows found in the first part of the file: only header or title lines. Export a period with readings and upload again.');
    return empty();
  }
  // Header: the nearest line above the data with the same field count; a units row may sit between.
  let headerAt = -1;
  let unitsAt = -1;
  for (let i = firstData - 1; i >= 0; i--) {
    const r = rows[i];
    if (r === null) continue;
    if (r.length !== guess.fields) break;
    if (headerAt === -1 && unitsAt === -1 && i === prevNonBlank(rows, firstData) && r.every((c) => c === '' || /^\[?\(?(k|m)?(w|wh|var|varh|va|vah)\)?\]?$|^%$|^pf$/i.test(c)) && r.some((c) => c !== '')) {
      unitsAt = i;
      continue;
    }
    headerAt = i;
    break;
  }
  const hasHeader = headerAt !== -1;
  const header = hasHeader ? (rows[headerAt] as string[]) : Array.from({ length: guess.fields }, (_, i) => `column ${i + 1}`);
  const unitsRow = unitsAt !== -1 ? (rows[unitsAt] as string[]) : null;
  const skipRows = hasHeader ? headerAt : firstData;
  const skipRowsAfterHeader = hasHeader ? firstData - headerAt - 1 : 0;
  choose('skipRows', skipRows, 'medium', skipRows ? `Data starts on line ${firstData + 1}; ${skipRows} line(s) above the header are skipped.` : 'The header is on the first line.');
  choose('hasHeader', hasHeader, hasHeader ? 'high' : 'medium', hasHeader ? `Header on line ${headerAt + 1}.` : 'No header row found: columns are named by position.');
  if (skipRowsAfterHeader) choose('skipRowsAfterHeader', skipRowsAfterHeader, 'medium', unitsRow ? `Line ${unitsAt + 1} holds units; it is read for units and skipped.` : `${skipRowsAfterHeader} line(s) between header and data are skipped.`);

  const data = rows.slice(firstData).filter((r): r is string[] => r !== null && r.length === guess.fields).slice(0, SAMPLE_ROWS);
  const allCells = data.flat();
  const decimal = usesDecimalComma(allCells, delimiter) ? ',' : '.';
  choose('decimalSeparator', decimal, 'high', decimal === ',' ? 'Numbers such as "12,5" use a decimal comma.' : 'Numbers use a decimal point.');

  const columns: ColumnProfile[] = header.map((h, i) => {
    const cells = data.map((r) => r[i]);
    const kinds = new Map<CellKind, number>();
    for (const c of cells) {
      const k = cellKind(c);
      if (k !== 'empty') kinds.set(k, (kinds.get(k) ?? 0) + 1);
    }
    let kind: CellKind = 'empty';
    let n = 0;
    for (const [k, c] of kinds) if (c > n) [kind, n] = [k, c];
    return { index: i + 1, header: h, kind, samples: cells.filter((c) => c !== '').slice(0, 3), role: null, unit: null };
  });
  const ref = (i: number) => (hasHeader ? header[i] : i + 1);

  // Timestamp.
  const draft: Partial<MeterMappingInput> = { version: 1, delimiter, decimalSeparator: decimal, skipRows, hasHeader, skipRowsAfterHeader };
  const ts: Record<string, unknown> = {};
  let stampCells: string[] = [];
  const isoCol = columns.find((c) => c.kind === 'iso-offset') ?? columns.find((c) => c.kind === 'iso');
  const dtCol = columns.find((c) => c.kind === 'date-time');
  const dateCol = columns.find((c) => c.kind === 'date');
  const timeCol = columns.find((c) => c.kind === 'time');
  const serialCol = columns.find((c) => c.kind === 'number' && /date|time|stamp/i.test(c.header) && data.every((r) => { const v = Number(r[c.index - 1].replace(',', '.')); return v > 20_000 && v < 80_000; }));
  const stampHeaders: string[] = [];
  if (isoCol) {
    isoCol.role = 'timestamp';
    Object.assign(ts, { column: ref(isoCol.index - 1), format: 'iso' });
    stampCells = data.map((r) => r[isoCol.index - 1]);
    stampHeaders.push(isoCol.header);
    choose('timestamp.format', 'iso', 'high', `Column "${isoCol.header}" holds ISO 8601 stamps like "${isoCol.samples[0]}".`);
  } else if (dtCol || (dateCol && timeCol)) {
    const col = dtCol ?? (dateCol as ColumnProfile);
    col.role = dtCol ? 'timestamp' : 'date';
    Object.assign(ts, { column: ref(col.index - 1), format: 'date-time' });
    stampHeaders.push(col.header);
    if (!dtCol && timeCol) {
      timeCol.role = 'time';
      ts.timeColumn = ref(timeCol.index - 1);
      stampHeaders.push(timeCol.header);
    }
    stampCells = data.map((r) => r[col.index - 1]);
    choose('timestamp.format', 'date-time', 'high', dtCol ? `Column "${col.header}" holds dates with times like "${col.samples[0]}".` : `Date in "${col.header}", time of day in "${timeCol?.header}".`);
    const ev = dateOrderEvidence(stampCells);
    if (ev.order) {
      ts.dateOrder = ev.order;
      if (options.dateOrder && options.dateOrder !== ev.order) {
        problems.add('stamp-invalid', null, col.header, null, `The date order was stated as ${orderName(options.dateOrder)}, but ${ev.reason}. Check the statement.`);
      }
      choose('timestamp.dateOrder', ev.order, 'high', `Settled by the data: ${ev.reason}.`);
    } else if (options.dateOrder) {
      ts.dateOrder = options.dateOrder;
      choose('timestamp.dateOrder', options.dateOrder, 'high', `As stated by the user (${ev.reason}).`);
    } else {
      needs.push({
        field: 'timestamp.dateOrder',
        message: ev.contradictory
          ? `The dates contradict each other: ${ev.reason}. Check the file, then state the date order.`
          : `State whether the dates are day-first (31/01/2025) or month-first (01/31/2025): ${ev.reason}.`,
        options: ['dmy', 'mdy'],
      });
    }
  } else if (serialCol) {
    serialCol.role = 'timestamp';
    Object.assign(ts, { column: ref(serialCol.index - 1), format: 'excel-serial' });
    stampHeaders.push(serialCol.header);
    choose('timestamp.format', 'excel-serial', 'medium', `Column "${serialCol.header}" holds spreadsheet serial dates like ${serialCol.samples[0]}.`);
  } else {
    needs.push({ field: 'timestamp.column', message: 'No column reads as dates and times. Say which column holds the timestamp and how it is written.', options: header });
  }

  // Zone.
  const allOffsets = isoCol?.kind === 'iso-offset' && stampCells.every((c) => cellKind(c) === 'iso-offset');
  const hint = stampHeaders.map(zoneHint).find((h) => h !== null) ?? null;
  if (allOffsets) {
    ts.zone = 'offset-in-stamp';
    choose('timestamp.zone', 'offset-in-stamp', 'high', 'Every stamp carries its UTC offset.');
  } else if (ts.column !== undefined) {
    if (hint === 'utc') {
      ts.zone = 'utc';
      choose('timestamp.zone', 'utc', 'medium', `The header says UTC ("${stampHeaders[0]}").`);
    } else if (options.timeZone && isKnownZone(options.timeZone)) {
      ts.zone = 'local';
      ts.timeZone = options.timeZone;
      choose('timestamp.zone', 'local', hint === 'local' ? 'medium' : 'low', `Stamps carry no offset; read as local time in ${options.timeZone} with clock changes. Choose standard time all year or UTC if the meter keeps that.`);
    } else {
      needs.push({ field: 'timestamp.zone', message: 'The stamps carry no UTC offset. State whether they are UTC, local time with clock changes, or local standard time all year (and the site time zone).', options: ['utc', 'local', 'local-standard'] });
    }
  }

  // Interval beginning or ending.
  const atHint = stampHeaders.map(stampAtHint).find((h) => h !== null) ?? null;
  const times = data.map((r) => (ts.timeColumn !== undefined && timeCol ? r[timeCol.index - 1] : r[(columns.find((c) => c.role === 'timestamp' || c.role === 'date')?.index ?? 1) - 1]));
  const has2400 = times.some((t) => /(^|\D)24:00/.test(t));
  if (has2400) {
    ts.stampAt = 'end';
    choose('timestamp.stampAt', 'end', 'high', 'A stamp reads 24:00, which can only end an interval.');
  } else if (atHint) {
    ts.stampAt = atHint;
    choose('timestamp.stampAt', atHint, 'medium', `The header says "${stampHeaders[0]}".`);
  } else if (ts.column !== undefined) {
    ts.stampAt = 'start';
    choose('timestamp.stampAt', 'start', 'low', 'Nothing says whether stamps begin or end their interval; interval-beginning assumed. Check against the export description.');
  }
  if (Object.keys(ts).length) draft.timestamp = ts as MeterMappingInput['timestamp'];

  // Meter-id column (stacked layout).
  // A text column that names meters, or repeats a few values; a numeric one only when its header says so (meter serials).
  const repeats = (c: ColumnProfile) => new Set(data.map((r) => r[c.index - 1])).size < data.length / 2;
  const idCol = columns.find(
    (c) =>
      c.role === null &&
      ((c.kind === 'text' && (looksLikeMeterIdHeader(c.header) || repeats(c))) || (c.kind === 'number' && looksLikeMeterIdHeader(c.header) && headerChannel(c.header) === null && repeats(c))),
  );
  if (idCol) {
    idCol.role = 'meter-id';
    draft.meterIdColumn = ref(idCol.index - 1);
    const ids = [...new Set(data.map((r) => r[idCol.index - 1]))];
    choose('meterIdColumn', idCol.header, 'medium', `Column "${idCol.header}" names the meter on each row (${ids.slice(0, 5).join(', ')}${ids.length > 5 ? ', ...' : ''}).`);
  }

  // Channels grouped by meter label.
  const groups = new Map<string, { i: number; ch: HeaderChannel }[]>();
  for (const c of columns) {
    if (c.role !== null || (c.kind !== 'number' && c.kind !== 'empty')) continue;
    const ch = headerChannel(c.header, unitsRow?.[c.index - 1] ?? '');
    if (!ch) continue;
    c.role = ch.role;
    c.unit = ch.unit?.unit ?? null;
    const key = idCol ? '' : ch.meterLabel;
    const list = groups.get(key) ?? [];
    list.push({ i: c.index - 1, ch });
    groups.set(key, list);
  }
  const sets: ChannelSet[] = [];
  for (const [label, list] of groups) {
    const set = channelSet(label, list, data, ref, choose, needs, groups.size > 1);
    if (set) sets.push(set);
  }
  if (!sets.length) needs.push({ field: 'meters', message: 'No column reads as kW or kWh. Say which column holds active power or energy and in which unit.', options: header });
  else {
    draft.meters = sets;
    if (sets.length > 1) choose('meters', sets.map((s) => s.meterId), 'medium', `${sets.length} meters side by side, one column set each.`);
  }

  let mapping: MeterMapping | null = null;
  const preview: MappingProposal['preview'] = { rows: [], problems: [] };
  if (!needs.length) {
    const parsed = MeterMappingSchema.safeParse(draft);
    if (parsed.success) {
      mapping = parsed.data;
      Object.assign(preview, previewRows(mapping, lines, options.previewRows ?? 10));
    } else {
      for (const issue of parsed.error.issues) needs.push({ field: issue.path.join('.'), message: issue.message, options: [] });
    }
  }
  return { ok: true, problems: problems.items, mapping, draft, choices, needs, columns, preview };
}

function prevNonBlank(rows: (string[] | null)[], at: number): number {
  for (let i = at - 1; i >= 0; i--) if (rows[i] !== null) return i;
  return -1;
}

function orderName(o: 'ymd' | 'dmy' | 'mdy'): string {
  return o === 'dmy' ? 'day-first' : o === 'mdy' ? 'month-first' : 'year-first';
}

