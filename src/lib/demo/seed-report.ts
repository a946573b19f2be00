/**
 * The demo's issued Savings report, in the consultant's second client workspace: Harrow Butter
 * Works gets a year of invented meter data (the kiln-works profile scaled to a smaller plant), a saved
 * Switched bank plan, a paid Site audit with its receipt, and the report (Reported). The main
 * demo company keeps one Audited site and the others Draft. Idempotent.
 */
import { recordEvent } from '../db/audit-log';
import { and, eq } from 'drizzle-orm';
import { Readable } from 'node:stream';
import type { Db } from '../db/client';
import { organization, purchase, site as siteTable, user } from '../db/schema';
import { findSiteByName, toSiteDto } from '../db/sites';
import { listMeters } from '../db/intervals';
import { addStoredFile, findStoredFile } from '../db/meter-imports';
import { commitToStore, receiveToTemp } from '../files/store';
import { runImport } from '../meter-data/import-file';
import { newImportId } from '../meter-data/receive';
import { MeterMappingSchema } from '../import/mapping-schema';
import { listPlans } from '../correction-plans/plans-store';
import { savePlan } from '../correction-plans/service';
import { PlanSpecSchema } from '../correction-plans/plan-spec';
import { issueReport, listReports } from '../reports/service';
import { demoMeterCsv, demoMeterMapping } from './meter-csv';
import { DEMO_WORKSPACES } from './scenario';

const WS = DEMO_WORKSPACES[1]!;
const SITE = 'Harrow Butter Works';
const SCALE = 0.42;
export const DEMO_REPORT_RECEIPT = 'VLR-20251118-HRW7QC';

/** The kiln-works year scaled to a smaller plant, as our own invented export. */
function butterWorksCsv(): string {
  const lines = demoMeterCsv('brackwater').split('\n');
  return lines.map((l, i) => (i === 0 || !l ? l : l.split(',').map((c, k) => (k === 0 ? c : (Number(c) * SCALE).toFixed(2))).join(','))).join('\n');
}

export async function seedDemoReport(db: Db): Promise<{ created: number }> {
  const org = await db.query.organization.findFirst({ where: eq(organization.slug, WS.slug) });
  const consultant = await db.query.user.findFirst({ where: eq(user.email, 'consultant@fieldline.example') });
  const row = org ? await findSiteByName(db, org.id, SITE) : undefined;
  if (!org || !consultant || !row) return { created: 0 };
  let created = 0;
  let site = toSiteDto(row);
  if ((await listMeters(db, org.id, site.id)).length === 0) {
    const received = await receiveToTemp(Readable.from([Buffer.from(butterWorksCsv(), 'utf8')]), 200 * 1024 * 1024);
    await commitToStore(received);
    const file = (await findStoredFile(db, org.id, site.id, 'meter-data', received.sha256)) ?? (await addStoredFile(db, { organizationId: org.id, siteId: site.id, kind: 'meter-data', sha256: received.sha256, fileName: 'harrow-butter-works-2025.csv', contentType: 'text/csv', bytes: received.bytes, createdBy: consultant.id }));
    const mapping = MeterMappingSchema.parse(demoMeterMapping('brackwater'));
    mapping.meters[0]!.meterId = 'HBW-M1';
    await runImport(db, { importId: newImportId(), site, organizationId: org.id, userId: consultant.id, fileId: file.id, sha256: file.sha256, bytes: file.bytes, mapping, replace: false });
    created++;
  }
  let plan = (await listPlans(db, org.id, site.id))[0];
  if (!plan) {
    plan = await savePlan(db, org.id, consultant.id, site, PlanSpecSchema.parse({ name: 'Churn hall switched 150 kvar', bank: { kind: 'switched', totalKvar: 150, steps: 5, targetPf: 0.97 }, costs: { perKvar: 58, fixedInstallation: 4200, omPctOfCapex: 1 }, finance: { discountRate: 0.07, lifeYears: 15 } }));
    created++;
  }
  const paidAt = new Date('2025-11-18T10:05:00Z');
  if (!(await db.query.purchase.findFirst({ where: and(eq(purchase.organizationId, org.id), eq(purchase.receiptNumber, DEMO_REPORT_RECEIPT)) }))) {
    await db.insert(purchase).values({ id: 'pur_demoHarrow01', organizationId: org.id, checkoutSessionId: 'cs_demo_harrow_2025_11', status: 'paid', unitAmount: 29_000, amountTotal: 29_000, currency: 'USD', siteIds: [site.id], siteNames: [site.name], buyerUserId: consultant.id, buyerEmail: consultant.email, buyerName: consultant.name, receiptNumber: DEMO_REPORT_RECEIPT, paymentIntentId: 'pi_demo_harrow_2025_11', createdAt: new Date(paidAt.getTime() - 3 * 60_000), paidAt, closedAt: paidAt });
    await db.update(siteTable).set({ auditState: 'audited' }).where(and(eq(siteTable.id, site.id), eq(siteTable.auditState, 'draft')));
    await recordEvent(db, org.id, consultant.id, { action: 'purchase.paid', subjectType: 'purchase', subjectId: 'pur_demoHarrow01', detail: { receiptNumber: DEMO_REPORT_RECEIPT, amountTotal: 29_000, currency: 'USD', siteIds: [site.id], auditedSiteIds: [site.id], via: 'demo' }, at: paidAt });
    created++;
  }
  if ((await listReports(db, org.id, site.id)).length === 0) {
    site = toSiteDto((await findSiteByName(db, org.id, SITE))!);
    await issueReport(db, { organizationId: org.id, workspaceName: org.name, user: { id: consultant.id, name: consultant.name, email: consultant.email }, site, notify: false, now: new Date('2025-11-24T09:30:00Z') }, { planId: plan.id, title: `Power-factor savings report: ${SITE}` });
    created++;
  }
  return { created };
}
