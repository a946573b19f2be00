/** Schemas of Site audit purchases, shared by the endpoints, the island and the OpenAPI document. */
import { z } from 'zod';

export const PurchaseCreateSchema = z
  .strictObject({
    siteIds: z.array(z.string().min(1).max(64)).min(1, 'Choose at least one site.').max(20, 'Choose at most 20 sites at once.').refine((ids) => new Set(ids).size === ids.length, 'A site is listed twice.').meta({ description: 'Draft sites of the active workspace, one Site audit each' }),
  })
  .meta({ id: 'PurchaseCreate' });
export type PurchaseCreate = z.infer<typeof PurchaseCreateSchema>;

export const PurchaseStatusSchema = z.enum(['pending', 'paid', 'cancelled', 'expired']).meta({ description: 'pending until the payment is confirmed by the provider; cancelled when the buyer went back; expired when the checkout ran out of time' });
export const PURCHASE_STATUS_LABELS = { pending: 'Pending', paid: 'Paid', cancelled: 'Cancelled', expired: 'Expired' } as const;

export const PurchaseSchema = z
  .object({
    id: z.string(),
    status: PurchaseStatusSchema,
    unitAmount: z.number().int().meta({ description: 'Minor units per Site audit' }),
    amountTotal: z.number().int().meta({ description: 'Minor units in total' }),
    currency: z.string().meta({ description: 'ISO 4217, upper case' }),
    sites: z.array(z.object({ id: z.string(), name: z.string() })),
    buyerName: z.string(),
    buyerEmail: z.string(),
    receiptNumber: z.string().nullable(),
    checkoutUrl: z.string().nullable().meta({ description: 'Hosted payment page while pending' }),
    createdAt: z.string(),
    paidAt: z.string().nullable(),
    closedAt: z.string().nullable(),
  })
  .meta({ id: 'Purchase' });
export type PurchaseDto = z.infer<typeof PurchaseSchema>;

export const PriceSchema = z.object({ unitAmount: z.number().int(), currency: z.string() }).meta({ id: 'SiteAuditPrice' });
