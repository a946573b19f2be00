/**
 * Runs one meter-data import: the stored file is parsed (streaming) with the confirmed
 * mapping, every meter's series is validated, and then overlaps are checked and all
 * intervals written in one write transaction. Any problem leaves the interval data untouched.
 */
import { and, eq } from 'drizzle-orm';
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { meter, meterImport } from '../db/schema';
import { ensureMeter, findMeterByName, findOverlap, storeSeries } from '../db/intervals';
import { recordEvent } from '../db/audit-log';
import { importedFromFile } from '../db/meter-imports';
import { openStored } from '../files/store';
import { buildSeries } from '../domain/series/build-series';
import type { IntervalSeries } from '../domain/series/interval-series';
import { parseMeterCsv } from '../import/parse-meter-csv';
import type { MeterMapping } from '../import/mapping-schema';
import { ApiError } from '../api/errors';
import { isBusyError } from '../db/busy';
import type { SiteDto } from '../schemas/site';

export type ImportRequest = { importId: string; site: SiteDto; organizationId: string; userId: string; fileId: string; sha256: string; bytes: number; mapping: MeterMapping; replace: boolean };

const PROGRESS_EVERY_MS = 400;

type Refusal = { status: number; code: string; message: string; extra: Record<string, unknown>; problems?: unknown[]; totalProblems?: number };

/** An import that failed for a reason other than its content (e.g. the database stayed locked) is logged as interrupted. */
async function markFailed(db: Db, importId: string, err: unknown) {
  const busy = isBusyError(err);
  const message = busy
    ? 'The database was busy with another change, so nothing from this file was stored. Upload it again.'
    : 'The import stopped on a server error, so nothing from this file was stored. Upload it again.';
  await db
    .update(meterImport)
    .set({ status: 'interrupted', problems: [{ row: null, column: null, value: null, code: busy ? 'busy' : 'server-error', message }], totalProblems: 0, finishedAt: new Date() })
    .where(and(eq(meterImport.id, importId), eq(meterImport.status, 'processing')))
    .catch((e) => console.error(`[imports] could not mark ${importId} interrupted`, e));
}

/** Parses, checks and stores. Resolves with the finished import row; throws ApiError 409/422 when rejected. */
export async function runImport(db: Db, req: ImportRequest) {
  await db.insert(meterImport).values({ id: req.importId, organizationId: req.organizationId, siteId: req.site.id, fileId: req.fileId, status: 'processing', mapping: req.mapping as unknown as Record<string, unknown>, bytesTotal: req.bytes, createdBy: req.userId });
  try {
    await parseCheckAndStore(db, req);
  } catch (err) {
    // A refusal was logged as rejected; anything else (a read error, the database staying
    // locked) wrote nothing either, and the history says so.
    if (!(err instanceof ApiError)) await markFailed(db, req.importId, err);
    throw err;
  }
  return (await db.query.meterImport.findFirst({ where: eq(meterImport.id, req.importId) }))!;
}

async function parseCheckAndStore(db: Db, req: ImportRequest): Promise<void> {
  const { organizationId: org, site } = req;
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

  const reject = async (r: Refusal): Promise<never> => {
    await db.update(meterImport).set({ status: 'rejected', problems: r.problems ?? [], totalProblems: r.totalProblems ?? 0, finishedAt: new Date() }).where(eq(meterImport.id, req.importId));
    throw new ApiError(r.status, r.code, r.message, undefined, { importId: req.importId, ...r.extra });
  };

  if (!parsed.ok) {
    const first = parsed.problems[0];
    const lead = first ? first.message : 'The file could not be imported.';
    return reject({ status: 422, code: 'invalid_file', message: `${parsed.totalProblems} problem${parsed.totalProblems === 1 ? '' : 's'} found; nothing was imported. First: ${lead}`, extra: { problems: parsed.problems, totalProblems: parsed.totalProblems }, problems: parsed.problems, totalProblems: parsed.totalProblems });
  }

  // Validate every meter's series before touching the stored data.
  const ready: { name: string; series: IntervalSeries }[] = [];
  for (const pm of parsed.meters) {
    const built = buildSeries(pm.series);
    if (!built.ok) {
      const problems = built.errors.map((e) => ({ row: e.index !== undefined ? (pm.lines[e.index] ?? null) : null, column: null, value: null, message: e.message, code: e.code }));
      return reject({ status: 422, code: 'invalid_file', message: `Meter "${pm.meterId}": ${built.errors[0]!.message}`, extra: { problems, totalProblems: problems.length }, problems, totalProblems: problems.length });
    }
    if (built.value.length > 0) ready.push({ name: pm.meterId, series: built.value });
  }

  const intervals = ready.reduce((n, r) => n + r.series.length, 0);
  const first = Math.min(...ready.map((r) => r.series.startMs[0]!));
  const last = Math.max(...ready.map((r) => r.series.startMs[r.series.length - 1]!));
  const fmt = (ms: number) => DateTime.fromMillis(ms, { zone: site.timeZone }).toFormat('d LLL yyyy HH:mm');
  // The checks against stored data and the write are one write transaction (BEGIN IMMEDIATE):
  // two imports to the same meter at once are serialised, so the second one sees the first
  // one's intervals and is refused as an overlap instead of being merged into them.
  const refusal = await db.transaction(async (tx): Promise<Refusal | null> => {
    if (!req.replace) {
      // The same bytes uploaded twice at once: the one that got here second is told so.
      const earlier = await importedFromFile(tx as unknown as Db, org, req.fileId);
      if (earlier) return { status: 409, code: 'already_imported', message: `This file was already imported on ${earlier.createdAt.toISOString().slice(0, 10)} (${earlier.intervals.toLocaleString('en-US')} intervals). Nothing was added. To import it again with another mapping, upload it with "replace".`, extra: { earlierImportId: earlier.id } };
    }
    const overlaps: { meter: string; intervals: number; from: string; to: string }[] = [];
    for (const r of ready) {
      const s = r.series;
      const existing = await findMeterByName(tx, org, site.id, r.name);
      if (existing?.intervalMinutes && existing.intervalMinutes !== s.intervalMinutes) {
        const problems = [{ row: null, column: null, value: `${s.intervalMinutes} min`, code: 'interval-mismatch', message: `Meter "${r.name}" already holds ${existing.intervalMinutes}-minute data and this file has ${s.intervalMinutes}-minute intervals. Import it under another meter name, or delete the meter's data first.` }];
        return { status: 422, code: 'invalid_file', message: problems[0]!.message, extra: { problems, totalProblems: 1 }, problems, totalProblems: 1 };
      }
      if (existing && !req.replace) {
        const o = await findOverlap(tx, org, existing.id, s.startMs[0]!, s.startMs[s.length - 1]!);
        if (o) overlaps.push({ meter: r.name, intervals: o.intervals, from: fmt(o.firstStartMs), to: fmt(o.lastStartMs) });
      }
    }
    if (overlaps.length) {
      const o = overlaps[0]!;
      return { status: 409, code: 'overlap', message: `This file overlaps data already imported: meter "${o.meter}" has ${o.intervals.toLocaleString('en-US')} intervals from ${o.from} to ${o.to}. Upload again with "replace" to overwrite that range.`, extra: { overlap: overlaps } };
    }
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
    // In the same transaction: a stored import always has its log entry, a failed one none.
    await recordEvent(tx as unknown as Db, org, req.userId, { action: 'meter-data.imported', subjectType: 'meter-import', subjectId: req.importId, detail: { siteId: site.id, meters: ready.map((r) => r.name), intervals, replaced: req.replace } });
    return null;
  });
  if (refusal) await reject(refusal);
}
