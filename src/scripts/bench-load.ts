/**
 * Load on the built server over loopback, with autocannon:
 *  1. 50 connections for 20 s on GET /api/sites/{id}/findings of a site holding a 15-minute
 *     year and a tariff, signed in; requests/s, latency percentiles (p95 from every response's
 *     own time), non-2xx and errors, and whether p95 < 100 ms held on this machine.
 *  2. 10 concurrent uploads of distinct invented 35,040-row years, one per site, each checked:
 *     201, 35,040 intervals stored, and total kWh through GET /findings equal to the file's.
 * Exits non-zero when a correctness check fails; the latency goal is printed, not enforced,
 * because it depends on the machine. Run: VARLEDGER_DIST=... npx tsx src/scripts/bench-load.ts
 * (after a build), or `npm run bench` for every bench.
 */
import { readFileSync, rmSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import autocannon from 'autocannon';
import { openDb } from '../lib/db/client';
import { DEMO_PASSWORD } from '../lib/demo/scenario';
import { startAppServer } from './lib/app-server';
import { freePort, freshDemoDatabase } from './lib/fresh-database';

const CONNECTIONS = Number(process.env.BENCH_LOAD_CONNECTIONS ?? 50);
const DURATION_S = Number(process.env.BENCH_LOAD_SECONDS ?? 20);
const IMPORTS = 10;
const ROWS = 35_040; // 365 days x 96 quarter-hours
const GOAL_P95_MS = 100;
const REFERENCE_S = 5;

const load = () => loadavg().map((x) => x.toFixed(2)).join(' / ');
const rssMb = (pid: number, field: 'VmRSS' | 'VmHWM') => Number(readFileSync(`/proc/${pid}/status`, 'utf8').match(new RegExp(`${field}:\\s+(\\d+)`))?.[1] ?? NaN) / 1024;
const CLK_TCK = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
/** CPU time (user + system) the process has used, ms. */
const cpuMs = (pid: number) => {
  const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return ((Number(f[11]) + Number(f[12])) * 1000) / CLK_TCK;
};
const pct = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]! : NaN);

/**
 * An invented 15-minute year of a plant: a weekday day shift on a base load, a lagging PF that
 * sags with load, a little leading kvarh at night, seeded noise. Returns the CSV and the sum of
 * the kWh exactly as printed in it (what an import must store).
 */
export function inventedYear(seed: number, baseKw: number): { csv: string; kwhTotal: number; rows: number } {
  let s = seed >>> 0;
  const rnd = () => ((s = (s * 1_103_515_245 + 12_345) >>> 0) / 2 ** 32);
  const t0 = Date.UTC(2025, 0, 1);
  const lines: string[] = ['Interval start UTC,Energy kWh,Lagging kvarh,Leading kvarh\n'];
  let kwhTotal = 0;
  for (let i = 0; i < ROWS; i++) {
    const t = t0 + i * 900_000;
    const d = new Date(t);
    const hour = d.getUTCHours() + d.getUTCMinutes() / 60;
    const weekday = d.getUTCDay() % 6 !== 0;
    const shift = weekday && hour >= 6 && hour < 22 ? 1 : 0;
    const kw = baseKw * (0.35 + 0.65 * shift * (0.85 + 0.15 * Math.sin((Math.PI * (hour - 6)) / 16))) * (0.95 + 0.1 * rnd());
    const pf = 0.93 - 0.12 * shift * rnd();
    const kwh = (kw / 4).toFixed(3);
    const lag = ((kw / 4) * Math.tan(Math.acos(pf))).toFixed(3);
    const lead = shift ? '0.000' : (0.4 * rnd()).toFixed(3);
    kwhTotal += Number(kwh);
    lines.push(`${d.toISOString().slice(0, 19)}Z,${kwh},${lag},${lead}\n`);
  }
  return { csv: lines.join(''), kwhTotal, rows: ROWS };
}

const MAPPING = { version: 1, delimiter: ',', decimalSeparator: '.', timestamp: { column: 'Interval start UTC', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' }, meters: [{ meterId: 'Main meter', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Lagging kvarh', lead: 'Leading kvarh', unit: 'kvarh' } }] };
const TARIFF = { name: 'Load bench tariff', currency: 'USD', effectiveFrom: '2020-01-01', demandWindowMinutes: 15, rules: [{ type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 14 }, { type: 'excess-kvarh', id: 'kvarh', allowance: { basis: 'pf', pf: 0.95 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 } }] };

const failures: string[] = [];
const check = (ok: boolean, what: string) => {
  if (!ok) failures.push(what);
  return ok;
};

const { dataDir: dir, databaseUrl: dbUrl } = await freshDemoDatabase('varledger-load', 'load');
const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const app = await startAppServer({ HOST: '127.0.0.1', PORT: String(port), APP_URL: base, DATABASE_URL: dbUrl, DATA_DIR: dir, MAIL_SINK: 'off', PAYMENT_FAKE: 'off', NODE_ENV: 'production' }, { quiet: true });
const pid = app.child.pid!;
try {
  const signIn = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { origin: base, 'content-type': 'application/json' }, body: JSON.stringify({ email: 'energy@northgate.example', password: DEMO_PASSWORD }) });
  if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status}`);
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const h = { origin: base, cookie };
  const newSite = async (name: string) => {
    const r = await fetch(`${base}/api/sites`, { method: 'POST', headers: { ...h, 'content-type': 'application/json' }, body: JSON.stringify({ name, timeZone: 'America/Chicago', currency: 'USD' }) });
    if (r.status !== 201) throw new Error(`site creation failed: ${r.status} ${await r.text()}`);
    return ((await r.json()) as { site: { id: string } }).site.id;
  };
  type UploadBody = { import?: { intervals: number }; error?: { code: string; message: string } };
  const upload = async (siteId: string, csv: string, name: string): Promise<{ status: number; body: UploadBody; ms: number }> => {
    const form = new FormData();
    form.append('mapping', JSON.stringify(MAPPING));
    form.append('file', new Blob([csv], { type: 'text/csv' }), name);
    const t0 = performance.now();
    const r = await fetch(`${base}/api/sites/${siteId}/meter-data`, { method: 'POST', headers: h, body: form });
    const body = (await r.json()) as UploadBody;
    return { status: r.status, body, ms: performance.now() - t0 };
  };
  type FindingsBody = { totals: { kwh: number }; periods: { metrics: { presentIntervals: number } }[] };
  const findings = async (siteId: string) => {
    const r = await fetch(`${base}/api/sites/${siteId}/findings`, { headers: h });
    return { status: r.status, body: (await r.json()) as FindingsBody };
  };

  // 1. Findings under 50 connections.
  const siteId = await newSite('Load bench plant');
  const year = inventedYear(20_250_101, 800);
  const t = await fetch(`${base}/api/sites/${siteId}/tariffs`, { method: 'POST', headers: { ...h, 'content-type': 'application/json' }, body: JSON.stringify(TARIFF) });
  if (t.status !== 201) throw new Error(`tariff creation failed: ${t.status} ${await t.text()}`);
  const up = await upload(siteId, year.csv, 'load-bench-year.csv');
  if (up.status !== 201) throw new Error(`import failed: ${up.status} ${JSON.stringify(up.body).slice(0, 300)}`);
  const c0 = performance.now();
  const first = await findings(siteId);
  const coldMs = performance.now() - c0;
  check(first.status === 200, `first findings answered ${first.status}`);
  const firstBytes = JSON.stringify(first.body).length;

  console.log(`GET /api/sites/{id}/findings, ${CONNECTIONS} connections for ${DURATION_S} s (autocannon, built server on loopback, SQLite file, a 15-minute year and a 2-rule tariff)`);
  console.log(`  first request (computes): ${coldMs.toFixed(0)} ms, ${first.body.periods?.length} periods, ${(firstBytes / 1024).toFixed(1)} KiB JSON; load average before: ${load()}`);
  const latencies: number[] = [];
  const sizes = new Map<number, number>();
  const rssBefore = rssMb(pid, 'VmRSS');
  const cpu0 = cpuMs(pid);
  const instance = autocannon({ url: `${base}/api/sites/${siteId}/findings`, connections: CONNECTIONS, duration: DURATION_S, headers: { cookie } });
  instance.on('response', (_c, status, bytes, ms) => {
    latencies.push(ms);
    if (status === 200) sizes.set(bytes, (sizes.get(bytes) ?? 0) + 1);
  });
  const res = await instance;
  const loadAfter = load();
  const cpuPerRequest = (cpuMs(pid) - cpu0) / res.requests.total;
  latencies.sort((a, b) => a - b);
  const p95 = pct(latencies, 95);
  const l = res.latency;
  console.log(`  requests: ${res.requests.total} in ${res.duration} s = ${res.requests.average.toFixed(0)} req/s (mean of per-second samples)`);
  console.log(`  latency ms: p50 ${l.p50}  p90 ${l.p90}  p95 ${p95.toFixed(1)} (from ${latencies.length} response times)  p97.5 ${l.p97_5}  p99 ${l.p99}  max ${l.max}  mean ${l.average.toFixed(1)}`);
  console.log(`  non-2xx: ${res.non2xx}  errors: ${res.errors}  timeouts: ${res.timeouts}  status codes: ${JSON.stringify(res.statusCodeStats)}`);
  console.log(`  distinct 200 body sizes: ${sizes.size} (${[...sizes].map(([b, n]) => `${b} B x ${n}`).join(', ')})`);
  console.log(`  server CPU ${cpuPerRequest.toFixed(2)} ms a request (user + system); RSS ${rssBefore.toFixed(0)} MB before, ${rssMb(pid, 'VmRSS').toFixed(0)} MB after; load average after: ${loadAfter}`);
  console.log(`  goal p95 < ${GOAL_P95_MS} ms with no errors: ${p95 < GOAL_P95_MS && res.non2xx === 0 && res.errors === 0 ? 'MET' : 'NOT MET'} on this machine`);
  // For reading the figure above: the same connections on an endpoint that does only what every
  // signed-in request does (middleware: session and workspace lookup) plus SELECT 1.
  const refCpu0 = cpuMs(pid);
  const ref = await autocannon({ url: `${base}/api/health`, connections: CONNECTIONS, duration: REFERENCE_S, headers: { cookie } });
  const refCpu = (cpuMs(pid) - refCpu0) / ref.requests.total;
  console.log(`  reference, GET /api/health with the same cookie, ${REFERENCE_S} s: ${ref.requests.average.toFixed(0)} req/s, p50 ${ref.latency.p50} ms, p97.5 ${ref.latency.p97_5} ms, server CPU ${refCpu.toFixed(2)} ms a request, non-2xx ${ref.non2xx}, errors ${ref.errors}; load average: ${load()}`);
  check(res.non2xx === 0, `${res.non2xx} non-2xx findings responses under load`);
  check(res.errors === 0, `${res.errors} connection errors under load`);
  check(res.requests.total > 0, 'no findings request completed under load');
  check(sizes.size === 1, `findings bodies under load had ${sizes.size} different sizes`);

  // 2. Ten concurrent 35,040-row imports, one per site.
  const sites: { id: string; year: ReturnType<typeof inventedYear> }[] = [];
  for (let k = 0; k < IMPORTS; k++) sites.push({ id: await newSite(`Import bench site ${k + 1}`), year: inventedYear(7_000 + 97 * k, 150 + 45 * k) });
  const bytes = sites.reduce((s, x) => s + Buffer.byteLength(x.year.csv), 0);
  console.log(`\n${IMPORTS} concurrent uploads of distinct invented ${ROWS.toLocaleString('en-US')}-row years (one per site, ${(bytes / 1e6).toFixed(1)} MB in all); load average before: ${load()}`);
  const hwmBefore = rssMb(pid, 'VmHWM');
  let peakRss = rssMb(pid, 'VmRSS');
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, rssMb(pid, 'VmRSS'))), 50);
  const w0 = performance.now();
  const results = await Promise.all(sites.map((s, k) => upload(s.id, s.year.csv, `import-bench-${k + 1}.csv`).catch((e: Error) => ({ status: 0, body: { error: { code: 'fetch', message: e.message } } as UploadBody, ms: NaN }))));
  const wallMs = performance.now() - w0;
  clearInterval(sampler);
  const hwmAfter = rssMb(pid, 'VmHWM');
  const { db } = openDb(dbUrl);
  console.log('  site | status | import ms | intervals (response / stored) | file kWh          | findings kWh      | rel. diff');
  for (const [k, s] of sites.entries()) {
    const r = results[k]!;
    const f = await findings(s.id);
    const stored = await db.$client.execute({ sql: 'SELECT coalesce(sum(b.count), 0) AS n FROM interval_block b JOIN meter m ON m.id = b.meter_id WHERE m.site_id = ?', args: [s.id] });
    const storedN = Number(stored.rows[0]!.n);
    const present = f.status === 200 ? f.body.periods.reduce((n, p) => n + p.metrics.presentIntervals, 0) : NaN;
    const rel = f.status === 200 ? Math.abs(f.body.totals.kwh - s.year.kwhTotal) / s.year.kwhTotal : NaN;
    console.log(`  ${String(k + 1).padStart(4)} | ${String(r.status).padStart(6)} | ${r.ms.toFixed(0).padStart(9)} | ${`${r.body.import?.intervals ?? '-'} / ${storedN} (findings ${present})`.padEnd(29)} | ${s.year.kwhTotal.toFixed(3).padStart(17)} | ${(f.status === 200 ? f.body.totals.kwh.toFixed(3) : `HTTP ${f.status}`).padStart(17)} | ${rel.toExponential(1)}`);
    check(r.status === 201, `import ${k + 1} answered ${r.status} ${JSON.stringify(r.body.error ?? '')}`);
    check(r.body.import?.intervals === ROWS, `import ${k + 1} reported ${r.body.import?.intervals} intervals`);
    check(storedN === ROWS, `import ${k + 1} stored ${storedN} intervals`);
    check(present === ROWS, `findings of import ${k + 1} count ${present} intervals`);
    check(rel <= 1e-6, `findings kWh of import ${k + 1} differ from the file by ${rel}`);
  }
  db.$client.close();
  const ms = results.map((r) => r.ms).sort((a, b) => a - b);
  console.log(`  wall time ${wallMs.toFixed(0)} ms for ${(IMPORTS * ROWS).toLocaleString('en-US')} rows (${Math.round((IMPORTS * ROWS) / (wallMs / 1000)).toLocaleString('en-US')} rows/s); per import min ${ms[0]!.toFixed(0)} / median ${pct(ms, 50).toFixed(0)} / max ${ms.at(-1)!.toFixed(0)} ms`);
  console.log(`  server RSS peak ${peakRss.toFixed(0)} MB sampled every 50 ms (VmHWM ${hwmBefore.toFixed(0)} MB before, ${hwmAfter.toFixed(0)} MB after); load average after: ${load()}`);
} finally {
  await app.stop();
  rmSync(dir, { recursive: true, force: true });
}
if (failures.length) {
  console.log(`\nCORRECTNESS FAILURES (${failures.length}):\n  ${failures.join('\n  ')}`);
  process.exit(1);
}
console.log('\nAll correctness checks passed.');
