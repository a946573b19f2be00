/** The generated truth of the demo plants: a year of interval energies per plant. */
import { localClock, plantInterval, prng } from './load-model';
import { demoMeterSite, type DemoMeterSite } from './sites';

export const DEMO_YEAR = 2025;

/** The generated truth for one plant: interval starts and per-interval energies. */
export interface DemoIntervals {
  site: DemoMeterSite;
  siteName: string;
  meterId: string;
  timeZone: string;
  intervalMinutes: number;
  /** Interval start instants, UTC ms, from local 1 January 00:00 to the next 1 January. */
  startMs: Float64Array;
  /** Signed kWh per interval (negative = export). */
  kwh: Float64Array;
  /** Lagging and leading kvarh per interval (one is zero in each interval). */
  kvarhLag: Float64Array;
  kvarhLead: Float64Array;
}

function localMidnightUtc(zone: string, year: number): number {
  // Local 1 January 00:00: no zone used here changes its clocks around New Year.
  const clock = localClock(zone);
  const guess = Date.UTC(year, 0, 1);
  const p = clock(guess);
  const offsetMs = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute) - guess;
  return guess - offsetMs;
}

/** Generates one plant's year. Values are rounded to 0.01 as a meter export would print them. */
export function demoIntervals(site: DemoMeterSite, year = DEMO_YEAR): DemoIntervals {
  const spec = demoMeterSite(site);
  const step = spec.intervalMinutes * 60_000;
  const from = localMidnightUtc(spec.timeZone, year);
  const to = localMidnightUtc(spec.timeZone, year + 1);
  const n = Math.round((to - from) / step);
  const rnd = prng(spec.seed + year);
  const clock = localClock(spec.timeZone);
  const startMs = new Float64Array(n);
  const kwh = new Float64Array(n);
  const lag = new Float64Array(n);
  const lead = new Float64Array(n);
  const hours = spec.intervalMinutes / 60;
  let dayKey = -1;
  let dayNoise = 1;
  let cloud = 1;
  for (let i = 0; i < n; i++) {
    const t = from + i * step;
    const p = clock(t);
    const key = p.month * 100 + p.day;
    if (key !== dayKey) {
      dayKey = key;
      dayNoise = 0.92 + rnd() * 0.16;
      cloud = rnd() < 0.25 ? 0.25 + rnd() * 0.4 : 0.8 + rnd() * 0.2;
    }
    const v = plantInterval(spec.model, p, rnd, dayNoise, cloud, spec.southern);
    startMs[i] = t;
    // Kestrel Bay's export prints average kW, so its energies are derived from the printed kW.
    kwh[i] = site === 'kestrel-bay' ? round2(v.kw) * hours : round2(v.kw * hours);
    const q = round2(v.kvar * hours);
    lag[i] = q > 0 ? q : 0;
    lead[i] = q < 0 ? -q : 0;
  }
  return { site, siteName: spec.siteName, meterId: spec.meterId, timeZone: spec.timeZone, intervalMinutes: spec.intervalMinutes, startMs, kwh, kvarhLag: lag, kvarhLead: lead };
}

function round2(v: number): number {
  return Math.round(v * 100) / 100;
}

