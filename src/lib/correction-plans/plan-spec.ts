/**
 * A correction plan as entered: the bank, its costs, the finance terms and the optional
 * benefit lines. Shared by the plan builder form and the plan endpoints (browser-safe).
 */
import { z } from 'zod';

const kvar = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .positive(`${what} must be greater than 0 kvar.`)
    // Smaller than any capacitor made; a vanishing step made the switched-bank simulation divide to NaN.
    .min(0.1, `${what} below 0.1 kvar is not a capacitor size; check the unit.`)
    .max(100_000, `${what} above 100,000 kvar is not plausible; check the unit.`);

const volts = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .positive(`${what} must be greater than 0 V.`)
    // Output scales by (V / Vrated)²: a rating of a few volts would make any bank infinite.
    .min(100, `${what} below 100 V is not a capacitor or supply voltage; check the unit.`)
    .max(100_000, `${what} above 100,000 V is not plausible; check the unit.`)
    .optional();

const pfValue = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .min(0.5, `${what} below 0.50 is not a sensible setting.`)
    .max(1, `${what} is a power factor: at most 1.`);

const money = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .min(0, `${what} cannot be negative.`)
    .max(1e9, `${what} is too large; check the unit.`);

export const FixedBankSpecSchema = z
  .strictObject({
    kind: z.literal('fixed').describe('Fixed bank: always connected.'),
    kvar: kvar('Bank size').describe('Rated output, kvar at the rated voltage.'),
    ratedVoltageV: volts('Rated voltage').describe('Capacitor rated voltage, V line to line (optional).'),
    serviceVoltageV: volts('Service voltage').describe('Voltage the bank runs at, V; output scales by (V/Vrated)². Defaults to the site’s service voltage when a rated voltage is given.'),
  })
  .describe('Fixed bank');

export const SwitchedBankSpecSchema = z
  .strictObject({
    kind: z.literal('switched').describe('Switched bank: n steps switched in by a PF controller.'),
    totalKvar: kvar('Total size').optional().describe('Total rated kvar, split into `steps` equal steps (ignored when `stepsKvar` is given).'),
    steps: z.number({ error: 'Steps must be a number.' }).int('Steps must be a whole number.').min(1, 'A switched bank needs at least 1 step.').max(32, 'At most 32 steps.').optional().describe('Number of equal steps.'),
    stepsKvar: z.array(kvar('Each step')).min(1, 'List at least one step.').max(32, 'At most 32 steps.').optional().describe('Listed step sizes in switching order, kvar (instead of total and steps).'),
    targetPf: pfValue('Controller target PF').describe('Controller target: steps go in while PF is below it.'),
    leadingLimitPf: pfValue('Leading limit').default(1).describe('Steps never push the site past this leading PF; 1 means never past unity.'),
    ratedVoltageV: volts('Rated voltage').describe('Capacitor rated voltage, V line to line (optional).'),
    serviceVoltageV: volts('Service voltage').describe('Voltage the bank runs at, V (optional).'),
  })
  .superRefine((b, ctx) => {
    if (b.stepsKvar) return;
    if (b.totalKvar === undefined) ctx.addIssue({ code: 'custom', path: ['totalKvar'], message: 'Give the total kvar and the number of steps, or list the step sizes.' });
    if (b.steps === undefined) ctx.addIssue({ code: 'custom', path: ['steps'], message: 'Give the number of equal steps, or list the step sizes.' });
  })
  .describe('Switched bank');

export const BankSpecSchema = z.discriminatedUnion('kind', [FixedBankSpecSchema, SwitchedBankSpecSchema]).describe('The capacitor bank: Fixed bank or Switched bank.');

export const PlanCostsSchema = z
  .strictObject({
    perKvar: money('Cost per kvar').describe('Installed cost per kvar of capacitors, in the tariff currency.'),
    fixedInstallation: money('Fixed installation').describe('Fixed installation cost per bank (switchboard work, protection, commissioning).'),
    detuned: z
      .strictObject({
        premiumPerKvar: money('Reactor premium').describe('Extra cost per kvar of a detuned bank (reactors).'),
        reactorPct: z.number({ error: 'Reactor % must be a number.' }).min(1, 'Reactor % is usually 5.67, 7 or 14.').max(20, 'Reactor % is usually 5.67, 7 or 14.').describe('Detuning reactor, percent of capacitor reactance (tuning order 1/√p).'),
      })
      .optional()
      .describe('Detuned bank with series reactors (optional).'),
    omPctOfCapex: z.number({ error: 'O&M must be a number.' }).min(0, 'O&M cannot be negative.').max(50, 'O&M above 50 % of capex a year is not plausible.').default(1).describe('Operation and maintenance per year, percent of capex.'),
  })
  .describe('Costs');

export const PlanFinanceSchema = z
  .strictObject({
    discountRate: z.number({ error: 'Discount rate must be a number.' }).min(0, 'Discount rate cannot be negative.').max(1, 'Discount rate is a fraction: 0.08 means 8 %; at most 1 (100 %).').describe('Discount rate per year as a fraction, e.g. 0.08 for 8 %.'),
    lifeYears: z.number({ error: 'Life must be a number.' }).int('Life is a whole number of years.').min(1, 'Life must be at least 1 year.').max(50, 'Life above 50 years is not plausible for a capacitor bank.').describe('Economic life, years.'),
  })
  .describe('Finance');

export const PlanBenefitsSchema = z
  .strictObject({
    lineLossCostPerYear: money('Yearly cost of losses').optional().describe('Optional: yearly cost of the I²R losses the correction affects; the saving is that times 1 − (PF1/PF2)².'),
    releasedCapacityValuePerKvaYear: money('Value per kVA-year').optional().describe('Optional: value of released capacity per kVA per year (kW/PF1 − kW/PF2 at the peak).'),
    countInFigures: z.boolean().default(false).describe('Count the optional lines in payback, NPV and IRR (default: shown apart, not counted).'),
  })
  .describe('Optional benefits');

export const PlanSpecSchema = z
  .strictObject({
    name: z.string({ error: 'Give the plan a name.' }).trim().min(1, 'Give the plan a name.').max(120, 'Keep the name under 120 characters.').describe('Plan name, unique on the site.'),
    bank: BankSpecSchema,
    costs: PlanCostsSchema,
    finance: PlanFinanceSchema,
    benefits: PlanBenefitsSchema.optional(),
  })
  .describe('Correction plan')
  .meta({ id: 'PlanSpec' });

export type PlanSpec = z.infer<typeof PlanSpecSchema>;
export type PlanSpecInput = z.input<typeof PlanSpecSchema>;
export type BankSpec = z.infer<typeof BankSpecSchema>;

/** Step sizes of a switched bank spec. */
export function stepsOf(bank: Extract<BankSpec, { kind: 'switched' }>): number[] {
  if (bank.stepsKvar) return bank.stepsKvar;
  const n = bank.steps ?? 1;
  return Array.from({ length: n }, () => (bank.totalKvar ?? 0) / n);
}

/** Total rated kvar of a bank spec. */
export function specKvar(bank: BankSpec): number {
  return bank.kind === 'fixed' ? bank.kvar : stepsOf(bank).reduce((s, k) => s + k, 0);
}

const qNum = (what: string) => z.coerce.number({ error: `${what} must be a number.` });

/** Query of the sizing search; every cost and finance term has a default. */
export const SizingQuerySchema = z
  .strictObject({
    targetPf: qNum('Target PF').min(0.5, 'Target PF below 0.50 is not sensible.').max(1, 'Target PF is at most 1.').default(0.95).describe('Controller target and the textbook estimate’s target PF.'),
    fixedPerKvar: qNum('Fixed bank cost per kvar').min(0).max(1e6).default(35).describe('Installed cost per kvar of a Fixed bank.'),
    switchedPerKvar: qNum('Switched bank cost per kvar').min(0).max(1e6).default(70).describe('Installed cost per kvar of a Switched bank.'),
    fixedInstallation: qNum('Fixed installation').min(0).max(1e9).default(4000).describe('Fixed installation cost per bank.'),
    detunedPremiumPerKvar: qNum('Reactor premium').min(0).max(1e6).optional().describe('Extra cost per kvar for a detuned bank (optional).'),
    omPctOfCapex: qNum('O&M').min(0).max(50).default(1).describe('O&M per year, percent of capex.'),
    discountRate: qNum('Discount rate').min(0, 'Discount rate cannot be negative.').max(1, 'Discount rate is a fraction: 0.08 means 8 %; at most 1.').default(0.08).describe('Discount rate as a fraction.'),
    lifeYears: qNum('Life').int('Life is a whole number of years.').min(1).max(50).default(15).describe('Economic life, years.'),
    maxKvar: qNum('Largest size').positive('Largest size must be greater than 0 kvar.').max(100_000).optional().describe('Largest bank tried, kvar (default: from the site’s highest lagging kvar).'),
  })
  .describe('Sizing search');

export type SizingQuery = z.infer<typeof SizingQuerySchema>;
