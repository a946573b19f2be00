/** The quality report's findings: one plain sentence per kind of warning or fact, with its count and first rows. */
import { fmtMinutes } from './finish-meter';
import type { Finding, MeterQuality } from './quality';

export function findings(q: MeterQuality): Finding[] {
  const out: Finding[] = [];
  const add = (code: string, severity: Finding['severity'], count: number, firstRows: number[], message: string) => {
    if (count > 0) out.push({ code, severity, count, firstRows, message });
  };
  const iv = fmtMinutes(q.intervalMinutes * 60_000);
  add('gaps', 'warning', q.gaps.count, q.gaps.first.map((g) => g.afterRow), `${q.gaps.missingIntervals} interval(s) of ${iv} are missing in ${q.gaps.count} gap(s). They are not filled; periods that include them show as incomplete.`);
  add('duplicates-identical', 'warning', q.duplicates.identicalDropped, q.duplicates.first.map((d) => d.row), `${q.duplicates.identicalDropped} row(s) repeated an earlier row exactly and were left out.`);
  add('rows-reordered', 'info', q.rowsOutOfOrder, [], 'The rows were not in time order; they were sorted by timestamp.');
  add('dst-repeated-hour', 'info', q.timestamps.repeatedHour.stamps, q.timestamps.repeatedHour.firstRows, q.timestamps.note);
  for (const d of q.timestamps.dstDays) {
    if (d.presentIntervals !== d.expectedIntervals) {
      add('dst-day-incomplete', 'warning', d.expectedIntervals - d.presentIntervals, [], `${d.localDate} (${d.hours}-hour day, clocks ${d.kind === 'clocks-back' ? 'back' : 'forward'}) has ${d.presentIntervals} of ${d.expectedIntervals} intervals.`);
    }
  }
  add('active-missing', 'warning', q.active.missing.count, q.active.missing.firstRows, `${q.active.missing.count} interval(s) have no kWh reading; they are left out, never filled.`);
  add('zero-active', 'info', q.active.zero.count, q.active.zero.firstRows, `${q.active.zero.count} interval(s) have zero kWh; they have no PF and are left out of PF figures.`);
  add('export-intervals', 'info', q.active.export.count, q.active.export.firstRows, `${q.active.export.count} interval(s) export active energy (negative kWh, ${q.active.totalExportKwh} kWh in all), e.g. on-site generation.`);
  add('spikes', 'warning', q.active.spikes.count, q.active.spikes.firstRows, `${q.active.spikes.count} interval(s) look like spikes (${q.active.spikes.rule}). Check them against the meter.`);
  add('reactive-missing', 'warning', q.reactive.missing.count, q.reactive.missing.ranges.map((r) => r.fromRow), `${q.reactive.missing.count} interval(s) have no kvarh reading (${q.reactive.missing.ranges.length} range(s) listed). They count as 0 kvarh in PF figures, which flatters the PF; they are not filled.`);
  if (q.reactive.netOnly) add('reactive-net-only', 'info', 1, [], 'Reactive energy is one net signed channel: lagging and leading kvarh within the same interval cannot be told apart.');
  if (q.reactive.mapping === 'none') add('reactive-absent', 'warning', 1, [], 'The file has no reactive channel, so PF cannot be computed from it.');
  add('leading-intervals', 'info', q.reactive.leadingIntervals, [], `${q.reactive.leadingIntervals} interval(s) are leading (more leading than lagging kvarh).`);
  add('quadrant-export-reactive', 'info', q.reactive.exportQuadrantIntervals, [], `${q.reactive.exportQuadrantIntervals} interval(s) have Q2 or Q3 energy (reactive while exporting); Q2 is counted as lagging and Q3 as leading.`);
  add('pf-implausible', 'warning', q.pf.implausible.count, q.pf.implausible.firstRows, `${q.pf.implausible.count} interval(s) have an implausibly low PF (${q.pf.implausible.rule}). Check the reactive column and its unit.`);
  add('kvar-with-zero-kw', 'warning', q.pf.kvarWithZeroKw.count, q.pf.kvarWithZeroKw.firstRows, `${q.pf.kvarWithZeroKw.count} interval(s) have kvarh but zero kWh (e.g. capacitors left on while the plant is off).`);
  const a = q.crossChecks.apparent;
  if (a) add('apparent-mismatch', 'warning', a.count, a.firstRows, `${a.count} of ${a.checked} interval(s) fail the kVA cross-check (${a.rule}). Check the units and the reactive mapping.`);
  const p = q.crossChecks.printedPf;
  if (p) add('pf-column-mismatch', 'warning', p.count, p.firstRows, `${p.count} of ${p.checked} interval(s) fail the PF cross-check (${p.rule}). Check the units and the reactive mapping.`);
  return out;
}
