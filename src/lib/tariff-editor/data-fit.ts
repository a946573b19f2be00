/**
 * Whether a tariff's demand window fits a site's meter data: the engine reads demand in
 * windows made of whole meter intervals (a 5-minute window on 15-minute data cannot be
 * read) and throws on one that does not fit, so the endpoints check first and answer 400.
 */
import type { Db } from '../db/client';
import { listMeters } from '../db/intervals';
import { tariffDataProblems } from '../domain/tariff/evaluate-tariff';
import type { Tariff } from '../domain/tariff/tariff-schema';
import { ApiError } from '../api/errors';

/** The first problem of `tariff` on data at `intervalMinutes`, or null. */
export function demandWindowMisfit(tariff: Tariff, intervalMinutes: number): string | null {
  return tariffDataProblems(tariff, { intervalMinutes })[0]?.message ?? null;
}

/** Refuses (400 naming demandWindowMinutes) a tariff whose demand window does not fit the site's meter data. */
export async function refuseUnfitDemandWindow(db: Db, organizationId: string, siteId: string, tariff: Tariff): Promise<void> {
  for (const m of await listMeters(db, organizationId, siteId)) {
    if (!m.intervalMinutes) continue;
    const problem = demandWindowMisfit(tariff, m.intervalMinutes);
    if (problem) throw new ApiError(400, 'invalid_input', `demandWindowMinutes: ${problem}`, { demandWindowMinutes: problem });
  }
}
