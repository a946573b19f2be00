/** Meters and their interval data (packed day blocks). Every function is scoped by organization. */
import { and, asc, between, eq, gte, lte, sql } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { intervalBlock, meter } from './schema';
import type { IntervalSeries } from '../domain/series/interval-series';
import { DAY_MS, concatBlocks, mergeDay, pack, splitByDay, unpack, type DayBlock } from './interval-blocks';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Conn = Db | Tx;

export type MeterRow = typeof meter.$inferSelect;

export async function listMeters(db: Conn, organizationId: string, siteId: string): Promise<MeterRow[]> {
  return db.select().from(meter).where(and(eq(meter.organizationId, organizationId), eq(meter.siteId, siteId))).orderBy(asc(meter.name));
}

export async function getMeter(db: Conn, organizationId: string, meterId: string): Promise<MeterRow | undefined> {
  return db.query.meter.findFirst({ where: and(eq(meter.organizationId, organizationId), eq(meter.id, meterId)) });
}

export async function findMeterByName(db: Conn, organizationId: string, siteId: string, name: string) {
  return db.query.meter.findFirst({ where: and(eq(meter.organizationId, organizationId), eq(meter.siteId, siteId), eq(meter.name, name)) });
}

export async function ensureMeter(db: Conn, organizationId: string, siteId: string, name: string): Promise<MeterRow> {
  const found = await findMeterByName(db, organizationId, siteId, name);
  if (found) return found;
  const [row] = await db.insert(meter).values({ id: newId('mtr'), organizationId, siteId, name }).returning();
  return row!;
}

async function blocksInDays(db: Conn, organizationId: string, meterId: string, d0: number, d1: number): Promise<DayBlock[]> {
  const rows = await db
    .select()
    .from(intervalBlock)
    .where(and(eq(intervalBlock.organizationId, organizationId), eq(intervalBlock.meterId, meterId), between(intervalBlock.day, d0, d1)))
    .orderBy(asc(intervalBlock.day));
  return rows.map(unpack);
}

export type Overlap = { intervals: number; firstStartMs: number; lastStartMs: number };

/** Existing intervals of a meter whose start lies in [fromMs, toMs], or null when none. */
export async function findOverlap(db: Conn, organizationId: string, meterId: string, fromMs: number, toMs: number): Promise<Overlap | null> {
  const blocks = await blocksInDays(db, organizationId, meterId, Math.floor(fromMs / DAY_MS), Math.floor(toMs / DAY_MS));
  let intervals = 0;
  let first = Infinity;
  let last = -Infinity;
  for (const b of blocks)
    for (let i = 0; i < b.count; i++) {
      const t = b.startMs[i]!;
      if (t < fromMs || t > toMs) continue;
      intervals++;
      if (t < first) first = t;
      if (t > last) last = t;
    }
  return intervals ? { intervals, firstStartMs: first, lastStartMs: last } : null;
}

/**
 * Writes a series for a meter inside the caller's transaction. Existing intervals that start
 * within the new data's first..last range are replaced (the caller decides whether that is
 * allowed); intervals outside it are kept and merged into the same day blocks.
 */
export async function storeSeries(tx: Tx, organizationId: string, meterId: string, importId: string, s: IntervalSeries): Promise<void> {
  if (s.length === 0) return;
  const fromMs = s.startMs[0]!;
  const toMs = s.startMs[s.length - 1]!;
  const d0 = Math.floor(fromMs / DAY_MS);
  const d1 = Math.floor(toMs / DAY_MS);
  const existing = new Map((await blocksInDays(tx, organizationId, meterId, d0, d1)).map((b) => [b.day, b]));
  const incoming = new Map(splitByDay(s).map((b) => [b.day, b]));
  const empty = (day: number): DayBlock => ({ day, count: 0, startMs: new Float64Array(0), kwh: new Float64Array(0), kvarhLag: new Float64Array(0), kvarhLead: new Float64Array(0), flags: new Uint8Array(0) });
  const days = new Set([...existing.keys(), ...incoming.keys()]);
  const rows: (typeof intervalBlock.$inferInsert)[] = [];
  const emptied: number[] = [];
  for (const day of [...days].sort((a, b) => a - b)) {
    const old = existing.get(day);
    const neu = incoming.get(day) ?? empty(day);
    const merged = old ? mergeDay(old, neu, fromMs, toMs) : neu;
    if (merged.count === 0) {
      emptied.push(day);
      continue;
    }
    const p = pack(merged);
    rows.push({ meterId, day, organizationId, importId, intervalMinutes: s.intervalMinutes, count: p.count, startMs: p.startMs, kwh: p.kwh, kvarhLag: p.kvarhLag, kvarhLead: p.kvarhLead, flags: p.flags });
  }
  for (const day of emptied) await tx.delete(intervalBlock).where(and(eq(intervalBlock.meterId, meterId), eq(intervalBlock.day, day)));
  // Multi-row upserts (a day block is one row), well under SQLite's bound-parameter limit per statement.
  const excluded = (col: string) => sql.raw(`excluded.${col}`);
  for (let i = 0; i < rows.length; i += BATCH) {
    await tx
      .insert(intervalBlock)
      .values(rows.slice(i, i + BATCH))
      .onConflictDoUpdate({
        target: [intervalBlock.meterId, intervalBlock.day],
        set: { importId: excluded('import_id'), intervalMinutes: excluded('interval_minutes'), count: excluded('count'), startMs: excluded('start_ms'), kwh: excluded('kwh'), kvarhLag: excluded('kvarh_lag'), kvarhLead: excluded('kvarh_lead'), flags: excluded('flags') },
      });
  }
}

const BATCH = 100;

/** Reads a meter's intervals whose start lies in [fromMs, toMs) as an engine series. */
export async function readSeries(db: Conn, organizationId: string, m: Pick<MeterRow, 'id' | 'intervalMinutes' | 'reactiveSource'>, fromMs = 0, toMs = 8.64e15): Promise<IntervalSeries> {
  const rows = await db
    .select()
    .from(intervalBlock)
    .where(and(eq(intervalBlock.organizationId, organizationId), eq(intervalBlock.meterId, m.id), gte(intervalBlock.day, Math.floor(fromMs / DAY_MS)), lte(intervalBlock.day, Math.floor((toMs - 1) / DAY_MS))))
    .orderBy(asc(intervalBlock.day));
  const arrays = concatBlocks(rows.map(unpack), fromMs, toMs);
  return { intervalMinutes: m.intervalMinutes ?? rows[0]?.intervalMinutes ?? 15, reactiveSource: m.reactiveSource ?? 'registers', ...arrays };
}
