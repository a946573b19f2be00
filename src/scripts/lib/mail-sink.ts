/**
 * The local SMTP sink (maildev): catches every mail the app sends. Its inbox is a web page
 * and a REST API (`GET /api/email`) on loopback, which the tests read.
 */
import { MailDev } from 'maildev';
import { mkdirSync } from 'node:fs';

export type MailSink = { smtpPort: number; webPort: number; url: string; stop: () => Promise<void> };

export async function startMailSink(opts: { smtpPort: number; webPort: number; mailDirectory: string }): Promise<MailSink> {
  mkdirSync(opts.mailDirectory, { recursive: true });
  const md = new MailDev({ smtp: opts.smtpPort, web: opts.webPort, ip: '127.0.0.1', webIp: '127.0.0.1', silent: true, mailDirectory: opts.mailDirectory } as ConstructorParameters<typeof MailDev>[0]);
  await md.start();
  return { smtpPort: opts.smtpPort, webPort: opts.webPort, url: `http://127.0.0.1:${opts.webPort}`, stop: () => md.stop() };
}
