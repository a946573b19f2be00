/** The tariff version a form or API client sends: the engine's tariff with a required start date. */
import { z } from 'zod';
import { isCalendarDate, tariffSchema } from '../domain/tariff/tariff-schema';

/**
 * One strict object, not an intersection: in an intersection zod refuses a key only when both
 * sides refuse it (so an open side lets unknown fields through), and two closed sides read as
 * an unsatisfiable `allOf` in the OpenAPI document.
 */
export const TariffVersionSchema = tariffSchema
  .safeExtend({
    effectiveFrom: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the first day this version applies, like 2026-01-01.')
      .refine(isCalendarDate, 'This is not a real calendar date.'),
  })
  .meta({ id: 'TariffVersion', description: 'A tariff version: the power-factor clauses in force from effectiveFrom (local date).' });

export type TariffVersion = z.infer<typeof TariffVersionSchema>;

export const TariffDtoSchema = z
  .object({ id: z.string(), siteId: z.string(), name: z.string(), effectiveFrom: z.string(), definition: tariffSchema, createdAt: z.string(), updatedAt: z.string() })
  .meta({ id: 'TariffRecord' });
