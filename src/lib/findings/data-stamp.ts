/**
 * A site's findings data stamp: one small indexed query over everything findings read, hashed.
 * It changes whenever the inputs can have changed, whoever changed them (this server or another
 * instance on the same libSQL server):
 * - interval data: the count of the site's `imported` meter imports. Every interval write is an
 *   import, and the import row turns `imported` in the same transaction as its intervals (a
 *   replace is a new import row), and import rows are never deleted while the site exists;
 * - meters: id, name, interval and reactive source of each;
 * - tariff versions: id, updated time, start date, name and the whole definition text, so an
 *   edit is seen even within the same millisecond, and a delete plus a create in one second too;
 * - bills: id and period of each (billing periods come from them).
 * The site's own row (time zone, updated time) is not read here: callers pass the site they
 * have just read, and the cache key carries its time zone and updated time.
 * Per-row lists are ordered by id inside their subquery, so the same rows give the same text.
 */
import { createHash } from 'node:crypto';
import type { Db } from '../db/client';

const STAMP_SQL = `SELECT
  (SELECT count(*) FROM meter_import WHERE site_id = :site AND organization_id = :org AND status = 'imported') AS imports,
  (SELECT group_concat(v, char(30)) FROM (SELECT id || char(31) || name || char(31) || coalesce(interval_minutes, '') || char(31) || coalesce(reactive_source, '') AS v FROM meter WHERE site_id = :site AND organization_id = :org ORDER BY id)) AS meters,
  (SELECT group_concat(v, char(30)) FROM (SELECT id || char(31) || updated_at || char(31) || effective_from || char(31) || name || char(31) || definition AS v FROM tariff WHERE site_id = :site AND organization_id = :org ORDER BY id)) AS tariffs,
  (SELECT group_concat(v, char(30)) FROM (SELECT id || char(31) || period_start || char(31) || period_end AS v FROM bill WHERE site_id = :site AND organization_id = :org ORDER BY id)) AS bills`;

/** The stamp of the site's findings inputs now (a hex digest; equal stamps mean equal inputs). */
export async function findingsDataStamp(db: Db, organizationId: string, siteId: string): Promise<string> {
  const r = await db.$client.execute({ sql: STAMP_SQL, args: { site: siteId, org: organizationId } });
  const row = r.rows[0];
  const text = row ? [row.imports, row.meters, row.tariffs, row.bills].map((v) => String(v ?? '')).join('\u001d') : '';
  return createHash('sha1').update(text).digest('hex');
}
