/** Throwaway servers for tests and benches: a free loopback port and a migrated SQLite file with the demo people. */
import { mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDb } from '../../lib/db/client';
import { applyMigrations } from '../../lib/db/migrate';
import { seedDemo } from '../../lib/demo/seed';

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/** A new folder under the system temp dir holding `<name>.db`, migrated and seeded with the demo workspaces and people. */
export async function freshDemoDatabase(prefix: string, name = 'app'): Promise<{ dataDir: string; databaseUrl: string }> {
  const dataDir = mkdtempSync(join(tmpdir(), `${prefix}-`));
  const databaseUrl = `file:${join(dataDir, `${name}.db`)}`;
  const { db, ready } = openDb(databaseUrl);
  await ready;
  await applyMigrations(db);
  await seedDemo(db);
  db.$client.close();
  return { dataDir, databaseUrl };
}
