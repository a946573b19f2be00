/** Response schemas of the bill routes, for the OpenAPI document. */
import { z } from 'zod';

export const BillSchema = z
  .object({
    id: z.string(),
    periodStart: z.string().meta({ description: 'First day, YYYY-MM-DD' }),
    periodEnd: z.string().meta({ description: 'Last day, inclusive' }),
    kwh: z.number().meta({ description: 'Billed kWh' }),
    billedDemand: z.number().nullable().meta({ description: 'Billed demand in demandUnit' }),
    demandUnit: z.enum(['kW', 'kVA']),
    kvarh: z.number().nullable().meta({ description: 'Billed kvarh' }),
    pf: z.number().nullable().meta({ description: 'PF as printed' }),
    pfCharge: z.number().nullable().meta({ description: 'PF-related charge as billed, currency' }),
    total: z.number().nullable(),
    currency: z.string(),
    source: z.enum(['form', 'csv']),
    hasDocument: z.boolean(),
    createdAt: z.string(),
  })
  .meta({ id: 'Bill' });

const cmp = (unit: string) => z.object({ billed: z.number().nullable(), computed: z.number().nullable(), difference: z.number().nullable().meta({ description: `billed - computed, ${unit}` }), flagged: z.boolean() });

export const ReconciliationSchema = z
  .object({
    currency: z.string(),
    bills: z.array(
      z.object({
        billId: z.string(),
        periodId: z.string(),
        periodStart: z.string(),
        periodEnd: z.string(),
        completeness: z.number().meta({ description: 'Share of the period covered by interval data, 0..1' }),
        compared: z.boolean().meta({ description: 'false when interval data is missing: nothing is guessed' }),
        kwh: cmp('kWh').extend({ ratio: z.number().nullable().meta({ description: 'billed / computed kWh' }) }),
        demand: cmp('kW or kVA').extend({ unit: z.enum(['kW', 'kVA']) }),
        pf: cmp('PF (flagged over 0.005)'),
        pfCharge: cmp('currency (flagged over max(5, 2 %))'),
        disputable: z.number().meta({ description: 'Billed PF charge above the recomputed one, when flagged' }),
        notes: z.array(z.string()),
      }),
    ),
    disputable: z.number().meta({ description: 'Sum over bills, currency' }),
    multiplier: z.object({ suspected: z.boolean(), impliedMultiplier: z.number().nullable(), message: z.string().nullable() }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'Reconciliation' });
