/**
 * SQLite "database is locked" (SQLITE_BUSY) handling. The driver runs statements
 * synchronously, so SQLite's own busy timeout would block the whole event loop while it
 * waits, and a second connection of this same process could never release its lock in
 * that time. Each attempt therefore waits only briefly inside SQLite (BUSY_SYNC_WAIT_MS);
 * the retries are async sleeps with growing delays, up to BUSY_WINDOW_MS in all. A call
 * that is still locked out after that throws DatabaseBusyError, which the API maps to a
 * 503 `busy` answer with Retry-After (nothing of that call was written: only taking the
 * lock is retried, before any statement ran).
 */
import type { Client, InArgs, InStatement, Transaction, TransactionMode } from '@libsql/client';

/** SQLite's own busy wait per attempt (blocks the event loop, so it stays short). */
export const BUSY_SYNC_WAIT_MS = 50;
/** Total time one call keeps retrying before it gives up. */
export const BUSY_WINDOW_MS = 5000;
/** What a client is told to wait before trying again. */
export const BUSY_RETRY_AFTER_SECONDS = 2;

export class DatabaseBusyError extends Error {
  readonly code = 'SQLITE_BUSY';
  constructor(readonly attempts: number, cause: unknown) {
    super(`The database stayed locked by another writer for ${BUSY_WINDOW_MS} ms (${attempts} attempts)`, { cause });
    this.name = 'DatabaseBusyError';
  }
}

/** True for SQLITE_BUSY (and its extended codes) anywhere in an error's cause chain. */
export function isBusyError(err: unknown): boolean {
  for (let e = err, depth = 0; e && depth < 8; e = (e as { cause?: unknown }).cause, depth++) {
    if (e instanceof DatabaseBusyError) return true;
    const code = String((e as { code?: unknown }).code ?? '');
    const raw = (e as { rawCode?: unknown }).rawCode;
    if (code.startsWith('SQLITE_BUSY') || (typeof raw === 'number' && (raw & 0xff) === 5)) return true;
  }
  return false;
}

let lastGaveUpAt = 0;

/** Whether a call gave up on a locked database within the last `withinMs` (for the error page). */
export function recentlyBusy(withinMs = 15_000): boolean {
  return Date.now() - lastGaveUpAt < withinMs;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Runs `fn` again while it fails with SQLITE_BUSY: 25, 50, 100 ... 500 ms apart (with jitter), for BUSY_WINDOW_MS. */
export async function retryBusy<T>(fn: () => Promise<T>, windowMs = BUSY_WINDOW_MS): Promise<T> {
  const started = Date.now();
  for (let attempt = 1; ; attempt++) {
    try {
      return await fn();
    } catch (err) {
      if (!isBusyError(err) || err instanceof DatabaseBusyError) throw err;
      const left = windowMs - (Date.now() - started);
      if (left <= 0) {
        lastGaveUpAt = Date.now();
        throw new DatabaseBusyError(attempt, err);
      }
      const delay = Math.min(500, 25 * 2 ** (attempt - 1)) * (0.75 + Math.random() * 0.5);
      await sleep(Math.min(delay, left));
    }
  }
}

/** Statements that only read (they never wait for the write lock in WAL mode). */
const READ_ONLY = /^\s*(?:select|pragma|explain|values)\b/i;

/**
 * The client with busy retries. The driver leaves a statement that failed with SQLITE_BUSY
 * un-reset on its pooled connection, which then keeps an open transaction (and, after one
 * more write, the write lock) until garbage collection finalises it; measured here: a
 * retried INSERT on that connection never committed and locked every other writer out.
 * So no prepared statement is ever allowed to meet the lock: every write (a single
 * statement, a batch or a transaction) first takes the lock with BEGIN IMMEDIATE run
 * through the driver's exec path, which finalises its statement on failure, and only
 * that step is retried. Reads run as they are.
 */
export function withBusyRetry(client: Client): Client {
  const beginWrite = () =>
    retryBusy(async () => {
      const tx = await client.transaction('deferred'); // BEGIN DEFERRED takes no lock
      try {
        await tx.executeMultiple('ROLLBACK; BEGIN IMMEDIATE');
        return tx;
      } catch (e) {
        tx.close();
        throw e;
      }
    });
  const inWrite = async <T>(fn: (tx: Transaction) => Promise<T>): Promise<T> => {
    const tx = await beginWrite();
    try {
      const out = await fn(tx);
      await tx.commit();
      return out;
    } finally {
      tx.close(); // rolls back if still open, returns the connection
    }
  };
  const overrides: Partial<Client> = {
    transaction: (async (mode?: TransactionMode) => (mode === 'read' ? client.transaction('read') : beginWrite())) as Client['transaction'],
    execute: (async (stmtOrSql: InStatement | string, args?: InArgs) => {
      const stmt: InStatement = typeof stmtOrSql === 'string' ? { sql: stmtOrSql, args: args ?? [] } : stmtOrSql;
      const sql = typeof stmt === 'string' ? stmt : stmt.sql;
      if (READ_ONLY.test(sql)) return client.execute(stmt);
      return inWrite((tx) => tx.execute(stmt));
    }) as Client['execute'],
    batch: (async (stmts: InStatement[], mode?: TransactionMode) => (mode === 'read' ? client.batch(stmts, 'read') : inWrite((tx) => tx.batch(stmts)))) as Client['batch'],
  };
  return new Proxy(client, {
    get(target, prop) {
      if (prop in overrides) return overrides[prop as keyof Client];
      const value = Reflect.get(target, prop, target) as unknown;
      return typeof value === 'function' ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
}
