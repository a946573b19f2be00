/** Issuing a Savings report: paid Site audit required; snapshot stored; site Reported; Finance told. */
import { and, desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { savingsReport, site as siteTable } from '../db/schema';
import { newId } from '../db/ids';
import { listMembers } from '../db/workspaces';
import { atomically, recordEvent } from '../db/audit-log';
import { ApiError, notFound } from '../api/errors';
import { requireAuditPaid } from '../payments/entitlements';
import { getPlan } from '../correction-plans/plans-store';
import { sendMail } from '../mail/mailer';
import { reportIssuedMail } from '../mail/templates';
import { getConfig } from '../config';
import type { SiteDto } from '../schemas/site';
import { buildSnapshot, type ReportSnapshot } from './snapshot';

export const IssueReportSchema = z
  .strictObject({
    planId: z.string().min(1, 'Choose the saved plan the report recommends.').max(64),
    title: z.string().trim().min(3, 'Give the report a title of at least 3 characters.').max(160).optional(),
  })
  .meta({ id: 'IssueReport' });

export type ReportRow = typeof savingsReport.$inferSelect;

export function reportDto(r: ReportRow, withSnapshot = false) {
  const snap = r.snapshot as unknown as ReportSnapshot;
  return {
    id: r.id,
    siteId: r.siteId,
    planId: r.planId,
    title: r.title,
    issuedAt: r.issuedAt.toISOString(),
    issuedBy: snap.issuedBy?.name ?? null,
    planName: snap.plan?.name ?? null,
    annualSaving: snap.plan?.evaluation.economics.annualSaving ?? null,
    paybackYears: snap.plan?.evaluation.economics.paybackYears ?? null,
    currency: snap.currency,
    ...(withSnapshot ? { snapshot: snap } : {}),
  };
}

export async function listReports(db: Db, organizationId: string, siteId: string) {
  return db.select().from(savingsReport).where(and(eq(savingsReport.organizationId, organizationId), eq(savingsReport.siteId, siteId))).orderBy(desc(savingsReport.issuedAt));
}

export async function getReport(db: Db, organizationId: string, siteId: string, reportId: string) {
  return db.query.savingsReport.findFirst({ where: and(eq(savingsReport.organizationId, organizationId), eq(savingsReport.siteId, siteId), eq(savingsReport.id, reportId)) });
}

export async function issueReport(db: Db, ctx: { organizationId: string; workspaceName: string; user: { id: string; name: string; email: string }; site: SiteDto; notify?: boolean; now?: Date }, input: z.infer<typeof IssueReportSchema>) {
  const { organizationId, site, user } = ctx;
  requireAuditPaid(site);
  const plan = await getPlan(db, organizationId, site.id, input.planId);
  if (!plan) throw new ApiError(404, 'not_found', 'That plan was not found on this site. Save a plan on the Correction page first.', { planId: 'Not a saved plan of this site.' });
  const title = input.title ?? `Power-factor savings report: ${site.name}`;
  const snapshot = await buildSnapshot(db, organizationId, { site, plan, workspaceName: ctx.workspaceName, issuedBy: { name: user.name, email: user.email }, title, now: ctx.now });
  const id = newId('rpt');
  await atomically(db, async (tx) => {
    await tx.insert(savingsReport).values({ id, organizationId, siteId: site.id, planId: plan.id, title, snapshot: snapshot as unknown as Record<string, unknown>, issuedBy: user.id, ...(ctx.now ? { issuedAt: ctx.now } : {}) });
    await tx.update(siteTable).set({ auditState: 'reported', updatedAt: new Date() }).where(and(eq(siteTable.organizationId, organizationId), eq(siteTable.id, site.id)));
    await recordEvent(tx, organizationId, user.id, { action: 'report.issued', subjectType: 'savings_report', subjectId: id, detail: { siteId: site.id, planId: plan.id, title } });
  });
  // Finance members get a link; sending is retried and logged by the mailer.
  const base = getConfig().baseUrl;
  const finance = ctx.notify === false ? [] : (await listMembers(db, organizationId)).filter((m) => m.role === 'finance');
  const mails = finance.map((m) => sendMail(m.email, reportIssuedMail({ recipientName: m.name, siteName: site.name, workspaceName: ctx.workspaceName, issuedBy: user.name, reportUrl: `${base}/sites/${site.id}/reports/${id}` })));
  void Promise.allSettled(mails);
  const row = (await getReport(db, organizationId, site.id, id))!;
  return { report: row, notified: finance.map((m) => m.email) };
}

export function missingReport(): ApiError {
  return notFound('Savings report');
}
