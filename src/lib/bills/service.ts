/** Bills: entering one, importing a history, attaching a document, and reconciling them. */
import type { Db } from '../db/client';
import { bill } from '../db/schema';
import { billValues, listBills, overlappingBills, setBillDocument, type BillRow } from '../db/bills';
import { addStoredFile, findStoredFile } from '../db/meter-imports';
import { listMeters } from '../db/intervals';
import { atomically, recordEvent } from '../db/audit-log';
import { ApiError, fromZod } from '../api/errors';
import { readMultipart } from '../files/multipart';
import { commitToStore, discardTemp, openStored } from '../files/store';
import { documentType } from '../files/magic';
import { sanitizeFileName } from '../files/names';
import type { BillDeterminants } from '../import/bills/bill-schema';
import { BillMappingSchema } from '../import/bills/bill-schema';
import { parseBillCsv } from '../import/bills/parse-bill-csv';
import { siteFindings } from '../findings/load';
import { reconcile } from '../findings/reconcile';
import type { SiteDto } from '../schemas/site';

type Ctx = { db: Db; organizationId: string; site: SiteDto; userId: string };

function overlapError(b: { periodStart: string; periodEnd: string }, clash: BillRow, row?: number) {
  return new ApiError(409, 'bill_overlap', `${row ? `Row ${row.toLocaleString('en-US')}: ` : ''}the billing period ${b.periodStart} to ${b.periodEnd} overlaps the bill already entered for ${clash.periodStart} to ${clash.periodEnd}. Delete that bill first, or correct the dates.`, { periodStart: 'Overlaps another bill.' });
}

export async function addBill({ db, organizationId, site, userId }: Ctx, b: BillDeterminants) {
  const [clash] = await overlappingBills(db, organizationId, site.id, b.periodStart, b.periodEnd);
  if (clash) throw overlapError(b, clash);
  return atomically(db, async (tx) => {
    const [row] = await tx.insert(bill).values(billValues(organizationId, site.id, b, 'form', site.currency, userId)).returning();
    await recordEvent(tx, organizationId, userId, { action: 'bill.added', subjectType: 'bill', subjectId: row!.id, detail: { siteId: site.id, periodStart: b.periodStart, periodEnd: b.periodEnd } });
    return row!;
  });
}

/** Imports a bill-history CSV: every row valid and no overlap, or nothing is written. */
export async function importBillCsv(ctx: Ctx, request: Request, maxBytes: number) {
  const { db, organizationId, site, userId } = ctx;
  const upload = await readMultipart(request, { fileField: 'file', maxFileBytes: maxBytes, textFields: ['mapping'] });
  const file = upload.file;
  try {
    if (!file) throw new ApiError(400, 'invalid_input', 'Attach the bill history in the "file" field.', { file: 'Required.' });
    let mappingJson: unknown;
    try {
      mappingJson = JSON.parse(upload.fields.mapping ?? '');
    } catch {
      throw new ApiError(400, 'invalid_input', 'Send the column mapping as JSON in the "mapping" field.', { mapping: 'Missing or not JSON.' });
    }
    const mapping = BillMappingSchema.safeParse(mappingJson);
    if (!mapping.success) {
      const e = fromZod(mapping.error);
      throw new ApiError(400, 'invalid_input', `mapping.${e.message}`, Object.fromEntries(Object.entries(e.fields ?? {}).map(([k, v]) => [`mapping.${k}`, v])));
    }
    await commitToStore(file);
    const parsed = await parseBillCsv(openStored(file.sha256), mapping.data);
    if (!parsed.ok) throw new ApiError(422, 'invalid_file', `${parsed.totalProblems} problem(s) found; no bill was added. First: ${parsed.problems[0]?.message ?? ''}`, undefined, { problems: parsed.problems, totalProblems: parsed.totalProblems });
    // Bills in one file must not overlap each other either: billing periods tile the year.
    const sorted = [...parsed.bills].sort((a, b) => a.periodStart.localeCompare(b.periodStart));
    for (let i = 1; i < sorted.length; i++) {
      const prev = sorted[i - 1]!;
      const cur = sorted[i]!;
      if (cur.periodStart <= prev.periodEnd)
        throw new ApiError(409, 'bill_overlap', `Row ${cur.row.toLocaleString('en-US')}: the billing period ${cur.periodStart} to ${cur.periodEnd} overlaps row ${prev.row.toLocaleString('en-US')} (${prev.periodStart} to ${prev.periodEnd}). Billing periods must not share days: correct the dates so each bill starts the day after the previous one ends.`, { periodStart: 'Overlaps another bill in the file.' }, { row: cur.row });
    }
    const inserted = await db.transaction(async (tx) => {
      for (const b of parsed.bills) {
        const [clash] = await overlappingBills(tx, organizationId, site.id, b.periodStart, b.periodEnd);
        if (clash) throw overlapError(b, clash, b.row);
      }
      const rows = parsed.bills.map(({ row: _row, ...b }) => billValues(organizationId, site.id, b, 'csv', site.currency, userId));
      return rows.length ? tx.insert(bill).values(rows).returning() : [];
    });
    if (!(await findStoredFile(db, organizationId, site.id, 'bill-history', file.sha256)))
      await addStoredFile(db, { organizationId, siteId: site.id, kind: 'bill-history', sha256: file.sha256, fileName: sanitizeFileName(file.fileName), contentType: 'text/csv', bytes: file.bytes, createdBy: userId });
    await recordEvent(db, organizationId, userId, { action: 'bill.imported', subjectType: 'site', subjectId: site.id, detail: { bills: inserted.length } });
    return { bills: inserted, warnings: parsed.warnings };
  } finally {
    if (file) await discardTemp(file).catch(() => undefined);
  }
}

/** Attaches a PDF, PNG or JPEG (checked by its first bytes) to a bill. */
export async function attachDocument(ctx: Ctx, billRow: BillRow, request: Request, maxBytes: number) {
  const { db, organizationId, site, userId } = ctx;
  const upload = await readMultipart(request, { fileField: 'file', maxFileBytes: maxBytes, textFields: [] });
  const file = upload.file;
  try {
    if (!file || file.bytes === 0) throw new ApiError(400, 'invalid_input', 'Attach the bill document in the "file" field.', { file: 'Required.' });
    const type = documentType(file.head);
    if (!type) throw new ApiError(415, 'unsupported_type', `"${sanitizeFileName(file.fileName)}" is not a PDF, PNG or JPEG file (checked by its content, not its name). Scan or save the bill in one of those formats.`);
    await commitToStore(file);
    const stored = (await findStoredFile(db, organizationId, site.id, 'bill-document', file.sha256)) ?? (await addStoredFile(db, { organizationId, siteId: site.id, kind: 'bill-document', sha256: file.sha256, fileName: sanitizeFileName(file.fileName, `bill.${type.ext}`), contentType: type.mime, bytes: file.bytes, createdBy: userId }));
    await atomically(db, async (tx) => {
      await setBillDocument(tx, organizationId, billRow.id, stored.id);
      await recordEvent(tx, organizationId, userId, { action: 'bill.document_attached', subjectType: 'bill', subjectId: billRow.id, detail: { siteId: site.id, fileName: stored.fileName, bytes: stored.bytes } });
    });
    return stored;
  } finally {
    if (file) await discardTemp(file).catch(() => undefined);
  }
}

/** Bills against the interval data recomputed on the bills' own billing periods. */
export async function siteReconciliation(db: Db, organizationId: string, site: SiteDto) {
  const bills = await listBills(db, organizationId, site.id);
  if (bills.length === 0) return { currency: site.currency, bills: [], disputable: 0, multiplier: { suspected: false, impliedMultiplier: null, message: null }, notes: ['No bills yet: enter or import bills to compare them with the meter data.'] };
  const findings = await siteFindings(db, organizationId, site, { basis: 'billing' });
  const meters = await listMeters(db, organizationId, site.id);
  const profile = meters[0]?.importProfile as { meters?: { multiplier?: number }[] } | null | undefined;
  const multiplier = profile?.meters?.[0]?.multiplier ?? 1;
  const r = reconcile(
    bills.map((b) => ({ id: b.id, periodStart: b.periodStart, periodEnd: b.periodEnd, kwh: b.kwh, billedDemand: b.billedDemand, demandUnit: b.demandUnit, kvarh: b.kvarh, pf: b.pf, pfCharge: b.pfCharge, total: b.total })),
    findings.periods,
    multiplier,
  );
  return { currency: findings.currency ?? site.currency, ...r, notes: findings.notes };
}
