/**
 * Import speed: papaparse alone vs the full `parseMeterCsv` on the same bytes, for a year
 * of 15-minute (35,040 rows) and 1-minute (525,600 rows) invented data generated in memory,
 * plus a 1-minute year in local wall-clock time (the zone-resolution path).
 * Prints figures; asserts nothing. Run: npx tsx src/scripts/bench-import.ts
 */
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import { parseMeterCsv } from '../lib/import/parse-meter-csv';
import type { MeterMappingInput } from '../lib/import/mapping-schema';

const CHUNK = 65_536;

/** A year of rows as UTF-8 chunks of 64 KiB (the size a multipart stream typically hands over). */
function makeFile(intervalMinutes: number, local = false): { chunks: Uint8Array[]; rows: number; bytes: number } {
  const enc = new TextEncoder();
  const chunks: Uint8Array[] = [];
  let buf: string[] = [local ? 'Date;Time;Energy kWh;Lagging kvarh;Leading kvarh\n' : 'Interval start UTC,Energy kWh,Lagging kvarh,Leading kvarh\n'];
  let len = buf[0].length;
  let bytes = 0;
  const start = Date.UTC(2025, 0, 1);
  const rows = (365 * 1440) / intervalMinutes;
  let seed = 12345;
  const rnd = () => ((seed = (seed * 1_103_515_245 + 12_345) >>> 0) / 2 ** 32);
  for (let i = 0; i < rows; i++) {
    const ms = start + i * intervalMinutes * 60_000;
    const kwh = (20 + 10 * rnd()).toFixed(2);
    let line: string;
    if (local) {
      // Europe/London wall clock, day-first, decimal comma: the slowest layout (zone resolution per row).
      const w = new Date(ms + londonOffsetMin(ms) * 60_000).toISOString();
      const c = (v: number) => v.toFixed(2).replace('.', ',');
      line = `${w.slice(8, 10)}/${w.slice(5, 7)}/${w.slice(0, 4)};${w.slice(11, 16)};${kwh.replace('.', ',')};${c(15 * rnd())};${c(0.5 * rnd())}\n`;
    } else {
      line = `${new Date(ms).toISOString().slice(0, 19)}Z,${kwh},${(15 * rnd()).toFixed(2)},${(0.5 * rnd()).toFixed(2)}\n`;
    }
    buf.push(line);
    len += line.length;
    if (len >= CHUNK) {
      const c = enc.encode(buf.join(''));
      chunks.push(c);
      bytes += c.byteLength;
      buf = [];
      len = 0;
    }
  }
  const c = enc.encode(buf.join(''));
  chunks.push(c);
  bytes += c.byteLength;
  return { chunks, rows, bytes };
}

/** UK summer time 2025 (tz database): 30 March 01:00 UTC to 26 October 01:00 UTC. */
function londonOffsetMin(ms: number): number {
  return ms >= Date.UTC(2025, 2, 30, 1) && ms < Date.UTC(2025, 9, 26, 1) ? 60 : 0;
}

const localMapping: MeterMappingInput = {
  version: 1,
  delimiter: ';',
  decimalSeparator: ',',
  timestamp: { column: 'Date', timeColumn: 'Time', format: 'date-time', dateOrder: 'dmy', zone: 'local', timeZone: 'Europe/London', stampAt: 'start' },
  meters: [{ meterId: 'bench', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Lagging kvarh', lead: 'Leading kvarh', unit: 'kvarh' } }],
};

const mapping: MeterMappingInput = {
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  timestamp: { column: 'Interval start UTC', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'bench', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Lagging kvarh', lead: 'Leading kvarh', unit: 'kvarh' } }],
};

/** papaparse on its own, streaming the same chunks from a Node Readable, no typing (its fastest mode). */
async function papaAlone(chunks: Uint8Array[], delimiter: string): Promise<number> {
  let rows = 0;
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(Readable.from(chunks.map((c) => Buffer.from(c.buffer, c.byteOffset, c.byteLength))), {
      delimiter,
      chunk: (r) => {
        rows += r.data.length;
      },
      complete: () => resolve(),
      error: (e) => reject(e),
    });
  });
  return rows;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const RUNS = 7;

/** CPU milliseconds (user + system) of this process since `from`: steadier than wall time on a shared machine. */
function cpuMs(from: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(from);
  return (d.user + d.system) / 1000;
}

async function main() {
  console.log(`Import bench: median of ${RUNS} runs after one warm-up run each; papaparse alone = its own Node-stream parser, no typing, same 64 KiB chunks. Ratio = median of per-run CPU-time ratios (full / papaparse).`);
  const cases: [string, number, boolean][] = [
    ['15-min year, ISO UTC', 15, false],
    ['1-min year, ISO UTC', 1, false],
    ['1-min year, local day-first decimal comma', 1, true],
  ];
  for (const [label, minutes, local] of cases) {
    const file = makeFile(minutes, local);
    const m = local ? localMapping : mapping;
    const delimiter = local ? ';' : ',';
    await papaAlone(file.chunks, delimiter);
    await parseMeterCsv(file.chunks, m);
    const papaWall: number[] = [];
    const fullWall: number[] = [];
    const ratios: number[] = [];
    let papaRows = 0;
    let n = 0;
    let peakGrowth = 0;
    for (let run = 0; run < RUNS; run++) {
      let c = process.cpuUsage();
      let t = performance.now();
      papaRows = await papaAlone(file.chunks, delimiter);
      papaWall.push(performance.now() - t);
      const papaCpu = cpuMs(c);
      const rss0 = process.memoryUsage().rss;
      let peak = rss0;
      const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 10);
      c = process.cpuUsage();
      t = performance.now();
      const result = await parseMeterCsv(file.chunks, m);
      fullWall.push(performance.now() - t);
      ratios.push(cpuMs(c) / papaCpu);
      clearInterval(timer);
      peak = Math.max(peak, process.memoryUsage().rss);
      peakGrowth = Math.max(peakGrowth, peak - rss0);
      if (!result.ok) throw new Error(`bench import failed: ${result.problems[0]?.message}`);
      n = result.meters[0].series.stamps.length;
    }
    const papaMs = median(papaWall);
    const fullMs = median(fullWall);
    console.log(
      `${label}: ${file.rows.toLocaleString('en-US')} rows, ${(file.bytes / 1e6).toFixed(1)} MB | papaparse alone ${papaMs.toFixed(0)} ms (${Math.round((papaRows / papaMs) * 1000).toLocaleString('en-US')} rows/s) | full parse ${fullMs.toFixed(0)} ms (${Math.round((n / fullMs) * 1000).toLocaleString('en-US')} rows/s) | ratio ${median(ratios).toFixed(2)}x | peak RSS growth during a full parse ${(peakGrowth / 1e6).toFixed(0)} MB`,
    );
  }
  console.log('(RSS growth is the peak RSS during a full parse minus RSS just before it, sampled every 10 ms: approximate, as memory freed by earlier runs is reused.)');
}

void main();
