/**
 * The database handle: Drizzle over @libsql/client. A `file:` URL (the default) is a local
 * SQLite file put in WAL mode; a locked database is retried (see busy.ts) for every call
 * through this handle, Drizzle's and better-auth's alike. A libsql:// or https:// URL
 * talks to a libSQL server unchanged, for deployments with several app instances.
 */
import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import * as schema from './schema';
import { BUSY_SYNC_WAIT_MS, withBusyRetry } from './busy';
import { getConfig } from '../config';

export type Db = LibSQLDatabase<typeof schema> & { $client: Client };

let instance: { db: Db; ready: Promise<void> } | undefined;

/** Opens a database (used directly by scripts and tests with an explicit URL). */
export function openDb(url: string, authToken?: string): { db: Db; ready: Promise<void> } {
  const isFile = url.startsWith('file:');
  if (isFile) {
    const path = url.slice('file:'.length);
    if (path && path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
  }
  // `timeout` is SQLite's busy timeout on every pooled connection. It blocks the event loop
  // while it waits, so it is short; the retries with back-off are async (withBusyRetry).
  const client = withBusyRetry(createClient({ url, authToken, timeout: isFile ? BUSY_SYNC_WAIT_MS : undefined }));
  const db = drizzle(client, { schema }) as Db;
  const ready = isFile
    ? client
        // WAL is a property of the file, so setting it once sticks for every connection.
        .execute('PRAGMA journal_mode = WAL')
        .then(() => undefined)
    : Promise.resolve();
  return { db, ready };
}

/** The app's shared database, from DATABASE_URL. */
export function getDb(): Db {
  if (!instance) {
    const cfg = getConfig();
    instance = openDb(cfg.DATABASE_URL, cfg.DATABASE_AUTH_TOKEN);
  }
  return instance.db;
}

/** Resolves when per-connection settings (WAL, busy timeout) are applied. */
export function dbReady(): Promise<void> {
  getDb();
  return instance!.ready;
}
