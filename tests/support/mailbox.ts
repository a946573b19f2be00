/** Reads the maildev inbox over its REST API. */
import { inject } from 'vitest';

export type Mail = { id: string; subject: string; to: { address: string }[]; text: string; html: string; time: string };

export async function listMail(): Promise<Mail[]> {
  const res = await fetch(`${inject('mailboxUrl')}/api/email`);
  if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
  return (await res.json()) as Mail[];
}

/** Waits until a message to `address` whose subject matches arrives; returns the newest. */
export async function waitForMail(address: string, subject: RegExp, timeoutMs = 15_000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await listMail()).filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()) && subject.test(m.subject));
    if (found.length) return found.sort((a, b) => a.time.localeCompare(b.time)).at(-1)!;
    if (Date.now() > deadline) throw new Error(`no mail to ${address} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** The first link in the plain-text part that starts with `prefix`. */
export function linkIn(mail: Mail, prefix: string): string {
  const m = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`));
  if (!m) throw new Error(`no link starting ${prefix} in mail "${mail.subject}"`);
  return m[0];
}
