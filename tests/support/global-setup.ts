/**
 * Integration and browser tests run against real parts: a migrated temporary SQLite file,
 * the built app server over HTTP, and the maildev SMTP sink. Started once for the run.
 */
import type { TestProject } from 'vitest/node';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from '../../src/scripts/lib/fresh-database';
import { openDb } from '../../src/lib/db/client';
import { applyMigrations } from '../../src/lib/db/migrate';
import { seedDemo } from '../../src/lib/demo/seed';
import { seedDemoData } from '../../src/lib/demo/seed-data';
import { seedDemoPurchases } from '../../src/lib/demo/seed-purchases';
import { seedDemoPlans } from '../../src/lib/demo/seed-plans';
import { seedDemoReport } from '../../src/lib/demo/seed-report';
import { startMailSink } from '../../src/scripts/lib/mail-sink';
import { startAppServer } from '../../src/scripts/lib/app-server';
import { startPaymentFake } from '../../src/scripts/lib/payment-fake';
import { TEST_PAYMENT_KEYS } from './payment-keys';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    mailboxUrl: string;
    databaseUrl: string;
    dataDir: string;
    paymentFakeUrl: string;
  }
}

export { freePort };

export default async function setup(project: TestProject) {
  const dataDir = mkdtempSync(join(tmpdir(), 'varledger-test-'));
  const databaseUrl = `file:${join(dataDir, 'test.db')}`;
  // The seeder stores the demo meter files through the app's file store, which reads DATA_DIR.
  process.env.DATA_DIR = dataDir;
  const { db, ready } = openDb(databaseUrl);
  await ready;
  await applyMigrations(db);
  await seedDemo(db);
  await seedDemoData(db);
  await seedDemoPurchases(db);
  await seedDemoPlans(db);
  await seedDemoReport(db);
  db.$client.close();

  const [smtpPort, webPort, appPort] = [await freePort(), await freePort(), await freePort()];
  const sink = await startMailSink({ smtpPort, webPort, mailDirectory: join(dataDir, 'mail') });
  const baseUrl = `http://127.0.0.1:${appPort}`;
  const payments = await startPaymentFake({ port: 0, secretKey: TEST_PAYMENT_KEYS.secretKey, webhookSecret: TEST_PAYMENT_KEYS.webhookSecret, webhookUrl: `${baseUrl}/api/payments/webhook`, quiet: true });
  const app = await startAppServer(
    { HOST: '127.0.0.1', PORT: String(appPort), APP_URL: baseUrl, DATABASE_URL: databaseUrl, DATA_DIR: dataDir, SMTP_PORT: String(smtpPort), MAIL_SINK_WEB_PORT: String(webPort), NODE_ENV: 'test', STRIPE_SECRET_KEY: TEST_PAYMENT_KEYS.secretKey, STRIPE_WEBHOOK_SECRET: TEST_PAYMENT_KEYS.webhookSecret, STRIPE_API_BASE: payments.url },
    { quiet: true },
  );
  project.provide('baseUrl', baseUrl);
  project.provide('mailboxUrl', sink.url);
  project.provide('databaseUrl', databaseUrl);
  project.provide('dataDir', dataDir);
  project.provide('paymentFakeUrl', payments.url);

  return async () => {
    await app.stop();
    await payments.stop();
    await sink.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
}
