/**
 * What a paid Site audit unlocks. A site's audit state says it: Draft until its Site audit is
 * paid, then Audited (findings final), then Reported (a Savings report issued).
 */
import { ApiError } from '../api/errors';

export type AuditStateHolder = { name: string; auditState: 'draft' | 'audited' | 'reported' | string };

/** True once the site's Site audit is paid (Audited or Reported). */
export function siteAuditPaid(site: Pick<AuditStateHolder, 'auditState'>): boolean {
  return site.auditState === 'audited' || site.auditState === 'reported';
}

/** The refusal for a Draft site: 402 `audit_required`, naming the site and what to do next. */
export function auditRequiredError(site: Pick<AuditStateHolder, 'name'>): ApiError {
  return new ApiError(402, 'audit_required', `${site.name} is still a Draft. Buy its Site audit on the Purchases page; once it is paid the findings become final and a Savings report can be issued.`, undefined, { purchaseUrl: '/purchases' });
}

/** Throws 402 unless the site's Site audit is paid. */
export function requireAuditPaid(site: AuditStateHolder): void {
  if (!siteAuditPaid(site)) throw auditRequiredError(site);
}
