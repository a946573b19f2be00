/** Sends the receipt of a paid purchase through the mail outbox (kept and retried until the SMTP server takes it). */
import { getConfig } from '../config';
import { sendMail } from '../mail/mailer';
import { receiptMail } from '../mail/templates';
import { formatMinor } from './money';
import type { PurchaseRow } from './purchases';

export function receiptMessage(p: PurchaseRow, workspaceName: string) {
  const paidOn = (p.paidAt ?? new Date()).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
  return receiptMail({
    receiptNumber: p.receiptNumber ?? '',
    buyerName: p.buyerName,
    workspaceName,
    sites: p.siteNames,
    unitPrice: formatMinor(p.unitAmount, p.currency),
    total: formatMinor(p.amountTotal, p.currency),
    paidOn,
    purchasesUrl: `${getConfig().baseUrl}/purchases?receipt=${encodeURIComponent(p.id)}`,
  });
}

export function sendReceipt(p: PurchaseRow, workspaceName: string): void {
  sendMail(p.buyerEmail, receiptMessage(p, workspaceName), { kind: 'receipt', organizationId: p.organizationId, refType: 'purchase', refId: p.id }).catch((e) => console.error(`[mail] could not keep the receipt of ${p.id}`, e));
}
