import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { evaluateTariff, monthlyPeriods, parseTariff, unwrap, type TouWindowInput } from '../../../../src/lib/domain';
import { seriesByTime } from '../support/factories';

// Invented 15-min data over February to April 2025 in Madrid (clocks go forward on 30 March).
const ZONE = 'Europe/Madrid';
const start = Date.UTC(2025, 0, 31, 23);
const series = seriesByTime(start, 89 * 96 - 4, 15, (_t, i) => ({ kw: 80 + ((i * 29) % 170), kvar: 30 + ((i * 41) % 140) }));
const periods = unwrap(monthlyPeriods(series, ZONE));
const HOLIDAYS = ['2025-03-19', '2025-04-18'];

/** Window membership straight from luxon for each interval: the slow, obvious way. */
function inWindowByLuxon(t: number, w: TouWindowInput): boolean {
  const d = DateTime.fromMillis(t, { zone: ZONE });
  const holiday = HOLIDAYS.includes(d.toISODate() ?? '');
  if (w.months && !w.months.includes(d.month)) return false;
  if (holiday && w.holidays === 'exclude') return false;
  if (holiday && w.holidays === 'whole-day') return true;
  if (w.weekdays && !w.weekdays.includes(d.weekday)) return false;
  if (!w.timeRanges) return true;
  const minute = d.hour * 60 + d.minute;
  return w.timeRanges.some((r) => {
    const [f, to] = [r.from, r.to].map((x) => Number(x.slice(0, 2)) * 60 + Number(x.slice(3)));
    return f === to || (f < to ? minute >= f && minute < to : minute >= f || minute < to);
  });
}

const WINDOWS: TouWindowInput[] = [
  { weekdays: [1, 2, 3, 4, 5], timeRanges: [{ from: '08:00', to: '14:00' }, { from: '18:00', to: '22:00' }], holidays: 'exclude' },
  { timeRanges: [{ from: '22:00', to: '08:00' }], holidays: 'whole-day' },
  { months: [3], weekdays: [6, 7] },
  { timeRanges: [{ from: '01:30', to: '03:15' }] },
];

describe('time-of-use totals against a per-interval luxon reference (IANA tz database via luxon)', () => {
  const tariff = unwrap(
    parseTariff({
      name: 'Invented windows',
      currency: 'EUR',
      holidays: HOLIDAYS,
      rules: WINDOWS.map((window, k) => ({ type: 'excess-kvarh', id: `w${k}`, allowance: { basis: 'ratio', kvarPerKw: 0 }, pricing: { kind: 'flat', ratePerKvarh: 0 }, window })),
    }),
  );
  const evaluation = evaluateTariff(tariff, series, periods);
  it.each(WINDOWS.map((w, k) => [k, w] as const))('window %s: kWh and kvarh per month match', (k, w) => {
    periods.forEach((p, pi) => {
      let kwh = 0;
      let kvarh = 0;
      for (let i = 0; i < series.length; i++) {
        const t = series.startMs[i];
        if (t < p.startMs || t >= p.endMs || !inWindowByLuxon(t, w)) continue;
        kwh += series.kwh[i];
        kvarh += series.kvarhLag[i];
      }
      const q = evaluation.periods[pi].rules[k].quantities;
      expect(q.kwh).toBeCloseTo(kwh, 6);
      expect(q.kvarh).toBeCloseTo(kvarh, 6);
    });
  });
});
