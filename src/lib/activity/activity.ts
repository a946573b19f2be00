/**
 * The workspace's activity record: who changed tariffs, imported data, bought audits, issued
 * reports, managed members... read by Owners. Framework-free: the page and the endpoint call it.
 */
import { and, desc, eq, inArray, like, lt, or } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { auditEvent, site, user } from '../db/schema';

/** Families of actions, by the prefix recorded in `audit_event.action`. */
export const ACTIVITY_KINDS = {
  tariff: 'Tariffs',
  'meter-data': 'Meter data',
  bill: 'Bills',
  plan: 'Correction plans',
  purchase: 'Purchases',
  report: 'Reports',
  member: 'Members',
  site: 'Sites',
  workspace: 'Workspace',
} as const;
export type ActivityKind = keyof typeof ACTIVITY_KINDS;

export const ActivityQuerySchema = z.strictObject({
  kind: z.enum(Object.keys(ACTIVITY_KINDS) as [ActivityKind, ...ActivityKind[]]).optional().meta({ description: 'Only this family of actions' }),
  before: z.string().regex(/^\d+:[A-Za-z0-9_-]+$/, 'Use the `next` cursor of the previous page').optional().meta({ description: 'Cursor from the previous page (`next`)' }),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type ActivityQuery = z.infer<typeof ActivityQuerySchema>;

export const ActivityEntrySchema = z
  .object({
    id: z.string(),
    at: z.string().meta({ description: 'ISO 8601 instant, UTC' }),
    action: z.string().meta({ description: 'e.g. tariff.updated, meter-data.imported, purchase.paid, report.issued' }),
    kind: z.string(),
    summary: z.string().meta({ description: 'One sentence in words' }),
    actor: z.object({ id: z.string(), name: z.string(), email: z.string() }).nullable().meta({ description: 'null for the payment provider or a removed account' }),
    site: z.object({ id: z.string(), name: z.string().nullable() }).nullable(),
    subjectType: z.string(),
    subjectId: z.string().nullable(),
    detail: z.record(z.string(), z.unknown()).nullable(),
  })
  .meta({ id: 'ActivityEntry' });
export type ActivityEntry = z.infer<typeof ActivityEntrySchema>;

const str = (v: unknown) => (typeof v === 'string' ? v : v == null ? '' : String(v));

/** One sentence for an event; unknown actions fall back to their code. */
export function describe(action: string, detail: Record<string, unknown> | null, siteName: string | null): string {
  const d = detail ?? {};
  const at = siteName ? ` at ${siteName}` : '';
  switch (action) {
    case 'tariff.created':
      return `Added tariff "${str(d.name)}" in force from ${str(d.effectiveFrom)}${at} (${str(d.rules)} rule${d.rules === 1 ? '' : 's'}).`;
    case 'tariff.updated':
      return `Changed a tariff version${at}.`;
    case 'tariff.deleted':
      return `Deleted tariff "${str(d.name)}" (from ${str(d.effectiveFrom)})${at}.`;
    case 'meter-data.imported': {
      const n = typeof d.intervals === 'number' ? d.intervals.toLocaleString('en-GB') : str(d.intervals);
      return `Imported ${n} intervals${at}${d.replaced ? ', replacing data in the same range' : ''}.`;
    }
    case 'bill.added':
      return `Entered the bill for ${str(d.periodStart)} to ${str(d.periodEnd)}${at}.`;
    case 'bill.imported':
      return `Imported a bill history of ${str(d.bills)} bills${at}.`;
    case 'bill.deleted':
      return `Deleted the bill for ${str(d.periodStart)} to ${str(d.periodEnd)}${at}.`;
    case 'bill.document_attached':
      return `Attached the bill document ${str(d.fileName)}${at}.`;
    case 'plan.created':
      return `Saved correction plan "${str(d.name)}"${at}.`;
    case 'plan.updated':
      return `Changed a correction plan${at}.`;
    case 'plan.deleted':
      return `Deleted correction plan "${str(d.name)}"${at}.`;
    case 'purchase.started':
      return `Started a checkout for ${Array.isArray(d.siteIds) ? d.siteIds.length : '?'} Site audit(s).`;
    case 'purchase.cancelled':
      return 'Cancelled a checkout before paying.';
    case 'purchase.paid':
      return `Paid for Site audits${d.receiptNumber ? ` (receipt ${str(d.receiptNumber)})` : ''}.`;
    case 'report.issued':
      return `Issued the Savings report "${str(d.title)}"${at}.`;
    case 'member.invited':
      return `Invited ${str(d.email)} as ${str(d.role).replace('_', ' ')}.`;
    case 'member.invitation_cancelled':
      return 'Cancelled an invitation.';
    case 'member.joined':
      return `Joined the workspace as ${str(d.role).replace('_', ' ')}.`;
    case 'member.role_changed':
      return `Changed a member's role from ${str(d.from).replace('_', ' ')} to ${str(d.to).replace('_', ' ')}.`;
    case 'member.removed':
      return 'Removed a member.';
    case 'site.created':
      return `Added the site ${str(d.name)}.`;
    case 'site.updated':
      return `Changed ${Array.isArray(d.fields) ? d.fields.join(', ') : 'details'}${at}.`;
    case 'site.deleted':
      return `Deleted the site ${str(d.name)} and everything recorded for it.`;
    case 'workspace.created':
      return `Created the workspace ${str(d.name)}.`;
    default:
      return action;
  }
}

/** The newest events of one workspace (always scoped by organization), a page at a time. */
export async function listActivity(db: Db, organizationId: string, q: ActivityQuery): Promise<{ entries: ActivityEntry[]; next: string | null }> {
  const where = [eq(auditEvent.organizationId, organizationId)];
  if (q.kind) where.push(like(auditEvent.action, `${q.kind}.%`));
  if (q.before) {
    const [ms, id] = q.before.split(':') as [string, string];
    const t = new Date(Number(ms));
    where.push(or(lt(auditEvent.createdAt, t), and(eq(auditEvent.createdAt, t), lt(auditEvent.id, id)))!);
  }
  const rows = await db
    .select({ e: auditEvent, actorName: user.name, actorEmail: user.email })
    .from(auditEvent)
    .leftJoin(user, eq(user.id, auditEvent.actorUserId))
    .where(and(...where))
    .orderBy(desc(auditEvent.createdAt), desc(auditEvent.id))
    .limit(q.limit + 1);
  const page = rows.slice(0, q.limit);
  const siteIds = [...new Set(page.map((r) => siteIdOf(r.e)).filter((s): s is string => !!s))];
  const names = new Map<string, string>();
  if (siteIds.length) {
    // Site names come only from this workspace's sites; a deleted site keeps its id, no name.
    for (const s of await db.select({ id: site.id, name: site.name }).from(site).where(and(eq(site.organizationId, organizationId), inArray(site.id, siteIds)))) names.set(s.id, s.name);
  }
  const entries = page.map(({ e, actorName, actorEmail }) => {
    const sid = siteIdOf(e);
    const siteName = sid ? (names.get(sid) ?? null) : null;
    return {
      id: e.id,
      at: e.createdAt.toISOString(),
      action: e.action,
      kind: e.action.split('.')[0]!,
      summary: describe(e.action, e.detail ?? null, siteName),
      actor: e.actorUserId && actorEmail ? { id: e.actorUserId, name: actorName ?? '', email: actorEmail } : null,
      site: sid ? { id: sid, name: siteName } : null,
      subjectType: e.subjectType,
      subjectId: e.subjectId,
      detail: e.detail ?? null,
    };
  });
  const last = page.at(-1);
  return { entries, next: rows.length > q.limit && last ? `${last.e.createdAt.getTime()}:${last.e.id}` : null };
}

function siteIdOf(e: { subjectType: string; subjectId: string | null; detail: Record<string, unknown> | null }): string | null {
  if (e.subjectType === 'site') return e.subjectId;
  const s = e.detail?.siteId;
  if (typeof s === 'string') return s;
  // A purchase names its sites; one site is shown as the entry's site.
  const ids = e.detail?.siteIds;
  return Array.isArray(ids) && ids.length === 1 && typeof ids[0] === 'string' ? ids[0] : null;
}
