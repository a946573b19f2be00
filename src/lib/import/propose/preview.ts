/** The first rows of a file read with a proposed mapping, for the user to check before importing. */
import type { MeterMapping } from '../mapping-schema';
import { ProblemList } from '../problems';
import { RowPlan } from '../row-plan';
import { isoUtc } from '../stamps';
import { isKnownZone, ZoneResolver } from '../zone-resolver';
import { splitLine } from './sniff';
import type { MappingProposal, PreviewRow } from './types';

export function previewRows(m: MeterMapping, lines: string[], n: number): Pick<MappingProposal['preview'], 'rows' | 'problems'> {
  const problems = new ProblemList();
  const zoneName = m.timestamp.timeZone;
  const zone = zoneName && isKnownZone(zoneName) ? new ZoneResolver(zoneName) : null;
  let plan: RowPlan | null = null;
  let skipAfter = m.skipRowsAfterHeader;
  const lineNumbers: number[] = [];
  for (let i = m.skipRows; i < lines.length && lineNumbers.length < n; i++) {
    if (lines[i].trim() === '') continue;
    const fields = splitLine(lines[i], m.delimiter);
    if (!plan) {
      plan = new RowPlan(m, m.hasHeader ? fields : null, fields.length, i + 1, zone, problems);
      if (!plan.usable) break;
      if (m.hasHeader) continue;
    }
    if (skipAfter > 0) {
      skipAfter--;
      continue;
    }
    plan.handle(fields, i + 1);
    lineNumbers.push(i + 1);
  }
  const rows: PreviewRow[] = [];
  if (plan) {
    const meters = [...plan.meters.values()];
    for (const line of lineNumbers) {
      const entries: PreviewRow['meters'] = [];
      let stamp: number | null = null;
      for (const mr of meters) {
        const lines = mr.lines.view();
        const k = lines.indexOf(line);
        if (k === -1) continue;
        stamp = mr.stamps.data[k];
        const a = mr.reactiveA.data[k];
        const b = mr.reactiveB.data[k];
        const p = mr.active.data[k];
        entries.push({ meterId: mr.meterId, active: p === p ? p : null, reactive: a === a ? a : null, reactiveLead: b === b ? b : null });
      }
      if (stamp !== null) rows.push({ row: line, stampUtc: isoUtc(stamp), meters: entries });
    }
  }
  return { rows, problems: problems.items };
}
