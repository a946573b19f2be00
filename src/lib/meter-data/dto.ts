/** What the API returns about imports and meters. */
import { z } from 'zod';
import type { ImportRow } from '../db/meter-imports';
import type { MeterRow } from '../db/intervals';

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

export function importDto(r: ImportRow, file?: { fileName: string; sha256: string }, detail = false) {
  return {
    id: r.id,
    status: r.status,
    fileName: file?.fileName ?? null,
    sha256: file?.sha256 ?? null,
    bytesTotal: r.bytesTotal,
    bytesProcessed: r.bytesProcessed,
    rowsProcessed: r.rowsProcessed,
    intervals: r.intervals,
    firstStart: iso(r.firstStartMs),
    lastStart: iso(r.lastStartMs),
    replaced: r.replaced,
    totalProblems: r.totalProblems,
    createdAt: r.createdAt.toISOString(),
    finishedAt: r.finishedAt?.toISOString() ?? null,
    ...(detail ? { mapping: r.mapping, quality: r.quality ?? null, problems: r.problems ?? [] } : {}),
  };
}

export function meterDto(m: MeterRow) {
  return { id: m.id, name: m.name, intervalMinutes: m.intervalMinutes, reactiveSource: m.reactiveSource, importProfile: m.importProfile ?? null };
}

export const ImportSchema = z
  .object({
    id: z.string(),
    status: z.enum(['processing', 'imported', 'rejected', 'interrupted']),
    fileName: z.string().nullable(),
    sha256: z.string().nullable().meta({ description: 'SHA-256 of the raw file (content address)' }),
    bytesTotal: z.number().meta({ description: 'bytes' }),
    bytesProcessed: z.number().meta({ description: 'bytes parsed so far' }),
    rowsProcessed: z.number().meta({ description: 'rows parsed so far' }),
    intervals: z.number().meta({ description: 'intervals stored' }),
    firstStart: z.string().nullable().meta({ description: 'first interval start, ISO 8601 UTC' }),
    lastStart: z.string().nullable().meta({ description: 'last interval start, ISO 8601 UTC' }),
    replaced: z.boolean().meta({ description: 'whether it replaced earlier data in its range' }),
    totalProblems: z.number(),
    createdAt: z.string(),
    finishedAt: z.string().nullable(),
    mapping: z.record(z.string(), z.unknown()).optional(),
    quality: z.record(z.string(), z.unknown()).nullable().optional().meta({ description: 'Data-quality report' }),
    problems: z.array(z.unknown()).optional(),
  })
  .meta({ id: 'MeterImport' });

export const MeterSchema = z
  .object({ id: z.string(), name: z.string(), intervalMinutes: z.number().nullable(), reactiveSource: z.string().nullable(), importProfile: z.record(z.string(), z.unknown()).nullable().meta({ description: 'Last confirmed mapping, offered for the next import' }) })
  .meta({ id: 'Meter' });
