/**
 * A private app server for fault tests: its own data folder and SQLite file (migrated and
 * seeded with the demo people), a fixed port so it can be killed and started again on the
 * same database, and whatever SMTP port and payment API the test points it at.
 */
import { rmSync } from 'node:fs';
import { createClient, type Client as SqlClient } from '@libsql/client';
import { startAppServer, type AppServer } from '../../src/scripts/lib/app-server';
import { freePort, freshDemoDatabase } from '../../src/scripts/lib/fresh-database';
import { Client, DEMO } from './http';
import { TEST_PAYMENT_KEYS } from './payment-keys';

export type Rig = {
  baseUrl: string;
  databaseUrl: string;
  dataDir: string;
  server: () => AppServer;
  start: () => Promise<void>;
  /** SIGKILL, as a crash or an OOM kill would: no shutdown code runs. */
  kill: () => Promise<void>;
  stop: () => Promise<void>;
  /** A client signed in on this server (demo password). */
  as: (email: string) => Promise<Client>;
  anonymous: () => Client;
  /** A second app server on the same database and data folder (another instance), on its own port. */
  twin: () => Promise<{ baseUrl: string; as: (email: string) => Promise<Client>; stop: () => Promise<void> }>;
  /** A plain SQLite connection to the same file (no app code, no retries). */
  sql: () => SqlClient;
  dispose: () => Promise<void>;
};

export async function startRig(opts: { smtpPort: number; paymentApi?: string; env?: Record<string, string> }): Promise<Rig> {
  const { dataDir, databaseUrl } = await freshDemoDatabase('varledger-faults', 'faults');
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const env = {
    HOST: '127.0.0.1',
    PORT: String(port),
    APP_URL: baseUrl,
    DATABASE_URL: databaseUrl,
    DATA_DIR: dataDir,
    SMTP_PORT: String(opts.smtpPort),
    MAIL_SINK_WEB_PORT: String(await freePort()),
    NODE_ENV: 'test',
    STRIPE_SECRET_KEY: TEST_PAYMENT_KEYS.secretKey,
    STRIPE_WEBHOOK_SECRET: TEST_PAYMENT_KEYS.webhookSecret,
    STRIPE_API_BASE: opts.paymentApi ?? `http://127.0.0.1:${await freePort()}`,
    ...opts.env,
  };
  let app: AppServer | null = null;
  const sqlClients: SqlClient[] = [];
  const rig: Rig = {
    baseUrl,
    databaseUrl,
    dataDir,
    server: () => {
      if (!app) throw new Error('the rig server is not running');
      return app;
    },
    start: async () => {
      app = await startAppServer(env, { quiet: true });
    },
    kill: async () => {
      const a = app;
      app = null;
      if (!a || a.child.exitCode !== null) return;
      await new Promise<void>((resolve) => {
        a.child.once('exit', () => resolve());
        a.child.kill('SIGKILL');
      });
    },
    stop: async () => {
      const a = app;
      app = null;
      await a?.stop();
    },
    as: async (email: string) => clientAt(baseUrl).signIn(email, DEMO.password),
    twin: async () => {
      const twinPort = await freePort();
      const twinUrl = `http://127.0.0.1:${twinPort}`;
      const other = await startAppServer({ ...env, PORT: String(twinPort), APP_URL: twinUrl }, { quiet: true });
      return { baseUrl: twinUrl, as: (email: string) => clientAt(twinUrl).signIn(email, DEMO.password), stop: () => other.stop() };
    },
    anonymous: () => clientAt(baseUrl),
    sql: () => {
      // SQLite waits up to 5 s for the app's own short writes before this connection gives up.
      const c = createClient({ url: databaseUrl, timeout: 5000 });
      sqlClients.push(c);
      return c;
    },
    dispose: async () => {
      await rig.stop();
      for (const c of sqlClients) c.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
  await rig.start();
  return rig;
}

/** The suite's HTTP client (cookie jar, Origin like a browser), aimed at another server. */
export function clientAt(baseUrl: string): Client {
  const c = new Client();
  Object.defineProperty(c, 'base', { value: baseUrl });
  return c;
}

/**
 * Holds SQLite's write lock from outside the app, as another process writing would:
 * BEGIN IMMEDIATE plus a harmless insert, kept open until `release` (which rolls back, so
 * the probe row never persists).
 */
export async function holdWriteLock(sql: SqlClient): Promise<{ release: () => Promise<void> }> {
  // Taken through exec (not a prepared BEGIN): the driver leaves a prepared statement that
  // failed on a lock open on its connection, which would spoil this connection for later reads.
  const tx = await sql.transaction('deferred');
  try {
    await tx.executeMultiple('ROLLBACK; BEGIN IMMEDIATE');
  } catch (e) {
    tx.close();
    throw e;
  }
  await tx.execute({ sql: 'INSERT INTO verification (id, identifier, value, expires_at) VALUES (?, ?, ?, ?)', args: [`lock-probe-${Date.now()}`, 'faults-lock-probe', 'x', Date.now() + 60_000] });
  let released = false;
  return {
    release: async () => {
      if (released) return;
      released = true;
      await tx.rollback();
    },
  };
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls `probe` every `everyMs` until it returns a value (not undefined), for at most 20 s. */
export async function waitFor<T>(what: string, probe: () => Promise<T | undefined>, everyMs = 100, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await probe();
    if (v !== undefined) return v;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(everyMs);
  }
}
