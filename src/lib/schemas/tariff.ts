/** The tariff version a form or API client sends: the engine's tariff with a required start date. */
import { z } from 'zod';
import { tariffSchema } from '../domain/tariff/tariff-schema';

export const TariffVersionSchema = tariffSchema
  .and(z.object({ effectiveFrom: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the first day this version applies, like 2026-01-01.') }))
  .meta({ id: 'TariffVersion', description: 'A tariff version: the power-factor clauses in force from effectiveFrom (local date).' });
export type TariffVersion = z.infer<typeof TariffVersionSchema>;

export const TariffDtoSchema = z
  .object({ id: z.string(), siteId: z.string(), name: z.string(), effectiveFrom: z.string(), definition: tariffSchema, createdAt: z.string(), updatedAt: z.string() })
  .meta({ id: 'TariffRecord' });
