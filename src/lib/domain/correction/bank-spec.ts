import { z } from 'zod';

const voltage = z.number().positive().max(100_000);

/** A fixed capacitor bank: always connected. */
export const fixedBankSchema = z
  .object({
    kind: z.literal('fixed'),
    kvar: z.number().positive().max(100_000).describe('Rated bank output, kvar at rated voltage.'),
    ratedVoltageV: voltage.optional().describe('Capacitor rated voltage, V (line to line).'),
    serviceVoltageV: voltage.optional().describe('Service voltage it runs at, V; output scales by (V/Vrated)^2.'),
  })
  .describe('Fixed bank');

/** A switched (automatic) bank: steps switched in by a PF controller. */
export const switchedBankSchema = z
  .object({
    kind: z.literal('switched'),
    stepsKvar: z.array(z.number().positive().max(100_000)).min(1).max(32).describe('Step sizes in switching order, kvar at rated voltage.'),
    targetPf: z.number().gt(0).max(1).describe('Controller target: steps are added while PF is below it.'),
    leadingLimitPf: z.number().gt(0).max(1).default(1).describe('Steps are never added past this leading PF; 1 means never past unity.'),
    ratedVoltageV: voltage.optional(),
    serviceVoltageV: voltage.optional(),
  })
  .describe('Switched bank');

export const bankSchema = z.discriminatedUnion('kind', [fixedBankSchema, switchedBankSchema]).describe('Capacitor bank plan.');

export type FixedBank = z.infer<typeof fixedBankSchema>;
export type SwitchedBank = z.infer<typeof switchedBankSchema>;
export type SwitchedBankInput = z.input<typeof switchedBankSchema>;
export type Bank = z.infer<typeof bankSchema>;

/** `n` equal steps making up `totalKvar`. */
export function equalSteps(totalKvar: number, n: number): number[] {
  if (!(n >= 1 && Number.isInteger(n))) throw new RangeError('A switched bank needs a whole number of steps, at least 1.');
  return Array.from({ length: n }, () => totalKvar / n);
}

/** Total rated kvar of a bank. */
export function bankKvar(bank: Bank): number {
  return bank.kind === 'fixed' ? bank.kvar : bank.stepsKvar.reduce((s, k) => s + k, 0);
}
