/** Records who did what in a workspace (read by Owners). */
import { desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { auditEvent } from './schema';

export type AuditEntry = { action: string; subjectType: string; subjectId?: string | null; detail?: Record<string, unknown>; /** when it happened, if not now (the demo's history) */ at?: Date };

export async function recordEvent(db: Db, organizationId: string, actorUserId: string | null, e: AuditEntry): Promise<void> {
  await db.insert(auditEvent).values({ id: newId('evt'), organizationId, actorUserId, action: e.action, subjectType: e.subjectType, subjectId: e.subjectId ?? null, detail: e.detail ?? null, ...(e.at ? { createdAt: e.at } : {}) });
}

export async function listEvents(db: Db, organizationId: string, limit = 200) {
  return db.select().from(auditEvent).where(eq(auditEvent.organizationId, organizationId)).orderBy(desc(auditEvent.createdAt)).limit(limit);
}

/** Runs a change and its audit entry in one write transaction: both are written or neither. */
export function atomically<T>(db: Db, fn: (tx: Db) => Promise<T>): Promise<T> {
  return db.transaction((tx) => fn(tx as unknown as Db));
}

/** Deletes with `remove` and records `entry` in one transaction; false, and nothing recorded, when there was nothing to delete. */
export function deleteRecorded(db: Db, organizationId: string, actorUserId: string, remove: (tx: Db) => Promise<boolean>, entry: AuditEntry): Promise<boolean> {
  return atomically(db, async (tx) => {
    if (!(await remove(tx))) return false;
    await recordEvent(tx, organizationId, actorUserId, entry);
    return true;
  });
}
