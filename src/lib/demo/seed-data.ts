/**
 * Seeds the demo plants' invented data through the same paths a user takes: each meter export
 * is stored and imported with its mapping, an example tariff is entered, and the bill history
 * is read from its CSV with the PF charges a utility would print (one plant's bills carry a
 * meter-multiplier error in the generator; one bill at another plant is deliberately mis-billed).
 * Idempotent: a site that already has meter data, a tariff or bills keeps them.
 */
import { recordEvent } from '../db/audit-log';
import { eq } from 'drizzle-orm';
import { Readable } from 'node:stream';
import type { Db } from '../db/client';
import { bill, organization, user } from '../db/schema';
import { findSiteByName, toSiteDto } from '../db/sites';
import { listMeters, readSeries } from '../db/intervals';
import { createTariff, listTariffs } from '../db/tariffs';
import { billValues, listBills } from '../db/bills';
import { addStoredFile, findStoredFile } from '../db/meter-imports';
import { commitToStore, receiveToTemp } from '../files/store';
import { runImport } from '../meter-data/import-file';
import { newImportId } from '../meter-data/receive';
import { MeterMappingSchema } from '../import/mapping-schema';
import { parseBillCsv } from '../import/bills/parse-bill-csv';
import { tariffSchema } from '../domain/tariff/tariff-schema';
import { computeFindings } from '../findings/compute';
import { DEMO_METER_SITES, demoBillCsv, demoBillMapping, demoBills, demoMeterCsv, demoMeterMapping, demoMeterSite, type DemoBill } from './meter-csv';
import { DEMO_SITE_TARIFF, EXAMPLE_TARIFFS } from './tariffs';
import { DEMO_WORKSPACES } from './scenario';

/** How far the deliberately mis-billed PF charge is off (the bill shows 60 % more). */
export const DEMO_MISBILLED_FACTOR = 1.6;

async function storeText(db: Db, organizationId: string, siteId: string, text: string, fileName: string, userId: string) {
  const received = await receiveToTemp(Readable.from([Buffer.from(text, 'utf8')]), 200 * 1024 * 1024);
  await commitToStore(received);
  return (await findStoredFile(db, organizationId, siteId, 'meter-data', received.sha256)) ?? (await addStoredFile(db, { organizationId, siteId, kind: 'meter-data', sha256: received.sha256, fileName, contentType: 'text/csv', bytes: received.bytes, createdBy: userId }));
}

export async function seedDemoData(db: Db): Promise<{ imported: number; tariffs: number; bills: number }> {
  const counts = { imported: 0, tariffs: 0, bills: 0 };
  const ws = DEMO_WORKSPACES[0]!;
  const org = await db.query.organization.findFirst({ where: eq(organization.slug, ws.slug) });
  const energy = await db.query.user.findFirst({ where: eq(user.email, 'energy@northgate.example') });
  if (!org || !energy) return counts;

  for (const w of DEMO_WORKSPACES) {
    const o = await db.query.organization.findFirst({ where: eq(organization.slug, w.slug) });
    if (!o) continue;
    for (const s of w.sites) {
      const row = await findSiteByName(db, o.id, s.name);
      if (!row) continue;
      if ((await listTariffs(db, o.id, row.id)).length === 0) {
        const ex = EXAMPLE_TARIFFS.find((e) => e.key === DEMO_SITE_TARIFF[s.name])!;
        const t = await createTariff(db, o.id, row.id, { ...tariffSchema.parse(ex.tariff), effectiveFrom: ex.tariff.effectiveFrom }, energy.id);
        await recordEvent(db, o.id, energy.id, { action: 'tariff.created', subjectType: 'tariff', subjectId: t.id, detail: { siteId: row.id, name: ex.tariff.name, effectiveFrom: ex.tariff.effectiveFrom, rules: ex.tariff.rules.length } });
        counts.tariffs++;
      }
    }
  }

  for (const key of DEMO_METER_SITES) {
    const spec = demoMeterSite(key);
    const row = await findSiteByName(db, org.id, spec.siteName);
    if (!row) continue;
    const site = toSiteDto(row);
    if ((await listMeters(db, org.id, site.id)).length === 0) {
      const file = await storeText(db, org.id, site.id, demoMeterCsv(key), `${key}-2025.csv`, energy.id);
      await runImport(db, { importId: newImportId(), site, organizationId: org.id, userId: energy.id, fileId: file.id, sha256: file.sha256, bytes: file.bytes, mapping: MeterMappingSchema.parse(demoMeterMapping(key)), replace: false });
      counts.imported++;
    }
    if ((await listBills(db, org.id, site.id)).length > 0) continue;
    // The PF charge each bill prints: the tariff applied to the billing period's interval data.
    const bills = demoBills(key);
    const meter = (await listMeters(db, org.id, site.id))[0]!;
    const series = await readSeries(db, org.id, meter);
    const tariffs = await listTariffs(db, org.id, site.id);
    const f = computeFindings({ series, zone: site.timeZone, tariffs, basis: 'billing', billRanges: bills.map((b) => ({ from: b.periodStart, to: b.periodEnd })) });
    const charge = new Map(f.ok ? f.findings.periods.map((p) => [p.id, p.pfCharge ?? 0]) : []);
    const charges = (b: DemoBill) => {
      const c = charge.get(`${b.periodStart}..${b.periodEnd}`) ?? 0;
      return { pfCharge: Math.round(c * (b.misbilledPfCharge ? DEMO_MISBILLED_FACTOR : 1) * 100) / 100, total: null };
    };
    const parsed = await parseBillCsv([demoBillCsv(key, charges)], demoBillMapping(key));
    if (!parsed.ok) throw new Error(`demo bills of ${spec.siteName} do not parse: ${parsed.problems[0]?.message}`);
    await db.insert(bill).values(parsed.bills.map(({ row: _r, ...b }) => billValues(org.id, site.id, b, 'csv', site.currency, energy.id)));
    await recordEvent(db, org.id, energy.id, { action: 'bill.imported', subjectType: 'site', subjectId: site.id, detail: { bills: parsed.bills.length } });
    counts.bills += parsed.bills.length;
  }
  return counts;
}
