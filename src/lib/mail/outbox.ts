/**
 * The durable mail outbox (table `mail_outbox`). A mail is written here before anything
 * is tried, then claimed for one delivery attempt at a time with a lease (so two workers
 * or two app instances never send the same row at once), and either marked sent (bodies
 * cleared) or given a next attempt with back-off: 1 s, 2 s, 4 s ... at most 5 minutes
 * apart, for 24 hours, after which it is marked failed. Delivery is at least once: a
 * process killed mid-send retries that mail after its lease runs out.
 */
import { and, asc, eq, inArray, lte, min, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { mailOutbox } from '../db/schema';
import type { MailMessage } from './templates';

export type OutboxRow = typeof mailOutbox.$inferSelect;
export type MailKind = OutboxRow['kind'];
export type MailRef = { kind: MailKind; organizationId?: string | null; refType?: string; refId?: string };

/** Delay before the next attempt after `attempts` failed ones. */
export function retryDelayMs(attempts: number): number {
  return Math.min(MAX_RETRY_DELAY_MS, 1000 * 2 ** Math.max(0, attempts - 1));
}
export const MAX_RETRY_DELAY_MS = 5 * 60_000;
export const GIVE_UP_AFTER_MS = 24 * 60 * 60_000;
/** How long a claimed row is left alone before another worker may retry it. */
export const LEASE_MS = 2 * 60_000;

export async function enqueueMail(db: Db, to: string, message: MailMessage, ref: MailRef, now = new Date()): Promise<OutboxRow> {
  const [row] = await db
    .insert(mailOutbox)
    .values({ id: newId('mail'), organizationId: ref.organizationId ?? null, kind: ref.kind, refType: ref.refType ?? null, refId: ref.refId ?? null, toAddress: to, subject: message.subject, textBody: message.text, htmlBody: message.html, nextAttemptAt: now })
    .returning();
  return row!;
}

/** Claims due rows (or one row by id) for an attempt: they are leased and their attempt counted. */
export async function claimDue(db: Db, opts: { id?: string; limit?: number; now?: Date } = {}): Promise<OutboxRow[]> {
  const now = opts.now ?? new Date();
  const due = and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, now));
  const ids = opts.id
    ? [opts.id]
    : (await db.select({ id: mailOutbox.id }).from(mailOutbox).where(due).orderBy(asc(mailOutbox.nextAttemptAt)).limit(opts.limit ?? 20)).map((r) => r.id);
  const claimed: OutboxRow[] = [];
  for (const id of ids) {
    // The condition is checked again in the UPDATE, so only one claimer wins a row.
    const [row] = await db
      .update(mailOutbox)
      .set({ nextAttemptAt: new Date(now.getTime() + LEASE_MS), attempts: sql`${mailOutbox.attempts} + 1` })
      .where(and(eq(mailOutbox.id, id), due))
      .returning();
    if (row) claimed.push(row);
  }
  return claimed;
}

export type AttemptOutcome = { ok: true; messageId: string } | { ok: false; error: string; permanent: boolean };

/** Records the outcome of one attempt on a claimed row and returns the row as it is now. */
export async function recordAttempt(db: Db, row: OutboxRow, outcome: AttemptOutcome, now = new Date()): Promise<OutboxRow> {
  const set: Partial<typeof mailOutbox.$inferInsert> = outcome.ok
    ? { status: 'sent', sentAt: now, messageId: outcome.messageId, lastError: null, textBody: '', htmlBody: '' }
    : outcome.permanent || now.getTime() - row.createdAt.getTime() > GIVE_UP_AFTER_MS
      ? { status: 'failed', lastError: outcome.error }
      : { nextAttemptAt: new Date(now.getTime() + retryDelayMs(row.attempts)), lastError: outcome.error };
  const [updated] = await db.update(mailOutbox).set(set).where(eq(mailOutbox.id, row.id)).returning();
  return updated ?? row;
}

/** When the next pending row is due (ms since epoch), or null with none pending. */
export async function nextDueAt(db: Db): Promise<number | null> {
  const [r] = await db.select({ at: min(mailOutbox.nextAttemptAt) }).from(mailOutbox).where(eq(mailOutbox.status, 'pending'));
  const at = r?.at as Date | number | null | undefined;
  return at == null ? null : at instanceof Date ? at.getTime() : Number(at);
}

export type Delivery = { status: 'sent' | 'sending' | 'delayed' | 'failed'; attempts: number; nextAttemptAt: string | null; message: string };

/** What a screen says about a mail's delivery. */
export function describeDelivery(row: Pick<OutboxRow, 'status' | 'attempts' | 'nextAttemptAt' | 'toAddress' | 'lastError'>): Delivery {
  const base = { attempts: row.attempts, nextAttemptAt: row.status === 'pending' ? row.nextAttemptAt.toISOString() : null };
  if (row.status === 'sent') return { ...base, status: 'sent', message: `The e-mail to ${row.toAddress} was handed to the mail server.` };
  if (row.status === 'failed') return { ...base, status: 'failed', message: `The e-mail to ${row.toAddress} could not be delivered and is no longer retried (${row.lastError ?? 'no reason given'}). Send it again.` };
  if (row.attempts === 0 || !row.lastError) return { ...base, status: 'sending', message: `The e-mail to ${row.toAddress} is being sent.` };
  return { ...base, status: 'delayed', message: `The e-mail to ${row.toAddress} is delayed: the mail server is not accepting mail right now. It is kept and retried automatically; nothing needs to be done.` };
}

/** The latest mail about each of `refIds` (of one type, within one workspace), by ref id. */
export async function deliveriesOf(db: Db, organizationId: string, refType: string, refIds: string[]): Promise<Map<string, Delivery>> {
  const out = new Map<string, Delivery>();
  if (!refIds.length) return out;
  const rows = await db
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.organizationId, organizationId), eq(mailOutbox.refType, refType), inArray(mailOutbox.refId, refIds)))
    .orderBy(asc(mailOutbox.createdAt));
  for (const r of rows) out.set(r.refId!, describeDelivery(r));
  return out;
}
