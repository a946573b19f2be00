/** Response schema of the findings endpoint, with field names and units, for the OpenAPI document. */
import { z } from 'zod';
import { isCalendarDate } from '../domain/tariff/tariff-schema';

const n = (d: string) => z.number().meta({ description: d });
const nn = (d: string) => z.number().nullable().meta({ description: d });
const sense = z.enum(['lag', 'lead', 'unity']).meta({ description: 'lag: reactive drawn (inductive); lead: reactive supplied (capacitive)' });

export const PeriodMetricsSchema = z
  .object({
    hours: n('Length of the period, hours (743 or 745 in a month with a clock change)'),
    expectedIntervals: n('Intervals the period should hold at the meter interval'),
    presentIntervals: n('Intervals present in the data'),
    completeness: n('present / expected, 0..1'),
    kwh: n('Active energy imported, kWh'),
    kvarhLag: n('Lagging reactive energy, kvarh'),
    kvarhLead: n('Leading reactive energy, kvarh'),
    kvarhNet: n('Lagging minus leading, kvarh (signed)'),
    pfAvgLagging: nn('Average PF, lagging kvarh only (kWh / sqrt(kWh² + kvarh²))'),
    pfAvgNet: nn('Average PF on net kvarh'),
    pfAvgNetSense: sense,
    pfAvgAbsolute: nn('Average PF on lagging + leading kvarh'),
    peakKw: n('Peak demand on the tariff demand window, kW'),
    peakAtMs: nn('Start of the peak demand window, UTC epoch ms'),
    peakKvar: n('kvar in the peak-kW demand window (coincident), signed'),
    peakPf: nn('PF at the kW peak'),
    peakPfSense: sense,
    peakKva: n('Peak apparent demand, kVA'),
    peakKvaAtMs: nn('Start of the peak kVA window, UTC epoch ms'),
    maxKvar: n('Highest kvar demand of the period, kvar'),
    maxKvarAtMs: nn('Start of the maximum kvar window, UTC epoch ms'),
    minIntervalPf: nn('Lowest PF of any importing interval'),
    minIntervalPfAtMs: nn('Start of that interval, UTC epoch ms'),
    minIntervalPfSense: sense,
    pfThreshold: n('Threshold used for hours below'),
    hoursBelowThreshold: n('Hours with interval PF below the threshold, h'),
    loadFactor: nn('kWh / (peak kW × hours), 0..1'),
    zeroKwIntervals: n('Intervals with zero kW (no PF), count'),
    exportIntervals: n('Intervals exporting active power (negative kW), count'),
    kwhExport: n('Active energy exported, kWh'),
    kvarhLagExport: n('Lagging kvarh while exporting, kvarh'),
    kvarhLeadExport: n('Leading kvarh while exporting, kvarh'),
    leadingIntervals: n('Importing intervals with leading PF, count'),
    leadingHours: n('Hours at leading PF, h'),
    worstLeadPf: nn('Lowest leading PF of any interval'),
    reactiveMissingIntervals: n('Intervals without a kvarh reading, count'),
  })
  .meta({ id: 'PeriodMetrics' });

export const RuleChargeSchema = z
  .object({
    ruleId: z.string(),
    ruleLabel: z.string(),
    type: z.string().meta({ description: 'Rule type' }),
    windowLabel: z.string().nullable().meta({ description: 'Time-of-use window, or null for all hours' }),
    amount: n('Charge in the tariff currency; negative is a credit'),
    status: z.string().meta({ description: 'charge, credit, none, not-applicable or needs-input' }),
    quantities: z.record(z.string(), z.number().nullable()).meta({ description: 'Quantities used, units in the keys (peakKw, billableKvar, ...)' }),
    explanation: z.string().meta({ description: 'The formula with the numbers filled in' }),
  })
  .meta({ id: 'RuleCharge' });

export const FindingsSchema = z
  .object({
    site: z.object({ id: z.string(), name: z.string(), auditState: z.string() }),
    status: z.enum(['draft', 'final']).meta({ description: 'draft until the Site audit is paid' }),
    meter: z.object({ id: z.string(), name: z.string() }).nullable(),
    basis: z.enum(['month', 'billing']),
    zone: z.string(),
    intervalMinutes: n('Meter interval, minutes'),
    currency: z.string().nullable(),
    periods: z.array(
      z.object({
        id: z.string().meta({ description: '2026-03 for a month; 2026-01-15..2026-02-13 for a billing period' }),
        label: z.string(),
        kind: z.enum(['month', 'billing']),
        start: z.string().meta({ description: 'Local start, ISO 8601 with offset' }),
        end: z.string().meta({ description: 'Local end (exclusive), ISO 8601 with offset' }),
        metrics: PeriodMetricsSchema,
        tariff: z.object({ id: z.string(), name: z.string(), effectiveFrom: z.string() }).nullable(),
        pfCharge: nn('PF-related charge of the period, tariff currency'),
        rules: z.array(RuleChargeSchema),
        warnings: z.array(z.string()),
      }),
    ),
    totals: z.object({ kwh: n('kWh'), kvarhLag: n('kvarh'), kvarhLead: n('kvarh'), pfCharge: n('tariff currency'), byRule: z.array(z.object({ ruleId: z.string(), ruleLabel: z.string(), total: z.number() })) }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'Findings' });

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-01-31.')
  .refine(isCalendarDate, 'This is not a real calendar date.');
export const FindingsQuerySchema = z.strictObject({
  from: isoDate.optional().meta({ description: 'First local date to include' }),
  to: isoDate.optional().meta({ description: 'Last local date to include' }),
  tariffId: z.string().max(64).optional().meta({ description: 'Evaluate with this tariff version for every period (default: the version in force in each period)' }),
  meterId: z.string().max(64).optional().meta({ description: 'Meter (default: the site’s first meter)' }),
  basis: z.enum(['month', 'billing']).default('month').meta({ description: 'Calendar months in the site zone, or the billing periods of the entered bills' }),
});
