/**
 * Sends mail over real SMTP with nodemailer (the local sink by default), always through the
 * durable outbox (outbox.ts): `sendMail` writes the mail to the database, then tries it
 * once at once; a mail the SMTP server did not take is retried by the background worker
 * with back-off until it is delivered, across restarts. Callers get the delivery state.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { getConfig } from '../config';
import { getDb, type Db } from '../db/client';
import type { MailMessage } from './templates';
import { claimDue, describeDelivery, enqueueMail, nextDueAt, recordAttempt, type AttemptOutcome, type Delivery, type MailRef, type OutboxRow } from './outbox';

let transport: Transporter | undefined;

function getTransport(): Transporter {
  if (!transport) {
    const cfg = getConfig();
    transport = nodemailer.createTransport({
      host: cfg.SMTP_HOST,
      port: cfg.SMTP_PORT,
      secure: cfg.SMTP_SECURE === 'true',
      ignoreTLS: cfg.SMTP_SECURE !== 'true' && cfg.SMTP_HOST === '127.0.0.1',
      auth: cfg.SMTP_USER ? { user: cfg.SMTP_USER, pass: cfg.SMTP_PASSWORD ?? '' } : undefined,
      connectionTimeout: 5000,
      greetingTimeout: 5000,
    });
  }
  return transport;
}

/** SMTP answers that will not change on a retry (no such mailbox, address refused). */
const PERMANENT_SMTP_CODES = new Set([550, 551, 553, 554]);

/** One SMTP attempt for one outbox row. */
async function smtpSend(row: OutboxRow): Promise<AttemptOutcome> {
  try {
    const info = await getTransport().sendMail({ from: getConfig().MAIL_FROM, to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody });
    noteServer(true);
    return { ok: true, messageId: info.messageId };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    const code = (err as { responseCode?: number }).responseCode;
    if (code === undefined) noteServer(false);
    return { ok: false, error, permanent: code !== undefined && PERMANENT_SMTP_CODES.has(code) };
  }
}

async function attempt(db: Db, row: OutboxRow): Promise<OutboxRow> {
  const outcome = await smtpSend(row);
  const now = await recordAttempt(db, row, outcome);
  if (!outcome.ok) {
    const next = now.status === 'pending' ? `next try ${now.nextAttemptAt.toISOString()}` : 'given up';
    console.warn(`[mail] attempt ${row.attempts} to ${row.toAddress} ("${row.subject}") failed: ${outcome.error}; ${next}`);
  }
  return now;
}

export type SendResult = Delivery & { outboxId: string };

/**
 * Keeps a mail in the outbox and tries it once right away. Resolves with its delivery
 * state: `sent`, `delayed` (kept, retried in the background) or `sending` (another worker
 * has it). Rejects only if the mail could not even be stored.
 */
export async function sendMail(to: string, message: MailMessage, ref: MailRef = { kind: 'other' }): Promise<SendResult> {
  const db = getDb();
  startMailOutbox();
  const row = await enqueueMail(db, to, message, ref);
  const [claimed] = await claimDue(db, { id: row.id }).catch(() => []);
  if (!claimed) return { outboxId: row.id, ...describeDelivery(row) };
  const after = await attempt(db, claimed).catch((e) => {
    console.error(`[mail] could not record the attempt for ${row.id}`, e);
    return claimed;
  });
  if (after.status === 'pending') schedule(after.nextAttemptAt.getTime() - Date.now());
  return { outboxId: row.id, ...describeDelivery(after) };
}

// ---- the background worker: one per process, a single timer set to the next due mail ----

/** The worker looks for due mail at least this often (rows written by other instances). */
const IDLE_POLL_MS = 30_000;
let started = false;
let timer: NodeJS.Timeout | undefined;
let dueAt = Infinity;
let running = false;
let again = false;

function schedule(inMs: number) {
  const at = Date.now() + Math.max(0, Math.min(inMs, IDLE_POLL_MS));
  if (timer && at >= dueAt) return;
  if (timer) clearTimeout(timer);
  dueAt = at;
  timer = setTimeout(tick, at - Date.now());
  timer.unref();
}

async function tick() {
  timer = undefined;
  dueAt = Infinity;
  if (running) {
    again = true;
    return;
  }
  running = true;
  let wait = IDLE_POLL_MS;
  try {
    const db = getDb();
    for (;;) {
      const batch = await claimDue(db, { limit: 20 });
      for (const row of batch) await attempt(db, row);
      if (batch.length < 20) break;
    }
    const next = await nextDueAt(db);
    if (next !== null) wait = next - Date.now();
  } catch (e) {
    console.error('[mail] outbox worker failed; trying again in 5 s', e);
    wait = 5000;
  } finally {
    running = false;
  }
  schedule(again ? 0 : wait);
  again = false;
}

/** Starts the background worker once per process (pending mail from before a restart included). */
export function startMailOutbox(): void {
  if (started) return;
  started = true;
  schedule(0);
}

// ---- is the mail server taking mail? (for answers that say a mail will be late) ----

let server: { ok: boolean; at: number } | undefined;
function noteServer(ok: boolean) {
  server = { ok, at: Date.now() };
}

/**
 * Whether the SMTP server accepts connections, from the last attempt or a probe (EHLO),
 * remembered for 30 s when it answered and 5 s when it did not. The same for every caller,
 * so it reveals nothing about a particular address.
 */
export async function mailServerReachable(): Promise<boolean> {
  const now = Date.now();
  if (server && now - server.at < (server.ok ? 30_000 : 5_000)) return server.ok;
  const probe = getTransport()
    .verify()
    .then(() => true)
    .catch(() => false);
  const ok = await Promise.race([probe, new Promise<boolean>((r) => setTimeout(() => r(false), 3000).unref())]);
  noteServer(ok);
  return ok;
}
