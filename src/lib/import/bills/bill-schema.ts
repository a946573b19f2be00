/**
 * One bill's determinants as printed: the shape shared by the bill-history import and the
 * manual bill form. Dates are calendar dates (ISO 8601 YYYY-MM-DD); the period end is the
 * last day covered, inclusive, as bills print it.
 */
import { z } from 'zod';

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD.')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, 'This is not a real calendar date.');

/** Bounds far above any real bill, so that only a unit or typing slip is refused. */
const ENERGY_MAX = 1e10;
const DEMAND_MAX = 1e7;
const AMOUNT_MAX = 1e10;
const amount = (what: string) =>
  z
    .number()
    .finite()
    .min(-AMOUNT_MAX, `${what} below -${AMOUNT_MAX.toLocaleString('en-US')} is not plausible; check the unit.`)
    .max(AMOUNT_MAX, `${what} above ${AMOUNT_MAX.toLocaleString('en-US')} is not plausible; check the unit.`);

export const BillDeterminantsSchema = z
  .strictObject({
    periodStart: isoDate.describe('First day of the billing period (ISO 8601 date).'),
    periodEnd: isoDate.describe('Last day of the billing period, inclusive (ISO 8601 date); after the start.'),
    kwh: z.number().finite().nonnegative('kWh cannot be negative.').max(ENERGY_MAX, `Above ${ENERGY_MAX.toLocaleString('en-US')} kWh in one bill is not plausible; check the unit.`).describe('Billed active energy for the period, kWh.'),
    billedDemand: z.number().finite().nonnegative('Billed demand cannot be negative.').max(DEMAND_MAX, `Above ${DEMAND_MAX.toLocaleString('en-US')} of billed demand is not plausible; check the unit.`).optional().describe('Billed (billing) demand as printed, in `billedDemandUnit`.'),
    billedDemandUnit: z.enum(['kW', 'kVA']).optional().describe('Whether the billed demand is kW or kVA; required with `billedDemand`.'),
    kvarh: z.number().finite().nonnegative('kvarh cannot be negative.').max(ENERGY_MAX, `Above ${ENERGY_MAX.toLocaleString('en-US')} kvarh in one bill is not plausible; check the unit.`).optional().describe('Billed reactive energy for the period, kvarh, when printed.'),
    powerFactor: z.number().finite().gt(0, 'PF must be above 0.').max(1, 'PF must be at most 1 (a fraction such as 0.87).').optional().describe('Power factor as printed, as a fraction between 0 and 1.'),
    pfCharge: amount('PF charge').optional().describe('Charge (positive) or credit (negative) the bill attributes to power factor, in `currency`.'),
    total: amount('Bill total').optional().describe('Bill total, in `currency`.'),
    currency: z
      .string()
      .regex(/^[A-Z]{3}$/, 'Use a three-letter ISO 4217 code such as USD.')
      .optional()
      .describe('ISO 4217 currency code of the amounts.'),
  })
  .superRefine((b, ctx) => {
    if (b.periodEnd <= b.periodStart) ctx.addIssue({ code: 'custom', path: ['periodEnd'], message: 'The period must end after it starts.' });
    if (b.billedDemand !== undefined && b.billedDemandUnit === undefined) ctx.addIssue({ code: 'custom', path: ['billedDemandUnit'], message: 'Say whether the billed demand is in kW or kVA.' });
  })
  .describe("One bill's determinants as printed.");

export type BillDeterminants = z.infer<typeof BillDeterminantsSchema>;

const ColumnRef = z.union([z.string().trim().min(1), z.number().int().min(1)]).describe('Header text (trimmed, case-insensitive) or 1-based position.');

export const BillMappingSchema = z
  .strictObject({
    version: z.literal(1).describe('Mapping format version.'),
    delimiter: z.enum([',', ';', '\t', '|']).describe('Field delimiter.'),
    decimalSeparator: z.enum(['.', ',']).describe('Decimal separator of the numbers.'),
    thousandsSeparator: z.enum(['none', ',', '.', ' ', "'"]).default('none').describe('Thousands separator printed in amounts and energies, removed before reading.'),
    skipRows: z.number().int().min(0).max(1000).default(0).describe('Lines above the header row to skip.'),
    dateFormat: z.enum(['iso', 'dmy', 'mdy']).describe('iso: YYYY-MM-DD; dmy: 31/01/2025; mdy: 01/31/2025 (separators / - or .). Stated, never guessed.'),
    columns: z
      .strictObject({
        periodStart: ColumnRef,
        periodEnd: ColumnRef,
        kwh: ColumnRef,
        billedDemand: ColumnRef.optional(),
        kvarh: ColumnRef.optional(),
        powerFactor: ColumnRef.optional(),
        pfCharge: ColumnRef.optional(),
        total: ColumnRef.optional(),
        currency: ColumnRef.optional(),
      })
      .describe('Which column holds each determinant.'),
    billedDemandUnit: z.enum(['kW', 'kVA']).optional().describe('Unit of the billed-demand column; required when it is mapped.'),
    powerFactorScale: z.enum(['fraction', 'percent']).default('fraction').describe('Whether PF is printed as 0.87 or as 87 (%).'),
    currency: z.string().regex(/^[A-Z]{3}$/).optional().describe('Currency of every row when the file has no currency column (ISO 4217).'),
  })
  .superRefine((m, ctx) => {
    if (m.columns.billedDemand !== undefined && !m.billedDemandUnit) ctx.addIssue({ code: 'custom', path: ['billedDemandUnit'], message: 'Say whether the billed demand is in kW or kVA.' });
    if (m.delimiter === m.decimalSeparator) ctx.addIssue({ code: 'custom', path: ['decimalSeparator'], message: 'The decimal separator cannot be the delimiter.' });
    if (m.thousandsSeparator === m.decimalSeparator) ctx.addIssue({ code: 'custom', path: ['thousandsSeparator'], message: 'The thousands separator cannot be the decimal separator.' });
  })
  .describe('Confirmed mapping of a bill-history CSV file.');

export type BillMapping = z.output<typeof BillMappingSchema>;
export type BillMappingInput = z.input<typeof BillMappingSchema>;
