import type { PurchaseDto } from '@/lib/payments/schemas';

export type Purchase = PurchaseDto;
export type Price = { unitAmount: number; currency: string };
export type SiteLite = { id: string; name: string; auditState: 'draft' | 'audited' | 'reported' };
export type PurchasesAnswer = { purchases: Purchase[]; price: Price };

export const STATUS_LABEL: Record<Purchase['status'], string> = { pending: 'Pending', paid: 'Paid', cancelled: 'Cancelled', expired: 'Expired' };
export const STATUS_CLASS: Record<Purchase['status'], string> = { pending: 'text-leading', paid: 'text-saving', cancelled: 'text-muted', expired: 'text-muted' };

export const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false }) : '—');
