/**
 * Sends mail over real SMTP with nodemailer (the local sink by default). A failed send is
 * retried with back-off and every failure is logged; callers get the final outcome.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { getConfig } from '../config';
import type { MailMessage } from './templates';

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

export type SendResult = { ok: true; messageId: string; attempts: number } | { ok: false; error: string; attempts: number };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Sends one message, trying up to `attempts` times (1 s, 2 s, 4 s apart). */
export async function sendMail(to: string, message: MailMessage, attempts = 4): Promise<SendResult> {
  const from = getConfig().MAIL_FROM;
  let lastError = '';
  for (let i = 1; i <= attempts; i++) {
    try {
      const info = await getTransport().sendMail({ from, to, subject: message.subject, text: message.text, html: message.html });
      return { ok: true, messageId: info.messageId, attempts: i };
    } catch (err) {
      lastError = err instanceof Error ? err.message : String(err);
      console.error(`[mail] attempt ${i}/${attempts} to ${to} ("${message.subject}") failed: ${lastError}`);
      if (i < attempts) await sleep(1000 * 2 ** (i - 1));
    }
  }
  console.error(`[mail] giving up on ${to} ("${message.subject}") after ${attempts} attempts: ${lastError}`);
  return { ok: false, error: lastError, attempts };
}
