/**
 * Import and audit speed through the built server on loopback: a 35,040-row (15-minute) and a
 * 525,600-row (1-minute) invented year uploaded to POST /api/sites/{id}/meter-data, end to end,
 * against papaparse alone on the same bytes in the same run; the server's peak RSS growth; and
 * GET /findings on the stored year (the packed day-block layout). Prints figures, asserts nothing.
 * Run: npm run build && npx tsx src/scripts/bench-import-http.ts
 */
import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import { DEMO_PASSWORD } from '../lib/demo/scenario';
import { startAppServer } from './lib/app-server';
import { freePort, freshDemoDatabase } from './lib/fresh-database';


function makeCsv(intervalMinutes: number): { text: string; rows: number } {
  const rows = (365 * 1440) / intervalMinutes;
  const parts: string[] = ['Interval start UTC,Energy kWh,Lagging kvarh,Leading kvarh\n'];
  const start = Date.UTC(2025, 0, 1);
  let seed = 4242;
  const rnd = () => ((seed = (seed * 1_103_515_245 + 12_345) >>> 0) / 2 ** 32);
  for (let i = 0; i < rows; i++) parts.push(`${new Date(start + i * intervalMinutes * 60_000).toISOString().slice(0, 19)}Z,${((20 + 10 * rnd()) * intervalMinutes / 15).toFixed(3)},${((12 + 6 * rnd()) * intervalMinutes / 15).toFixed(3)},${(0.2 * rnd()).toFixed(3)}\n`);
  return { text: parts.join(''), rows };
}

async function papaAlone(bytes: Buffer): Promise<number> {
  const t0 = performance.now();
  await new Promise<void>((resolve) => {
    const chunks: Buffer[] = [];
    for (let i = 0; i < bytes.length; i += 65536) chunks.push(bytes.subarray(i, i + 65536));
    Papa.parse(Readable.from(chunks), { chunk: () => undefined, complete: () => resolve() });
  });
  return performance.now() - t0;
}

function rssKb(pid: number, field: 'VmRSS' | 'VmHWM'): number {
  const m = readFileSync(`/proc/${pid}/status`, 'utf8').match(new RegExp(`${field}:\\s+(\\d+)`));
  return m ? Number(m[1]) : NaN;
}

const { dataDir: dir, databaseUrl: url } = await freshDemoDatabase('varledger-bench', 'bench');
const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const app = await startAppServer({ HOST: '127.0.0.1', PORT: String(port), APP_URL: base, DATABASE_URL: url, DATA_DIR: dir, MAIL_SINK: 'off', NODE_ENV: 'test' }, { quiet: true });
try {
  const signIn = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { origin: base, 'content-type': 'application/json' }, body: JSON.stringify({ email: 'energy@northgate.example', password: DEMO_PASSWORD }) });
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const h = { origin: base, cookie };
  const mapping = { version: 1, delimiter: ',', decimalSeparator: '.', timestamp: { column: 'Interval start UTC', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' }, meters: [{ meterId: 'Main meter', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Lagging kvarh', lead: 'Leading kvarh', unit: 'kvarh' } }] };
  const tariff = { name: 'Bench tariff', currency: 'USD', effectiveFrom: '2020-01-01', demandWindowMinutes: 15, rules: [{ type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 14 }, { type: 'excess-kvarh', id: 'kvarh', allowance: { basis: 'pf', pf: 0.95 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 } }] };

  console.log('Meter-data import through HTTP (built server, loopback, SQLite file)');
  console.log('rows      | bytes    | papaparse alone | upload+import | ratio | rows/s    | server peak RSS growth | GET findings');
  for (const minutes of [15, 1]) {
    const { text, rows } = makeCsv(minutes);
    const bytes = Buffer.from(text);
    const site = await (await fetch(`${base}/api/sites`, { method: 'POST', headers: { ...h, 'content-type': 'application/json' }, body: JSON.stringify({ name: `Bench ${minutes}-minute`, timeZone: 'America/Chicago' }) })).json();
    const siteId = site.site.id;
    await fetch(`${base}/api/sites/${siteId}/tariffs`, { method: 'POST', headers: { ...h, 'content-type': 'application/json' }, body: JSON.stringify(tariff) });
    const papaMs = await papaAlone(bytes);
    const before = rssKb(app.child.pid!, 'VmRSS');
    const form = new FormData();
    form.append('mapping', JSON.stringify(mapping));
    form.append('file', new Blob([bytes], { type: 'text/csv' }), 'bench.csv');
    const t0 = performance.now();
    const r = await fetch(`${base}/api/sites/${siteId}/meter-data`, { method: 'POST', headers: h, body: form });
    const body = await r.json();
    const ms = performance.now() - t0;
    const peak = rssKb(app.child.pid!, 'VmHWM');
    if (r.status !== 201) throw new Error(`import failed: ${r.status} ${JSON.stringify(body).slice(0, 300)}`);
    const f0 = performance.now();
    const f = await fetch(`${base}/api/sites/${siteId}/findings`, { headers: h });
    const fj = await f.json();
    const fMs = performance.now() - f0;
    console.log(`${String(rows).padEnd(9)} | ${(bytes.length / 1e6).toFixed(1).padStart(5)} MB | ${papaMs.toFixed(0).padStart(12)} ms | ${ms.toFixed(0).padStart(10)} ms | ${(ms / papaMs).toFixed(2).padStart(5)} | ${Math.round(rows / (ms / 1000)).toLocaleString('en-US').padStart(9)} | ${((peak - before) / 1024).toFixed(0).padStart(19)} MB | ${fMs.toFixed(0)} ms (${fj.periods.length} months, ${body.import.intervals} intervals)`);
  }
  console.log('(Peak RSS growth: the server\'s VmHWM after the upload minus its VmRSS before; the 15-minute run goes first, so the 1-minute figure is growth beyond that.)');
} finally {
  await app.stop();
  rmSync(dir, { recursive: true, force: true });
}
