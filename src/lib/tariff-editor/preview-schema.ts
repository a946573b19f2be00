/** Request query and response of the tariff preview, for the endpoint and the OpenAPI document. */
import { z } from 'zod';

export const PreviewQuerySchema = z
  .object({ compareTo: z.string().min(1).max(64).optional().meta({ description: 'A saved tariff version id to compare with; absent compares with the saved versions as in force' }) })
  .strict();

const n = (d: string) => z.number().meta({ description: d });

export const TariffPreviewSchema = z
  .object({
    preview: z.object({
      hasData: z.boolean().meta({ description: 'False when the site has no meter data yet' }),
      currency: z.string(),
      zone: z.string().meta({ description: 'Site time zone the months are cut in' }),
      meter: z.object({ id: z.string(), name: z.string() }).nullable(),
      months: z.array(
        z.object({
          id: z.string(),
          label: z.string(),
          start: z.string(),
          end: z.string(),
          completeness: n('Share of intervals present, 0..1'),
          pfCharge: n('PF charge under the posted tariff, tariff currency'),
          savedPfCharge: z.number().nullable().meta({ description: 'PF charge under the saved tariff; null when none applies' }),
          rules: z.array(z.object({ ruleId: z.string(), ruleLabel: z.string(), amount: z.number(), status: z.string() })),
        }),
      ),
      total: n('Sum of the months under the posted tariff'),
      byRule: z.array(z.object({ ruleId: z.string(), ruleLabel: z.string(), total: z.number() })),
      saved: z.object({ label: z.string(), currency: z.string().nullable(), total: z.number() }).nullable(),
      notes: z.array(z.string()),
    }),
  })
  .meta({ id: 'TariffPreview' });
