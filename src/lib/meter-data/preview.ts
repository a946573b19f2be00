/**
 * The mapping step: a proposal from the head of a file, and the first rows as the parser
 * reads them with a given mapping (the same parser the import uses, on the head only).
 */
import { z } from 'zod';
import { DateTime } from 'luxon';
import { proposeMapping } from '../import/propose/propose-mapping';
import { parseMeterCsv } from '../import/parse-meter-csv';
import { MeterMappingSchema } from '../import/mapping-schema';
import { buildSeries } from '../domain/series/build-series';
import { fromZod } from '../api/errors';

export const PREVIEW_HEAD_MAX = 256 * 1024;

export const PreviewRequestSchema = z
  .strictObject({
    head: z.string().min(1, 'Send the first part of the file as text.').max(PREVIEW_HEAD_MAX, `Send at most the first ${PREVIEW_HEAD_MAX / 1024} KB of the file.`),
    truncated: z.boolean().default(true).meta({ description: 'Whether head was cut from a longer file (its last line is then ignored)' }),
    mapping: z
      .record(z.string(), z.unknown(), { error: 'Send the mapping as a JSON object (a MeterMapping).' })
      .optional()
      .meta({ description: 'A mapping to read the rows with (checked against MeterMapping, its problems listed in parsed.problems); without it a mapping is proposed' }),
    dateOrder: z.enum(['ymd', 'dmy', 'mdy']).optional(),
  })
  .meta({ id: 'MeterPreviewRequest' });

export type PreviewRow = { row: number; meterId: string; start: string; kwh: number; kvarhLag: number; kvarhLead: number };

/** Drops a partial last line so the parser sees whole rows only. */
function wholeLines(head: string, truncated: boolean): string {
  if (!truncated) return head;
  const cut = head.lastIndexOf('\n');
  return cut >= 0 ? head.slice(0, cut + 1) : head;
}

export async function previewMeterFile(req: z.infer<typeof PreviewRequestSchema>, zone: string, rows = 12) {
  const proposal = proposeMapping(req.head, { timeZone: zone, dateOrder: req.dateOrder, truncated: req.truncated });
  const mappingInput = req.mapping ?? proposal.mapping;
  if (!mappingInput) return { proposal, parsed: null };
  const m = MeterMappingSchema.safeParse(mappingInput);
  if (!m.success) {
    // One problem per field path, unknown fields named by their own path (as in a 400's `fields`).
    const problems = Object.entries(fromZod(m.error, '').fields ?? {}).map(([column, message]) => ({ row: null, column, value: null, code: 'mapping-invalid', message }));
    return { proposal, parsed: { rows: [] as PreviewRow[], problems, totalProblems: problems.length } };
  }
  const parsed = await parseMeterCsv([wholeLines(req.head, req.truncated)], m.data, { siteTimeZone: zone });
  if (!parsed.ok) return { proposal, parsed: { rows: [] as PreviewRow[], problems: parsed.problems.slice(0, 20), totalProblems: parsed.totalProblems } };
  const out: PreviewRow[] = [];
  for (const pm of parsed.meters) {
    const s = buildSeries(pm.series);
    if (!s.ok) continue;
    for (let i = 0; i < Math.min(rows, s.value.length); i++)
      out.push({ row: pm.lines[i] ?? 0, meterId: pm.meterId, start: DateTime.fromMillis(s.value.startMs[i]!, { zone }).toISO({ suppressMilliseconds: true })!, kwh: s.value.kwh[i]!, kvarhLag: s.value.kvarhLag[i]!, kvarhLead: s.value.kvarhLead[i]! });
  }
  return { proposal, parsed: { rows: out, problems: [], totalProblems: 0, intervalMinutes: parsed.meters[0]?.series.intervalMinutes ?? null, meters: parsed.meters.map((x) => x.meterId) } };
}
