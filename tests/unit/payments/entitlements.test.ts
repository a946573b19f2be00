import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../src/lib/api/errors';
import { requireAuditPaid, siteAuditPaid } from '../../../src/lib/payments/entitlements';

describe('Site audit entitlement', () => {
  it.each([
    ['draft', false],
    ['audited', true],
    ['reported', true],
  ])('a %s site: paid = %s', (auditState, paid) => {
    expect(siteAuditPaid({ auditState })).toBe(paid);
    if (paid) expect(() => requireAuditPaid({ name: 'Quarry Lane Mill', auditState })).not.toThrow();
  });

  it('refuses a Draft with 402 audit_required naming the site and the Purchases page', () => {
    let caught: unknown;
    try {
      requireAuditPaid({ name: 'Quarry Lane Mill', auditState: 'draft' });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ApiError);
    const e = caught as ApiError;
    expect([e.status, e.code]).toEqual([402, 'audit_required']);
    expect(e.message).toContain('Quarry Lane Mill is still a Draft');
    expect(e.extra).toEqual({ purchaseUrl: '/purchases' });
  });

  it('treats an unknown state as unpaid', () => {
    expect(siteAuditPaid({ auditState: 'archived' })).toBe(false);
  });
});
