/** Loads a site's findings inputs from the database and runs the computation. */
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { listMeters, readSeries, type MeterRow } from '../db/intervals';
import { listTariffs } from '../db/tariffs';
import { listBills } from '../db/bills';
import type { SiteDto } from '../schemas/site';
import { ApiError, notFound } from '../api/errors';
import { computeFindings, type Findings } from './compute';

export type FindingsRequest = { from?: string; to?: string; tariffId?: string; meterId?: string; basis: 'month' | 'billing' };
export type SiteFindings = Findings & { site: { id: string; name: string; auditState: string }; status: 'draft' | 'final'; meter: { id: string; name: string } | null };

export async function siteFindings(db: Db, organizationId: string, site: SiteDto, q: FindingsRequest): Promise<SiteFindings> {
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
  return {
    ...r.findings,
    site: { id: site.id, name: site.name, auditState: site.auditState },
    status: site.auditState === 'draft' ? 'draft' : 'final',
    meter: m ? { id: m.id, name: m.name } : null,
  };
}

async function emptySeries() {
  return { intervalMinutes: 15, length: 0, reactiveSource: 'none' as const, startMs: new Float64Array(0), kwh: new Float64Array(0), kvarhLag: new Float64Array(0), kvarhLead: new Float64Array(0), flags: new Uint8Array(0) };
}
