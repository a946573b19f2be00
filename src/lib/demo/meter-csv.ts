/**
 * Demo meter data: a year of invented interval data per demo plant, written as CSV in
 * three different (invented) export layouts, with the import mapping that reads each one
 * and a bill history derived from the same intervals. Deterministic: a seeded PRNG, no
 * Math.random, no clock.
 *
 * Layouts:
 * - Brackwater Kiln Works: 15-min, ISO 8601 UTC interval-start stamps, kWh with separate
 *   lagging and leading kvarh registers.
 * - Tarn Valley Glaze Plant: 30-min, local wall-clock time (Europe/London, both clock
 *   changes), day-first dates, interval-ending stamps with 24:00, semicolons and decimal
 *   commas, three title lines above the header, lagging kvarh only (the register does
 *   not record the few leading intervals, as a lagging-only meter would not).
 * - Kestrel Bay Packaging: 15-min, ISO 8601 local time with its offset, interval-start,
 *   average kW (negative when the rooftop solar exports) and signed net kvarh.
 */
import type { MeterMappingInput } from '../import/mapping-schema';
import { demoIntervals, DEMO_YEAR } from './meter-csv/intervals';
import { localClock } from './meter-csv/load-model';
import { demoMeterSite, type DemoMeterSite } from './meter-csv/sites';

export { demoIntervals, DEMO_YEAR, type DemoIntervals } from './meter-csv/intervals';
export { DEMO_METER_SITES, demoMeterSite, type DemoMeterSite } from './meter-csv/sites';
export { demoBills, demoBillCsv, demoBillMapping, readingDates, TARN_VALLEY_MULTIPLIER_ERROR, KESTREL_MISBILLED_INDEX, type DemoBill, type DemoBillCharges } from './meter-csv/bills';

function pad(n: number): string {
  return n < 10 ? `0${n}` : String(n);
}

/** The plant's year as CSV text in its export layout (about 1-2 MB). */
export function demoMeterCsv(site: DemoMeterSite, year = DEMO_YEAR): string {
  const d = demoIntervals(site, year);
  const out: string[] = [];
  const n = d.startMs.length;
  const step = d.intervalMinutes * 60_000;
  if (site === 'brackwater') {
    out.push('Interval start (UTC),kWh,kvarh lagging,kvarh leading');
    for (let i = 0; i < n; i++) out.push(`${new Date(d.startMs[i]).toISOString().slice(0, 19)}Z,${d.kwh[i].toFixed(2)},${d.kvarhLag[i].toFixed(2)},${d.kvarhLead[i].toFixed(2)}`);
    return out.join('\n') + '\n';
  }
  const clock = localClock(d.timeZone);
  if (site === 'tarn-valley') {
    out.push(`Site;${d.siteName}`, `Meter;${d.meterId}`, 'Export;half-hourly, local time, period ending', 'Date;Time ending;kWh;kvarh lag');
    for (let i = 0; i < n; i++) {
      // Interval-ending local stamp; midnight ends the previous day as 24:00.
      const end = d.startMs[i] + step;
      let p = clock(end);
      let time = `${pad(p.hour)}:${pad(p.minute)}`;
      if (p.hour === 0 && p.minute === 0) {
        p = clock(end - 60_000);
        time = '24:00';
      }
      const comma = (v: number) => v.toFixed(2).replace('.', ',');
      out.push(`${pad(p.day)}/${pad(p.month)}/${p.year};${time};${comma(d.kwh[i])};${comma(d.kvarhLag[i])}`);
    }
    return out.join('\r\n') + '\r\n';
  }
  out.push('Interval start,Average kW,Net kvarh');
  const hours = d.intervalMinutes / 60;
  for (let i = 0; i < n; i++) {
    const t = d.startMs[i];
    const p = clock(t);
    const offsetMin = Math.round((Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute) - t) / 60_000);
    const sign = offsetMin >= 0 ? '+' : '-';
    const off = `${sign}${pad(Math.floor(Math.abs(offsetMin) / 60))}:${pad(Math.abs(offsetMin) % 60)}`;
    const stamp = `${p.year}-${pad(p.month)}-${pad(p.day)}T${pad(p.hour)}:${pad(p.minute)}:00${off}`;
    const net = d.kvarhLag[i] - d.kvarhLead[i];
    out.push(`${stamp},${(d.kwh[i] / hours).toFixed(2)},${net.toFixed(2)}`);
  }
  return out.join('\n') + '\n';
}

/** The import mapping that reads `demoMeterCsv(site)`. */
export function demoMeterMapping(site: DemoMeterSite): MeterMappingInput {
  const spec = demoMeterSite(site);
  if (site === 'brackwater') {
    return {
      version: 1,
      delimiter: ',',
      decimalSeparator: '.',
      timestamp: { column: 'Interval start (UTC)', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
      meters: [{ meterId: spec.meterId, active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'kvarh lagging', lead: 'kvarh leading', unit: 'kvarh' } }],
    };
  }
  if (site === 'tarn-valley') {
    return {
      version: 1,
      delimiter: ';',
      decimalSeparator: ',',
      skipRows: 3,
      timestamp: { column: 'Date', timeColumn: 'Time ending', format: 'date-time', dateOrder: 'dmy', zone: 'local', timeZone: spec.timeZone, stampAt: 'end' },
      meters: [{ meterId: spec.meterId, active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lagging-only', lag: 'kvarh lag', unit: 'kvarh' } }],
    };
  }
  return {
    version: 1,
    delimiter: ',',
    decimalSeparator: '.',
    timestamp: { column: 'Interval start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
    meters: [{ meterId: spec.meterId, active: { column: 'Average kW', unit: 'kW' }, reactive: { kind: 'net', column: 'Net kvarh', unit: 'kvarh' } }],
  };
}
