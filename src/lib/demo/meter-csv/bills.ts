/**
 * Demo bill histories: twelve invented bills per plant whose billing periods follow meter
 * reading dates, not calendar months, with the determinants totalled from the generated
 * intervals. Two deliberate faults for the audit to find:
 * - Tarn Valley Glaze Plant: the utility bills with the wrong meter multiplier, so billed
 *   kWh, kvarh and kVA demand are a steady 1.25 x what the interval data says (PF, a ratio,
 *   is unchanged). `TARN_VALLEY_MULTIPLIER_ERROR` below.
 * - Kestrel Bay Packaging: one bill (index `KESTREL_MISBILLED_INDEX`) carries a mis-billed
 *   PF charge. The amounts come from the caller's charge calculator, which is told which
 *   bill is the mis-billed one (`misbilledPfCharge: true`) and decides the wrong amount.
 */
import type { BillMappingInput } from '../../import/bills/bill-schema';
import { demoIntervals, DEMO_YEAR } from './intervals';
import { localClock } from './load-model';
import type { DemoMeterSite } from './sites';

export const TARN_VALLEY_MULTIPLIER_ERROR = 1.25;
export const KESTREL_MISBILLED_INDEX = 6;

export interface DemoBill {
  site: DemoMeterSite;
  /** 0..11 in date order. */
  index: number;
  /** First and last local day of the billing period (inclusive), ISO 8601 dates. */
  periodStart: string;
  periodEnd: string;
  /** Determinants as billed. */
  kwh: number;
  billedDemand: number;
  billedDemandUnit: 'kW' | 'kVA';
  kvarh: number;
  powerFactor: number;
  currency: 'USD' | 'GBP' | 'AUD';
  /** What the interval data says for the same period (import kWh, lagging kvarh). */
  intervalKwh: number;
  intervalKvarh: number;
  /** Billed / interval ratio of the energy registers: 1, or the multiplier error. */
  multiplierError: number;
  /** True for the one bill whose PF charge the calculator should get wrong. */
  misbilledPfCharge: boolean;
}

export interface DemoBillCharges {
  pfCharge: number | null;
  total?: number | null;
}

const READ_OFFSET_DAYS: Record<DemoMeterSite, number> = { brackwater: 4, 'tarn-valley': 8, 'kestrel-bay': 1 };
const CURRENCY: Record<DemoMeterSite, DemoBill['currency']> = { brackwater: 'USD', 'tarn-valley': 'GBP', 'kestrel-bay': 'AUD' };

function isoDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** 13 meter-reading dates, about 29.6 days apart, moved back to the Friday when they fall on a weekend. */
export function readingDates(site: DemoMeterSite, year = DEMO_YEAR): string[] {
  const dates: string[] = [];
  for (let k = 0; k <= 12; k++) {
    let ms = Date.UTC(year, 0, 1 + READ_OFFSET_DAYS[site] + Math.round(k * 29.6));
    const wd = new Date(ms).getUTCDay();
    if (wd === 6) ms -= 86_400_000;
    if (wd === 0) ms -= 2 * 86_400_000;
    dates.push(isoDay(ms));
  }
  return dates;
}

/** The twelve bills of a plant (without charges). */
export function demoBills(site: DemoMeterSite, year = DEMO_YEAR): DemoBill[] {
  const d = demoIntervals(site, year);
  const reads = readingDates(site, year);
  const clock = localClock(d.timeZone);
  const hours = d.intervalMinutes / 60;
  const acc = Array.from({ length: 12 }, () => ({ kwh: 0, kvarh: 0, peakKw: 0, peakKva: 0 }));
  let bill = -1;
  let lastDay = '';
  for (let i = 0; i < d.startMs.length; i++) {
    const p = clock(d.startMs[i]);
    const day = `${p.year}-${p.month < 10 ? '0' : ''}${p.month}-${p.day < 10 ? '0' : ''}${p.day}`;
    if (day !== lastDay) {
      lastDay = day;
      bill = -1;
      for (let k = 0; k < 12; k++) if (day >= reads[k] && day < reads[k + 1]) bill = k;
    }
    if (bill < 0) continue;
    const kwh = d.kwh[i];
    if (kwh <= 0) continue;
    const a = acc[bill];
    a.kwh += kwh;
    a.kvarh += d.kvarhLag[i];
    a.peakKw = Math.max(a.peakKw, kwh / hours);
    a.peakKva = Math.max(a.peakKva, Math.hypot(kwh, d.kvarhLag[i]) / hours);
  }
  const factor = site === 'tarn-valley' ? TARN_VALLEY_MULTIPLIER_ERROR : 1;
  return acc.map((a, k) => {
    const kwh = Math.round(a.kwh * factor);
    const kvarh = Math.round(a.kvarh * factor);
    const kw = site === 'brackwater';
    return {
      site,
      index: k,
      periodStart: reads[k],
      periodEnd: isoDay(Date.parse(`${reads[k + 1]}T00:00:00Z`) - 86_400_000),
      kwh,
      billedDemand: Math.round((kw ? a.peakKw : a.peakKva) * factor * 10) / 10,
      billedDemandUnit: kw ? 'kW' : 'kVA',
      kvarh,
      powerFactor: Math.round((kwh / Math.hypot(kwh, kvarh)) * 1000) / 1000,
      currency: CURRENCY[site],
      intervalKwh: Math.round(a.kwh * 100) / 100,
      intervalKvarh: Math.round(a.kvarh * 100) / 100,
      multiplierError: factor,
      misbilledPfCharge: site === 'kestrel-bay' && k === KESTREL_MISBILLED_INDEX,
    };
  });
}

function money(v: number | null | undefined, comma: boolean): string {
  if (v === null || v === undefined) return '';
  const s = v.toFixed(2);
  return comma ? s.replace('.', ',') : s;
}

/**
 * The plant's bill history as CSV in its own (invented) layout. `charges` fills the PF
 * charge and total of each bill; without it those cells are left empty.
 */
export function demoBillCsv(site: DemoMeterSite, charges?: (bill: DemoBill) => DemoBillCharges, year = DEMO_YEAR): string {
  const bills = demoBills(site, year);
  const rows: string[] = [];
  if (site === 'tarn-valley') {
    const dmy = (iso: string) => `${iso.slice(8, 10)}/${iso.slice(5, 7)}/${iso.slice(0, 4)}`;
    rows.push('Bill from;Bill to;Units kWh;Maximum demand kVA;Reactive kvarh;PF;PF charge;Total;Currency');
    for (const b of bills) {
      const c = charges?.(b);
      rows.push([dmy(b.periodStart), dmy(b.periodEnd), b.kwh, String(b.billedDemand).replace('.', ','), b.kvarh, String(b.powerFactor).replace('.', ','), money(c?.pfCharge, true), money(c?.total, true), b.currency].join(';'));
    }
    return rows.join('\r\n') + '\r\n';
  }
  const brack = site === 'brackwater';
  rows.push(brack ? 'Period from,Period to,Energy kWh,Billed demand kW,Reactive kvarh,Power factor,PF charge,Total,Currency' : 'Start,End,kWh,Demand kVA,kvarh,Power factor,PF charge,Total');
  for (const b of bills) {
    const c = charges?.(b);
    const cells = [b.periodStart, b.periodEnd, b.kwh, b.billedDemand, b.kvarh, b.powerFactor, money(c?.pfCharge, false), money(c?.total, false)];
    if (brack) cells.push(b.currency);
    rows.push(cells.join(','));
  }
  return rows.join('\n') + '\n';
}

/** The bill mapping that reads `demoBillCsv(site)`. */
export function demoBillMapping(site: DemoMeterSite): BillMappingInput {
  const all = { pfCharge: 'PF charge', total: 'Total' };
  if (site === 'tarn-valley') {
    return { version: 1, delimiter: ';', decimalSeparator: ',', dateFormat: 'dmy', billedDemandUnit: 'kVA', columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Units kWh', billedDemand: 'Maximum demand kVA', kvarh: 'Reactive kvarh', powerFactor: 'PF', currency: 'Currency', ...all } };
  }
  if (site === 'brackwater') {
    return { version: 1, delimiter: ',', decimalSeparator: '.', dateFormat: 'iso', billedDemandUnit: 'kW', columns: { periodStart: 'Period from', periodEnd: 'Period to', kwh: 'Energy kWh', billedDemand: 'Billed demand kW', kvarh: 'Reactive kvarh', powerFactor: 'Power factor', currency: 'Currency', ...all } };
  }
  return { version: 1, delimiter: ',', decimalSeparator: '.', dateFormat: 'iso', billedDemandUnit: 'kVA', currency: 'AUD', columns: { periodStart: 'Start', periodEnd: 'End', kwh: 'kWh', billedDemand: 'Demand kVA', kvarh: 'kvarh', powerFactor: 'Power factor', ...all } };
}
