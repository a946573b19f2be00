/**
 * Import speed: papaparse alone vs the full `parseMeterCsv` on the same bytes, for a year
 * of 15-minute (35,040 rows) and 1-minute (525,600 rows) invented data generated in memory.
 * Prints figures; asserts nothing. Run: npx tsx src/scripts/bench-import.ts
 */
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import { parseMeterCsv } from '../lib/import/parse-meter-csv';
import type { MeterMappingInput } from '../lib/import/mapping-schema';

const CHUNK = 65_536;

/** A year of rows as UTF-8 chunks of 64 KiB (the size a multipart stream typically hands over). */
function makeFile(intervalMinutes: number): { chunks: Uint8Array[]; rows: number; bytes: number } {
  const enc = new TextEncoder();
  const chunks: Uint8Array[] = [];
  let buf: string[] = ['Interval start UTC,Energy kWh,Lagging kvarh,Leading kvarh\n'];
  let len = buf[0].length;
  let bytes = 0;
  const start = Date.UTC(2025, 0, 1);
  const rows = (365 * 1440) / intervalMinutes;
  let seed = 12345;
  const rnd = () => ((seed = (seed * 1_103_515_245 + 12_345) >>> 0) / 2 ** 32);
  for (let i = 0; i < rows; i++) {
    const t = new Date(start + i * intervalMinutes * 60_000).toISOString().slice(0, 19) + 'Z';
    const kwh = (20 + 10 * rnd()).toFixed(2);
    const line = `${t},${kwh},${(15 * rnd()).toFixed(2)},${(0.5 * rnd()).toFixed(2)}\n`;
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

const mapping: MeterMappingInput = {
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  timestamp: { column: 'Interval start UTC', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'bench', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Lagging kvarh', lead: 'Leading kvarh', unit: 'kvarh' } }],
};

/** papaparse on its own, streaming the same chunks from a Node Readable, no typing (its fastest mode). */
async function papaAlone(chunks: Uint8Array[]): Promise<number> {
  let rows = 0;
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(Readable.from(chunks.map((c) => Buffer.from(c.buffer, c.byteOffset, c.byteLength))), {
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

const RUNS = 5;

async function main() {
  console.log(`Import bench: median of ${RUNS} runs after one warm-up run each; papaparse alone = its own Node-stream parser, no typing, same 64 KiB chunks.`);
  for (const minutes of [15, 1]) {
    const file = makeFile(minutes);
    await papaAlone(file.chunks);
    await parseMeterCsv(file.chunks, mapping);
    const papaTimes: number[] = [];
    const fullTimes: number[] = [];
    let papaRows = 0;
    let n = 0;
    let peakGrowth = 0;
    for (let run = 0; run < RUNS; run++) {
      let t = performance.now();
      papaRows = await papaAlone(file.chunks);
      papaTimes.push(performance.now() - t);
      global.gc?.();
      const rss0 = process.memoryUsage().rss;
      let peak = rss0;
      const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 10);
      t = performance.now();
      const result = await parseMeterCsv(file.chunks, mapping);
      fullTimes.push(performance.now() - t);
      clearInterval(timer);
      peak = Math.max(peak, process.memoryUsage().rss);
      peakGrowth = Math.max(peakGrowth, peak - rss0);
      if (!result.ok) throw new Error(`bench import failed: ${result.problems[0]?.message}`);
      n = result.meters[0].series.stamps.length;
    }
    const papaMs = median(papaTimes);
    const fullMs = median(fullTimes);
    console.log(
      `${minutes}-min year: ${file.rows.toLocaleString('en-US')} rows, ${(file.bytes / 1e6).toFixed(1)} MB | papaparse alone ${papaMs.toFixed(0)} ms (${Math.round((papaRows / papaMs) * 1000).toLocaleString('en-US')} rows/s) | full parse ${fullMs.toFixed(0)} ms (${Math.round((n / fullMs) * 1000).toLocaleString('en-US')} rows/s) | ratio ${(fullMs / papaMs).toFixed(2)}x | peak RSS growth during a full parse ${(peakGrowth / 1e6).toFixed(0)} MB`,
    );
  }
}

void main();
