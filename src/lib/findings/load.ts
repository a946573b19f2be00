/**
 * Loads a site's findings inputs from the database and runs the computation, through the
 * findings cache: a result is reused while the site's data stamp (data-stamp.ts, read on every
 * call) is unchanged. The site, its audit state and the draft/final status are added on every
 * call from the site row the caller just read, so a purchase shows at once.
 */
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { listMeters, readSeries, type MeterRow } from '../db/intervals';
import { listTariffs } from '../db/tariffs';
import { listBills } from '../db/bills';
import type { SiteDto } from '../schemas/site';
import { ApiError, notFound } from '../api/errors';
import { computeFindings, type Findings } from './compute';
import { StampedCache } from './cache';
import { findingsDataStamp } from './data-stamp';

export type FindingsRequest = { from?: string; to?: string; tariffId?: string; meterId?: string; basis: 'month' | 'billing' };
type MeterFindings = Findings & { meter: { id: string; name: string } | null };
export type SiteFindings = MeterFindings & { site: { id: string; name: string; auditState: string }; status: 'draft' | 'final' };

/**
 * About 30 KB of JSON for a year of months with a two-rule tariff, whatever the interval length,
 * so the entry bound is what usually applies; the byte bound (JSON length, a lower bound of the heap it holds) caps unusual results.
 */
export const FINDINGS_CACHE_LIMITS = { maxEntries: 500, maxBytes: 24 * 1024 * 1024 };
export const findingsCache = new StampedCache<MeterFindings>(FINDINGS_CACHE_LIMITS, (v) => JSON.stringify(v).length);

const keyOf = (organizationId: string, site: SiteDto, q: FindingsRequest) => [organizationId, site.id, site.timeZone, site.updatedAt, q.basis, q.from ?? '', q.to ?? '', q.tariffId ?? '', q.meterId ?? ''].join('\u0000');

/** The findings of a site (one meter) over the asked range, with the site's current status. */
export async function siteFindings(db: Db, organizationId: string, site: SiteDto, q: FindingsRequest): Promise<SiteFindings> {
  // The stamp is read before any input, so a result is never stored under a stamp newer than its data.
  const stamp = await findingsDataStamp(db, organizationId, site.id);
  const f = await findingsCache.get(keyOf(organizationId, site, q), stamp, () => computeSiteFindings(db, organizationId, site, q));
  return {
    ...f,
    site: { id: site.id, name: site.name, auditState: site.auditState },
    status: site.auditState === 'draft' ? 'draft' : 'final',
  };
}

async function computeSiteFindings(db: Db, organizationId: string, site: SiteDto, q: FindingsRequest): Promise<MeterFindings> {
  const meters = await listMeters(db, organizationId, site.id);
  let m: MeterRow | undefined = meters[0];
  if (q.meterId) {
    m = meters.find((x) => x.id === q.meterId);
    if (!m) throw notFound('Meter');
  }
  const zone = site.timeZone;
  const fromMs = q.from ? DateTime.fromISO(q.from, { zone }).startOf('day').toMillis() : undefined;
  const toMs = q.to ? DateTime.fromISO(q.to, { zone }).plus({ days: 1 }).startOf('day').toMillis() : undefined;
  if (fromMs !== undefined && toMs !== undefined && toMs <= fromMs) throw new ApiError(400, 'invalid_input', '`to` must not be before `from`.', { to: 'Before from.' });

  let tariffs = await listTariffs(db, organizationId, site.id);
  if (q.tariffId) {
    const t = tariffs.find((x) => x.id === q.tariffId);
    if (!t) throw notFound('Tariff');
    tariffs = [{ ...t, effectiveFrom: '0000-01-01' }];
  }
  const bills = q.basis === 'billing' ? await listBills(db, organizationId, site.id) : [];
  if (q.basis === 'billing' && bills.length === 0) throw new ApiError(422, 'no_bills', 'Billing periods come from the bills: enter or import bills first, or ask for calendar months.');
  const billRanges = bills.map((b) => ({ from: b.periodStart, to: b.periodEnd }));
  // Read a little beyond the asked range so that billing periods at the edges are whole.
  const readFrom = Math.min(fromMs ?? 0, ...(billRanges.length ? [DateTime.fromISO(billRanges[0]!.from, { zone }).toMillis()] : []));
  const series = m ? await readSeries(db, organizationId, m, q.basis === 'billing' ? readFrom : (fromMs ?? 0), toMs ?? 8.64e15) : await emptySeries();
  const r = computeFindings({ series, zone, tariffs, basis: q.basis, billRanges, fromMs, toMs });
  if (!r.ok) throw new ApiError(r.status, 'cannot_compute', r.message);
  return { ...r.findings, meter: m ? { id: m.id, name: m.name } : null };
}

async function emptySeries() {
  return { intervalMinutes: 15, length: 0, reactiveSource: 'none' as const, startMs: new Float64Array(0), kwh: new Float64Array(0), kvarhLag: new Float64Array(0), kvarhLead: new Float64Array(0), flags: new Uint8Array(0) };
}
