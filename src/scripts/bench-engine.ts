/**
 * Speed bench for the audit engine (never part of the tests). Builds an invented
 * factory site-year at 15-min and 1-min resolution, then times the full evaluation:
 * metrics + tariff + a sizing search over fixed and switched banks.
 * Run: npx tsx src/scripts/bench-engine.ts
 */
import { availableParallelism, loadavg } from 'node:os';
import { buildSeries, computeMetrics, evaluateTariff, monthlyPeriods, parseTariff, sizingSearch, spanOf, unwrap, type IntervalSeries } from '../lib/domain';

const ZONE = 'America/Chicago';

/** Small seeded PRNG so every run sees the same invented data. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** An invented two-shift plant: weekday shifts, night base load, quiet weekends, induction-motor kvar. */
function factoryYear(intervalMinutes: number, random: () => number): IntervalSeries {
  const start = Date.UTC(2025, 0, 1, 6); // local midnight, 1 Jan 2025, Chicago (UTC-6)
  const n = Math.round((365 * 1440) / intervalMinutes);
  const stamps = new Float64Array(n);
  const kwh = new Float64Array(n);
  const lag = new Float64Array(n);
  const lead = new Float64Array(n);
  const h = intervalMinutes / 60;
  for (let i = 0; i < n; i++) {
    const t = start + i * intervalMinutes * 60_000;
    stamps[i] = t;
    const local = new Date(t - 6 * 3_600_000); // bench only: a fixed offset is enough to shape the load
    const hour = local.getUTCHours() + local.getUTCMinutes() / 60;
    const weekday = local.getUTCDay();
    const working = weekday >= 1 && weekday <= 5;
    const shift = working && hour >= 6 && hour < 22;
    const season = 1 + 0.12 * Math.sin(((local.getUTCMonth() + 0.5) / 12) * 2 * Math.PI);
    const motorsKw = (shift ? 620 : working ? 180 : 90) * season * (0.9 + 0.2 * random());
    const lightsKw = shift ? 80 : 25;
    const drivesKw = shift ? 120 * (0.8 + 0.4 * random()) : 10;
    const kw = motorsKw + lightsKw + drivesKw;
    // Motors near 0.80 PF, magnetising kvar of transformers and idle motors all the time.
    const kvar = motorsKw * 0.75 + 45 + drivesKw * 0.1;
    kwh[i] = kw * h;
    lag[i] = kvar * h;
    lead[i] = 0;
  }
  return unwrap(buildSeries({ intervalMinutes, stamps, active: kwh, reactive: { kind: 'registers', lag, lead } }));
}

const tariff = unwrap(
  parseTariff({
    name: 'Invented industrial service, PF clauses',
    currency: 'USD',
    demandWindowMinutes: 15,
    holidays: ['2025-07-04', '2025-12-25'],
    rules: [
      { type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 14.2, ratchet: { fraction: 0.8 } },
      { type: 'excess-kvarh', id: 'xr', allowance: { basis: 'pf', pf: 0.95 }, pricing: { kind: 'flat', ratePerKvarh: 0.004 }, window: { weekdays: [1, 2, 3, 4, 5], timeRanges: [{ from: '06:00', to: '22:00' }], holidays: 'exclude' } },
      { type: 'leading-kvarh', id: 'ld', ratePerKvarh: 0.006, window: { timeRanges: [{ from: '22:00', to: '06:00' }] } },
    ],
  }),
);

function floorLoop(series: IntervalSeries): number {
  let s = 0;
  const a = series.kwh;
  for (let i = 0; i < a.length; i++) s += a[i];
  return s;
}

/**
 * Median and fastest of `repeats` timed runs after warm-up runs that let the JIT settle,
 * in wall time and in this process's CPU time (less affected by other work on the machine).
 */
function time<T>(fn: () => T, repeats: number): { ms: number; minMs: number; cpuMs: number; value: T } {
  let value = fn();
  for (let w = 0; w < 3; w++) value = fn();
  const runs: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    value = fn();
    runs.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  runs.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  return { ms: runs[Math.floor(runs.length / 2)], minMs: runs[0], cpuMs: cpu[Math.floor(cpu.length / 2)], value };
}

function run(intervalMinutes: number, sizes: number, stepCounts: number[], repeats: number): void {
  const series = factoryYear(intervalMinutes, mulberry32(20250101));
  const periods = unwrap(monthlyPeriods(spanOf(series), ZONE));
  const sizesKvar = Array.from({ length: sizes }, (_, k) => (1250 / sizes) * (k + 1));
  const full = () => {
    const metrics = computeMetrics(series, periods, { demandWindowMinutes: 15 });
    const evaluation = evaluateTariff(tariff, series, periods);
    const table = sizingSearch(tariff, series, periods, {
      sizesKvar,
      kinds: ['fixed', 'switched'],
      stepCounts,
      targetPf: 0.95,
      costs: { fixed: { perKvar: 30, fixedCost: 4000 }, switched: { perKvar: 60, fixedCost: 6000 } },
      finance: { lifeYears: 15, discountRate: 0.08 },
    });
    return { metrics, evaluation, table };
  };
  const floor = time(() => floorLoop(series), 50);
  const res = time(full, repeats);
  const candidates = res.value.table.rows.length;
  const seriesMb = [series.startMs, series.kwh, series.kvarhLag, series.kvarhLead, series.flags].reduce((sum, a) => sum + a.byteLength, 0) / 1e6;
  const best = res.value.table.rows[res.value.table.bestNpvIndex ?? 0];
  console.log(
    `${intervalMinutes}-min data, ${series.length.toLocaleString('en-US')} intervals, ${candidates} candidates (${sizes} sizes x fixed + switched with ${stepCounts.join('/')} steps):\n` +
      `  full evaluation ${res.ms.toFixed(1)} ms median, ${res.minMs.toFixed(1)} ms fastest, ${res.cpuMs.toFixed(1)} ms CPU median (${Math.round((series.length / res.ms) * 1000).toLocaleString('en-US')} intervals/s of site data)\n` +
      `  floor loop (sum kWh) ${floor.ms.toFixed(3)} ms; ratio full/floor ${(res.ms / floor.ms).toFixed(0)}x; per candidate pass ${(res.ms / (candidates + 2) / floor.ms).toFixed(1)}x floor\n` +
      `  memory: series arrays ${seriesMb.toFixed(1)} MB, process RSS ${(process.memoryUsage().rss / 1e6).toFixed(0)} MB\n` +
      `  baseline PF charge $${res.value.evaluation.total.toFixed(0)}/yr; best NPV: ${best.kind} ${best.kvar} kvar, saving $${best.annualSaving.toFixed(0)}/yr`,
  );
}

// The machine is shared: print the load so a slow run can be read in context.
console.log(`load average ${loadavg().map((x) => x.toFixed(2)).join(' ')} on ${availableParallelism()} cores`);
// 100 candidates two ways: 50 sizes as fixed and 6-step switched banks, and 25 sizes as
// fixed and 4-, 6- and 8-step switched banks (the web app's sizing table).
run(15, 50, [6], 20);
run(15, 25, [4, 6, 8], 20);
run(1, 50, [6], 5);
run(1, 25, [4, 6, 8], 5);
