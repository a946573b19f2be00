/** Our own wording for every product e-mail, as plain text and HTML parts. */
export type MailMessage = { subject: string; text: string; html: string };

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function layout(title: string, paragraphs: string[], action: { label: string; url: string }, footer: string): MailMessage {
  const text = [...paragraphs, '', `${action.label}: ${action.url}`, '', footer, '', '-- Varledger'].join('\n');
  const html = `<!doctype html><html><body style="font-family:'IBM Plex Sans',Arial,sans-serif;color:#1d2430;background:#f7f5f0;padding:24px">
<div style="max-width:560px;margin:auto;background:#fff;border:1px solid #d9d4c7;border-radius:4px;padding:24px">
<p style="font-weight:600;letter-spacing:.02em;margin:0 0 16px">Varledger</p>
<h1 style="font-size:18px;margin:0 0 12px">${esc(title)}</h1>
${paragraphs.map((p) => `<p>${esc(p)}</p>`).join('\n')}
<p><a href="${esc(action.url)}" style="display:inline-block;background:#1d2430;color:#f7f5f0;padding:8px 14px;border-radius:4px;text-decoration:none">${esc(action.label)}</a></p>
<p style="font-size:13px;color:#5b6270">If the button does not work, paste this address into your browser:<br>${esc(action.url)}</p>
<p style="font-size:13px;color:#5b6270">${esc(footer)}</p>
</div></body></html>`;
  return { subject: title, text, html };
}

export function verificationMail(name: string, url: string): MailMessage {
  return layout('Confirm your e-mail address for Varledger', [`Hello ${name},`, 'Confirm this address to finish setting up your Varledger account. The link works for one hour.'], { label: 'Confirm my address', url }, 'If you did not sign up, ignore this message: no account is activated without the link.');
}

export function passwordResetMail(name: string, url: string): MailMessage {
  return layout('Choose a new Varledger password', [`Hello ${name},`, 'Someone asked to reset the password of this account. Use the link within one hour to choose a new one.'], { label: 'Choose a new password', url }, 'If it was not you, ignore this message: your password stays as it is.');
}

export function invitationMail(inviter: string, workspace: string, roleLabel: string, url: string): MailMessage {
  return layout(`${inviter} invited you to ${workspace} on Varledger`, [`${inviter} asks you to join the workspace "${workspace}" as ${roleLabel}.`, 'Open the link, sign in or create an account with this e-mail address, and accept. The invitation lasts 7 days.'], { label: 'Review the invitation', url }, 'If you do not know this workspace, ignore this message.');
}

export type ReceiptMailInput = {
  receiptNumber: string;
  buyerName: string;
  workspaceName: string;
  sites: string[];
  /** Display strings, already formatted in the purchase currency. */
  unitPrice: string;
  total: string;
  paidOn: string;
  purchasesUrl: string;
};

export function receiptMail(r: ReceiptMailInput): MailMessage {
  const count = r.sites.length === 1 ? 'one Site audit' : `${r.sites.length} Site audits`;
  return layout(
    `Varledger receipt ${r.receiptNumber}: ${count} paid`,
    [
      `Hello ${r.buyerName || 'there'},`,
      `Thank you: your payment for ${count} in the workspace "${r.workspaceName}" has arrived. The findings of these sites are now final and they are marked Audited.`,
      `Receipt number: ${r.receiptNumber}`,
      `Paid on: ${r.paidOn}`,
      ...r.sites.map((s) => `Site audit, ${s}: ${r.unitPrice}`),
      `Total paid: ${r.total}`,
    ],
    { label: 'See your purchases', url: r.purchasesUrl },
    'Keep this message for your records. The Purchases page of the workspace shows every receipt.',
  );
}

export function reportIssuedMail(r: { recipientName: string; siteName: string; workspaceName: string; issuedBy: string; reportUrl: string }): MailMessage {
  return layout(
    `Savings report issued for ${r.siteName}`,
    [`Hello ${r.recipientName || 'there'},`, `${r.issuedBy} issued the Savings report for ${r.siteName} in the workspace "${r.workspaceName}". Its figures are frozen as issued; the site is now marked Reported.`],
    { label: 'Open the Savings report', url: r.reportUrl },
    'The figures are estimates from interval averages. Capacitor banks must be designed and installed by qualified persons under local electrical codes and the utility’s rules.',
  );
}
