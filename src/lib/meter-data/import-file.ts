/**
 * Runs one meter-data import: the stored file is parsed (streaming) with the confirmed
 * mapping, every meter's series is validated, overlaps are checked, and only then are all
 * intervals written in one transaction. Any problem leaves the interval data untouched.
 */
import { eq } from 'drizzle-orm';
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { meter, meterImport } from '../db/schema';
import { ensureMeter, findMeterByName, findOverlap, storeSeries } from '../db/intervals';
import { recordEvent } from '../db/audit-log';
import { openStored } from '../files/store';
import { buildSeries } from '../domain/series/build-series';
import type { IntervalSeries } from '../domain/series/interval-series';
import { parseMeterCsv } from '../import/parse-meter-csv';
import type { MeterMapping } from '../import/mapping-schema';
import { ApiError } from '../api/errors';
import type { SiteDto } from '../schemas/site';

export type ImportRequest = { importId: string; site: SiteDto; organizationId: string; userId: string; fileId: string; sha256: string; bytes: number; mapping: MeterMapping; replace: boolean };

const PROGRESS_EVERY_MS = 400;

/** Parses, checks and stores. Resolves with the finished import row; throws ApiError 409/422 when rejected. */
export async function runImport(db: Db, req: ImportRequest) {
  const { organizationId: org, site } = req;
  await db.insert(meterImport).values({ id: req.importId, organizationId: org, siteId: site.id, fileId: req.fileId, status: 'processing', mapping: req.mapping as unknown as Record<string, unknown>, bytesTotal: req.bytes, createdBy: req.userId });

  let lastWrite = 0;
  let pending: Promise<unknown> = Promise.resolve();
  const parsed = await parseMeterCsv(openStored(req.sha256), req.mapping, {
    siteTimeZone: site.timeZone,
    onProgress: (p) => {
      const now = Date.now();
      if (now - lastWrite < PROGRESS_EVERY_MS) return;
      lastWrite = now;
      pending = pending.then(() => db.update(meterImport).set({ bytesProcessed: p.bytesRead, rowsProcessed: p.rowsProcessed }).where(eq(meterImport.id, req.importId))).catch(() => undefined);
    },
  });
  await pending;

  const reject = async (status: number, code: string, message: string, extra: Record<string, unknown>, problems: unknown[] = [], totalProblems = 0) => {
    await db.update(meterImport).set({ status: 'rejected', problems, totalProblems, finishedAt: new Date() }).where(eq(meterImport.id, req.importId));
    throw new ApiError(status, code, message, undefined, { importId: req.importId, ...extra });
  };

  if (!parsed.ok) {
    const first = parsed.problems[0];
    const lead = first ? first.message : 'The file could not be imported.';
    await reject(422, 'invalid_file', `${parsed.totalProblems} problem${parsed.totalProblems === 1 ? '' : 's'} found; nothing was imported. First: ${lead}`, { problems: parsed.problems, totalProblems: parsed.totalProblems }, parsed.problems, parsed.totalProblems);
  }
  if (!parsed.ok) throw new Error('unreachable');

  // Validate every meter's series and check it against what is stored, before writing anything.
  const ready: { name: string; series: IntervalSeries }[] = [];
  const overlaps: { meter: string; intervals: number; from: string; to: string }[] = [];
  const fmt = (ms: number) => DateTime.fromMillis(ms, { zone: site.timeZone }).toFormat('d LLL yyyy HH:mm');
  for (const pm of parsed.meters) {
    const built = buildSeries(pm.series);
    if (!built.ok) {
      const problems = built.errors.map((e) => ({ row: e.index !== undefined ? (pm.lines[e.index] ?? null) : null, column: null, value: null, message: e.message, code: e.code }));
      await reject(422, 'invalid_file', `Meter "${pm.meterId}": ${built.errors[0]!.message}`, { problems, totalProblems: problems.length }, problems, problems.length);
    }
    if (!built.ok) throw new Error('unreachable');
    const s = built.value;
    if (s.length === 0) continue;
    const existing = await findMeterByName(db, org, site.id, pm.meterId);
    if (existing?.intervalMinutes && existing.intervalMinutes !== s.intervalMinutes) {
      const problems = [{ row: null, column: null, value: `${s.intervalMinutes} min`, code: 'interval-mismatch', message: `Meter "${pm.meterId}" already holds ${existing.intervalMinutes}-minute data and this file has ${s.intervalMinutes}-minute intervals. Import it under another meter name, or delete the meter's data first.` }];
      await reject(422, 'invalid_file', problems[0]!.message, { problems, totalProblems: 1 }, problems, 1);
    }
    if (existing && !req.replace) {
      const o = await findOverlap(db, org, existing.id, s.startMs[0]!, s.startMs[s.length - 1]!);
      if (o) overlaps.push({ meter: pm.meterId, intervals: o.intervals, from: fmt(o.firstStartMs), to: fmt(o.lastStartMs) });
    }
    ready.push({ name: pm.meterId, series: s });
  }
  if (overlaps.length) {
    const o = overlaps[0]!;
    await reject(409, 'overlap', `This file overlaps data already imported: meter "${o.meter}" has ${o.intervals.toLocaleString('en-US')} intervals from ${o.from} to ${o.to}. Upload again with "replace" to overwrite that range.`, { overlap: overlaps });
  }

  const intervals = ready.reduce((n, r) => n + r.series.length, 0);
  const first = Math.min(...ready.map((r) => r.series.startMs[0]!));
  const last = Math.max(...ready.map((r) => r.series.startMs[r.series.length - 1]!));
  await db.transaction(async (tx) => {
    for (const r of ready) {
      const m = await ensureMeter(tx, org, site.id, r.name);
      await storeSeries(tx, org, m.id, req.importId, r.series);
      const channel = req.mapping.meters.find((c) => c.meterId === r.name) ?? req.mapping.meters[0];
      await tx.update(meter).set({ intervalMinutes: r.series.intervalMinutes, reactiveSource: r.series.reactiveSource, importProfile: { ...req.mapping, meters: channel ? [channel] : req.mapping.meters } as unknown as Record<string, unknown> }).where(eq(meter.id, m.id));
    }
    await tx
      .update(meterImport)
      .set({ status: 'imported', quality: parsed.quality as unknown as Record<string, unknown>, bytesProcessed: req.bytes, rowsProcessed: parsed.quality.dataRows, intervals, firstStartMs: Number.isFinite(first) ? first : null, lastStartMs: Number.isFinite(last) ? last : null, replaced: req.replace, finishedAt: new Date() })
      .where(eq(meterImport.id, req.importId));
  });
  await recordEvent(db, org, req.userId, { action: 'meter-data.imported', subjectType: 'meter-import', subjectId: req.importId, detail: { siteId: site.id, meters: ready.map((r) => r.name), intervals, replaced: req.replace } });
  return (await db.query.meterImport.findFirst({ where: eq(meterImport.id, req.importId) }))!;
}
