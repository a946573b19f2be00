/**
 * The confirmed mapping of an interval-meter CSV: which columns hold what, in which
 * units and formats. JSON-storable; the web layer saves one per meter as an import
 * profile and passes it back to `parseMeterCsv`.
 */
import { z } from 'zod';

/** A column named by its header text (matched trimmed, case-insensitive) or by 1-based position. */
export const ColumnRefSchema = z
  .union([z.string().trim().min(1), z.number().int().min(1)])
  .describe('Header text of the column (trimmed, case-insensitive), or its 1-based position when the file has no header row.');
export type ColumnRef = z.infer<typeof ColumnRefSchema>;

export const ACTIVE_UNITS = ['W', 'kW', 'MW', 'Wh', 'kWh', 'MWh'] as const;
export const REACTIVE_UNITS = ['var', 'kvar', 'Mvar', 'varh', 'kvarh', 'Mvarh'] as const;
export const APPARENT_UNITS = ['VA', 'kVA', 'MVA', 'VAh', 'kVAh', 'MVAh'] as const;

export const ActiveUnitSchema = z
  .enum(ACTIVE_UNITS)
  .describe('Unit of the active column. W/kW/MW mean average demand over the interval; Wh/kWh/MWh mean energy per interval.');
export const ReactiveUnitSchema = z
  .enum(REACTIVE_UNITS)
  .describe('Unit of the reactive columns. var/kvar/Mvar mean average demand; varh/kvarh/Mvarh mean energy per interval.');
export const ApparentUnitSchema = z.enum(APPARENT_UNITS).describe('Unit of the apparent-power column (demand or energy per interval).');

const ActiveChannelSchema = z
  .strictObject({
    column: ColumnRefSchema,
    unit: ActiveUnitSchema,
  })
  .describe('The active power or energy channel. Negative values mean export (on-site generation).');

const ReactiveSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({ kind: z.literal('none') }).describe('The file has no reactive channel.'),
    z
      .strictObject({ kind: z.literal('net'), column: ColumnRefSchema, unit: ReactiveUnitSchema })
      .describe('One signed net channel: positive = lagging (inductive, drawn), negative = leading (capacitive, supplied).'),
    z
      .strictObject({ kind: z.literal('lagging-only'), lag: ColumnRefSchema, unit: ReactiveUnitSchema })
      .describe('Only a lagging register; leading is taken as zero. Negative values are an error.'),
    z
      .strictObject({ kind: z.literal('lag-lead'), lag: ColumnRefSchema, lead: ColumnRefSchema, unit: ReactiveUnitSchema })
      .describe('Separate non-negative lagging and leading registers.'),
    z
      .strictObject({
        kind: z.literal('quadrants'),
        q1: ColumnRefSchema,
        q2: ColumnRefSchema,
        q3: ColumnRefSchema,
        q4: ColumnRefSchema,
        unit: ReactiveUnitSchema,
      })
      .describe('Four quadrant registers (IEC sign convention): lagging = Q1 + Q2 (Q > 0), leading = Q3 + Q4 (Q < 0).'),
  ])
  .describe('How reactive energy is recorded.');
export type ReactiveMapping = z.infer<typeof ReactiveSchema>;

export const ChannelSetSchema = z
  .strictObject({
    meterId: z.string().trim().min(1).max(80).describe('Name under which this meter is reported and saved.'),
    active: ActiveChannelSchema,
    reactive: ReactiveSchema,
    apparent: z
      .strictObject({ column: ColumnRefSchema, unit: ApparentUnitSchema })
      .optional()
      .describe('Optional kVA column, used only to cross-check kW and kvar.'),
    powerFactor: z
      .strictObject({ column: ColumnRefSchema })
      .optional()
      .describe('Optional PF column as printed (0..1 or percent), used only as a cross-check.'),
    multiplier: z
      .number()
      .positive()
      .default(1)
      .describe('Meter multiplier applied to every channel, e.g. CT ratio x PT ratio (800:5 and 480:120 give 640). 1 when the file is already in primary units.'),
  })
  .describe('The columns of one meter.');
export type ChannelSet = z.infer<typeof ChannelSetSchema>;

export const TimestampSchema = z
  .strictObject({
    column: ColumnRefSchema.describe('Column with the date and time, or with the date only when `timeColumn` is set.'),
    timeColumn: ColumnRefSchema.optional().describe('Separate time-of-day column (HH:MM[:SS], 24:00 allowed).'),
    format: z
      .enum(['iso', 'date-time', 'excel-serial'])
      .describe('iso: ISO 8601 YYYY-MM-DD[T ]HH:MM[:SS][Z|+HH:MM]; date-time: a date in `dateOrder` with / - or . and a time (12-hour with AM/PM allowed); excel-serial: days since 1899-12-30 with the time as a fraction.'),
    dateOrder: z
      .enum(['ymd', 'dmy', 'mdy'])
      .optional()
      .describe('Order of day, month and year: dmy = day-first (31/01/2025), mdy = month-first (01/31/2025), ymd = year-first. Required for the date-time format and never guessed.'),
    zone: z
      .enum(['offset-in-stamp', 'utc', 'local', 'local-standard'])
      .describe('offset-in-stamp: each stamp carries Z or +HH:MM; utc: stamps are UTC; local: wall-clock time in `timeZone` (DST applied); local-standard: `timeZone` standard time all year.'),
    timeZone: z.string().min(1).optional().describe('IANA zone of the site, e.g. Europe/London; required for local and local-standard.'),
    stampAt: z.enum(['start', 'end']).describe('Whether a stamp marks the beginning or the end of its interval.'),
  })
  .describe('How to read the timestamp.');
export type TimestampMapping = z.infer<typeof TimestampSchema>;

export const MeterMappingSchema = z
  .strictObject({
    version: z.literal(1).describe('Mapping format version.'),
    delimiter: z.enum([',', ';', '\t', '|']).describe('Field delimiter.'),
    decimalSeparator: z.enum(['.', ',']).describe('Decimal separator of the numbers.'),
    skipRows: z.number().int().min(0).max(1000).default(0).describe('Lines above the header row (titles, meter details) to skip.'),
    hasHeader: z.boolean().default(true).describe('Whether the first line after the skipped ones is a header row.'),
    skipRowsAfterHeader: z.number().int().min(0).max(20).default(0).describe('Lines between the header and the data, e.g. a units row.'),
    timestamp: TimestampSchema,
    intervalMinutes: z
      .number()
      .int()
      .min(1)
      .max(1440)
      .optional()
      .describe('Interval length when stated; otherwise detected from the most common spacing of the stamps.'),
    meterIdColumn: ColumnRefSchema.optional().describe('Column naming the meter on each row (several meters stacked in one file). The single channel set applies to every meter.'),
    meters: z
      .array(ChannelSetSchema)
      .min(1)
      .max(50)
      .describe('One channel set per meter. Several sets side by side on the same rows when the file holds several meters as columns.'),
    missingValues: z
      .array(z.string())
      .default([''])
      .describe('Cell texts that mean "no reading" (kept as missing, never filled).'),
  })
  .superRefine((m, ctx) => {
    const t = m.timestamp;
    if (t.format === 'date-time' && !t.dateOrder) {
      ctx.addIssue({ code: 'custom', path: ['timestamp', 'dateOrder'], message: 'State whether dates are day-first, month-first or year-first.' });
    }
    if ((t.zone === 'local' || t.zone === 'local-standard') && !t.timeZone) {
      ctx.addIssue({ code: 'custom', path: ['timestamp', 'timeZone'], message: 'Local times need the site time zone (an IANA name such as Europe/London).' });
    }
    if (t.format === 'excel-serial' && t.zone === 'offset-in-stamp') {
      ctx.addIssue({ code: 'custom', path: ['timestamp', 'zone'], message: 'Excel serial dates carry no offset: choose utc, local or local-standard.' });
    }
    if (m.meterIdColumn !== undefined && m.meters.length !== 1) {
      ctx.addIssue({ code: 'custom', path: ['meters'], message: 'With a meter-id column give exactly one channel set; it applies to every meter.' });
    }
    const ids = new Set<string>();
    m.meters.forEach((s, i) => {
      if (ids.has(s.meterId)) ctx.addIssue({ code: 'custom', path: ['meters', i, 'meterId'], message: `Meter name "${s.meterId}" is used twice.` });
      ids.add(s.meterId);
    });
    if (m.delimiter === m.decimalSeparator) {
      ctx.addIssue({ code: 'custom', path: ['decimalSeparator'], message: 'The decimal separator cannot be the delimiter; comma decimals need a semicolon or tab delimiter.' });
    }
  })
  .describe('Confirmed mapping of an interval-meter CSV file.');

/** The mapping as stored (defaults filled). */
export type MeterMapping = z.output<typeof MeterMappingSchema>;
/** The mapping as written by a user or a profile (defaults optional). */
export type MeterMappingInput = z.input<typeof MeterMappingSchema>;
