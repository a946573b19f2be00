/** Meter-data import records and stored files. Every function is scoped by organization. */
import { and, desc, eq, lt } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { meterImport, storedFile } from './schema';

export type ImportRow = typeof meterImport.$inferSelect;
export type FileRow = typeof storedFile.$inferSelect;

export async function findStoredFile(db: Db, organizationId: string, siteId: string, kind: FileRow['kind'], sha256: string) {
  return db.query.storedFile.findFirst({ where: and(eq(storedFile.organizationId, organizationId), eq(storedFile.siteId, siteId), eq(storedFile.kind, kind), eq(storedFile.sha256, sha256)) });
}

export async function getStoredFile(db: Db, organizationId: string, fileId: string) {
  return db.query.storedFile.findFirst({ where: and(eq(storedFile.organizationId, organizationId), eq(storedFile.id, fileId)) });
}

/** Records a stored file once per site, kind and hash: two uploads of the same bytes at once share one row. */
export async function addStoredFile(db: Db, v: Omit<typeof storedFile.$inferInsert, 'id'>): Promise<FileRow> {
  const [row] = await db.insert(storedFile).values({ id: newId('file'), ...v }).onConflictDoNothing().returning();
  if (row) return row;
  const existing = v.siteId ? await findStoredFile(db, v.organizationId, v.siteId, v.kind, v.sha256) : undefined;
  if (!existing) throw new Error(`stored file ${v.sha256} conflicted but cannot be found`);
  return existing;
}

/** The successful import that used a file, if any. */
export async function importedFromFile(db: Db, organizationId: string, fileId: string) {
  return db.query.meterImport.findFirst({ where: and(eq(meterImport.organizationId, organizationId), eq(meterImport.fileId, fileId), eq(meterImport.status, 'imported')), orderBy: desc(meterImport.createdAt) });
}

export async function getImport(db: Db, organizationId: string, siteId: string, importId: string) {
  return db.query.meterImport.findFirst({ where: and(eq(meterImport.organizationId, organizationId), eq(meterImport.siteId, siteId), eq(meterImport.id, importId)) });
}

export async function listImports(db: Db, organizationId: string, siteId: string, limit = 100) {
  return db
    .select({ imp: meterImport, fileName: storedFile.fileName, sha256: storedFile.sha256 })
    .from(meterImport)
    .innerJoin(storedFile, eq(storedFile.id, meterImport.fileId))
    .where(and(eq(meterImport.organizationId, organizationId), eq(meterImport.siteId, siteId)))
    .orderBy(desc(meterImport.createdAt))
    .limit(limit);
}

/** The history's explanation of an import a stopped server left half-way. */
export const INTERRUPTED_PROBLEM = {
  row: null,
  column: null,
  value: null,
  code: 'interrupted',
  message: 'The server stopped while this file was being imported, so nothing from it was stored. Upload the file again.',
};

/**
 * Imports left 'processing' by a server that stopped mid-way are marked interrupted. Their
 * intervals were never written: the data is written in one transaction at the very end.
 */
export async function markStaleImportsInterrupted(db: Db, olderThanMs = 10 * 60_000): Promise<number> {
  const rows = await db
    .update(meterImport)
    .set({ status: 'interrupted', problems: [INTERRUPTED_PROBLEM], finishedAt: new Date() })
    .where(and(eq(meterImport.status, 'processing'), lt(meterImport.createdAt, new Date(Date.now() - olderThanMs))))
    .returning({ id: meterImport.id });
  return rows.length;
}
