/** The site form and its endpoints share these schemas (browser and server). */
import { z } from 'zod';

/** True for an IANA time-zone name the runtime knows (e.g. "America/Chicago"). */
export function isTimeZone(name: string): boolean {
  if (!/^[A-Za-z_]+(\/[A-Za-z0-9_+\-]+)*$/.test(name)) return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

const knownCurrencies = new Set(Intl.supportedValuesOf('currency'));

const optionalPositive = (label: string, max: number, unit: string, min = 0) =>
  z
    .number({ error: `${label} must be a number.` })
    .positive(`${label} must be greater than 0.`)
    .min(min, `${label} below ${min} ${unit} is not plausible; check the unit.`)
    .max(max, `${label} above ${max} ${unit} is not plausible; check the unit.`)
    .nullable()
    .optional();

export const SiteFields = {
  name: z.string().trim().min(1, 'Give the site a name.').max(120, 'Keep the name under 120 characters.').meta({ description: 'Display name, unique in the workspace', example: 'Brackwater Kiln Works' }),
  address: z.string().trim().max(300, 'Keep the address under 300 characters.').default('').meta({ description: 'Postal address (free text)' }),
  timeZone: z
    .string()
    .trim()
    .refine(isTimeZone, 'Use an IANA time-zone name such as America/Chicago or Europe/London.')
    .meta({ description: 'IANA time zone of the meter, used for calendar months and time-of-use windows', example: 'America/Chicago' }),
  utility: z.string().trim().max(120, 'Keep the utility name under 120 characters.').default('').meta({ description: 'Utility or retailer (free text)' }),
  accountNumber: z.string().trim().max(60, 'Keep the account number under 60 characters.').default('').meta({ description: 'Utility account number (free text)' }),
  serviceVoltageV: optionalPositive('Service voltage', 800_000, 'V', 100).meta({ description: 'Nominal service voltage, volts (line to line)', example: 480 }),
  transformerKva: optionalPositive('Transformer rating', 100_000, 'kVA').meta({ description: 'Supply transformer rating, kVA', example: 1500 }),
  transformerImpedancePct: z
    .number({ error: 'Transformer impedance must be a number.' })
    .min(0.5, 'Transformer impedance is a percentage: typical values are 4 to 8 %.')
    .max(25, 'Transformer impedance is a percentage: typical values are 4 to 8 %.')
    .nullable()
    .optional()
    .meta({ description: 'Transformer impedance, percent', example: 5.75 }),
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .refine((c) => /^[A-Z]{3}$/.test(c) && knownCurrencies.has(c), 'Use a three-letter ISO 4217 currency code such as USD, GBP or AUD.')
    .default('USD')
    .meta({ description: 'ISO 4217 currency of the bills', example: 'USD' }),
};

export const SiteCreateSchema = z.strictObject(SiteFields).meta({ id: 'SiteCreate' });
export type SiteCreate = z.infer<typeof SiteCreateSchema>;
export type SiteCreateInput = z.input<typeof SiteCreateSchema>;

export const SiteUpdateSchema = z
  .strictObject({
    name: SiteFields.name.optional(),
    address: z.string().trim().max(300, 'Keep the address under 300 characters.').optional(),
    timeZone: SiteFields.timeZone.optional(),
    utility: z.string().trim().max(120).optional(),
    accountNumber: z.string().trim().max(60).optional(),
    serviceVoltageV: SiteFields.serviceVoltageV,
    transformerKva: SiteFields.transformerKva,
    transformerImpedancePct: SiteFields.transformerImpedancePct,
    currency: z.string().trim().toUpperCase().refine((c) => knownCurrencies.has(c), 'Use a three-letter ISO 4217 currency code.').optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change.')
  .meta({ id: 'SiteUpdate' });
export type SiteUpdate = z.infer<typeof SiteUpdateSchema>;

export const AuditStateSchema = z.enum(['draft', 'audited', 'reported']).meta({ description: 'Draft: data loading; Audited: Site audit paid, findings final; Reported: a Savings report issued' });
export const AUDIT_STATE_LABELS = { draft: 'Draft', audited: 'Audited', reported: 'Reported' } as const;

export const SiteSchema = z
  .object({
    id: z.string(),
    name: z.string(),
    address: z.string(),
    timeZone: z.string(),
    utility: z.string(),
    accountNumber: z.string(),
    serviceVoltageV: z.number().nullable(),
    transformerKva: z.number().nullable(),
    transformerImpedancePct: z.number().nullable(),
    currency: z.string(),
    auditState: AuditStateSchema,
    createdAt: z.string().meta({ description: 'ISO 8601 instant' }),
    updatedAt: z.string().meta({ description: 'ISO 8601 instant' }),
  })
  .meta({ id: 'Site' });
export type SiteDto = z.infer<typeof SiteSchema>;

export const SiteIdParams = z.object({ siteId: z.string().min(1).max(64) });
