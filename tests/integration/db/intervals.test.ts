import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDb, type Db } from '../../../src/lib/db/client';
import { applyMigrations } from '../../../src/lib/db/migrate';
import { organization } from '../../../src/lib/db/schema';
import { createSite } from '../../../src/lib/db/sites';
import { ensureMeter, findOverlap, readSeries, storeSeries } from '../../../src/lib/db/intervals';
import type { IntervalSeries } from '../../../src/lib/domain/series/interval-series';

const T0 = Date.UTC(2026, 2, 1); // 2026-03-01T00:00Z
const Q = 15 * 60_000;

/** A synthetic 15-minute series: kWh = index, kvarh lag = index / 2, every 7th reactive-missing. */
function series(fromIndex: number, count: number, offsetKwh = 0): IntervalSeries {
  const s = { intervalMinutes: 15, reactiveSource: 'registers' as const, length: count, startMs: new Float64Array(count), kwh: new Float64Array(count), kvarhLag: new Float64Array(count), kvarhLead: new Float64Array(count), flags: new Uint8Array(count) };
  for (let i = 0; i < count; i++) {
    const k = fromIndex + i;
    s.startMs[i] = T0 + k * Q;
    s.kwh[i] = k + offsetKwh;
    s.kvarhLag[i] = k / 2;
    s.kvarhLead[i] = k % 5 === 0 ? 0.25 : 0;
    s.flags[i] = k % 7 === 0 ? 1 : 0;
  }
  return s;
}

let db: Db;
let org: string;
let meterId: string;

beforeAll(async () => {
  const dir = mkdtempSync(join(tmpdir(), 'varledger-blocks-'));
  const opened = openDb(`file:${join(dir, 'blocks.db')}`);
  db = opened.db;
  await opened.ready;
  await applyMigrations(db);
  org = 'org_blocks';
  await db.insert(organization).values({ id: org, name: 'Blocks', slug: 'blocks' });
  const site = await createSite(db, org, { name: 'S', address: '', timeZone: 'UTC', utility: '', accountNumber: '', currency: 'USD' });
  meterId = (await ensureMeter(db, org, site.id, 'Main')).id;
});

describe('packed day blocks in SQLite', () => {
  it('stores three days of 15-minute data and reads back every value exactly', async () => {
    const s = series(0, 96 * 3);
    await db.transaction((tx) => storeSeries(tx, org, meterId, 'imp_1', s));
    const back = await readSeries(db, org, { id: meterId, intervalMinutes: 15, reactiveSource: 'registers' });
    expect(back.length).toBe(288);
    expect(Array.from(back.startMs)).toEqual(Array.from(s.startMs));
    expect(Array.from(back.kwh)).toEqual(Array.from(s.kwh));
    expect(Array.from(back.kvarhLag)).toEqual(Array.from(s.kvarhLag));
    expect(Array.from(back.kvarhLead)).toEqual(Array.from(s.kvarhLead));
    expect(Array.from(back.flags)).toEqual(Array.from(s.flags));
    const rows = await db.$client.execute({ sql: 'select count(*) as n from interval_block where meter_id = ?', args: [meterId] });
    expect(rows.rows[0]!.n).toBe(3);
  });

  it('reads a sub-range [from, to) across block boundaries', async () => {
    const back = await readSeries(db, org, { id: meterId, intervalMinutes: 15, reactiveSource: 'registers' }, T0 + 90 * Q, T0 + 100 * Q);
    expect(Array.from(back.kwh)).toEqual([90, 91, 92, 93, 94, 95, 96, 97, 98, 99]);
  });

  it('finds the overlap of a new range and replaces only that range, keeping the rest', async () => {
    const overlap = await findOverlap(db, org, meterId, T0 + 200 * Q, T0 + 400 * Q);
    expect(overlap).toEqual({ intervals: 88, firstStartMs: T0 + 200 * Q, lastStartMs: T0 + 287 * Q });
    await db.transaction((tx) => storeSeries(tx, org, meterId, 'imp_2', series(200, 200, 1000)));
    const back = await readSeries(db, org, { id: meterId, intervalMinutes: 15, reactiveSource: 'registers' });
    expect(back.length).toBe(400);
    expect(back.kwh[199]).toBe(199);
    expect(back.kwh[200]).toBe(1200);
    expect(back.kwh[399]).toBe(1399);
    for (let i = 1; i < back.length; i++) expect(back.startMs[i]! - back.startMs[i - 1]!).toBe(Q);
  });

  it('a failed transaction leaves no block behind', async () => {
    const before = await readSeries(db, org, { id: meterId, intervalMinutes: 15, reactiveSource: 'registers' });
    await expect(
      db.transaction(async (tx) => {
        await storeSeries(tx, org, meterId, 'imp_3', series(1000, 96, 5000));
        throw new Error('simulated failure after writing');
      }),
    ).rejects.toThrow('simulated failure');
    const after = await readSeries(db, org, { id: meterId, intervalMinutes: 15, reactiveSource: 'registers' });
    expect(after.length).toBe(before.length);
  });
});
