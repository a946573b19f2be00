/**
 * `npm start` (after `astro build`): migrate, seed the demo, start the local SMTP sink,
 * start the app server, print where everything is. Ctrl-C stops it all.
 */
import { getConfig } from '../lib/config';
import { openDb } from '../lib/db/client';
import { applyMigrations } from '../lib/db/migrate';
import { seedDemo } from '../lib/demo/seed';
import { seedDemoData } from '../lib/demo/seed-data';
import { seedDemoPurchases } from '../lib/demo/seed-purchases';
import { seedDemoPlans } from '../lib/demo/seed-plans';
import { seedDemoReport } from '../lib/demo/seed-report';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_WORKSPACES } from '../lib/demo/scenario';
import { ROLE_LABELS } from '../lib/auth/permissions';
import { startMailSink, type MailSink } from './lib/mail-sink';
import { startAppServer } from './lib/app-server';
import { startPaymentFake, type PaymentFake } from './lib/payment-fake';

let cfg;
try {
  cfg = getConfig();
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}

const { db, ready } = openDb(cfg.DATABASE_URL, cfg.DATABASE_AUTH_TOKEN);
await ready;
await applyMigrations(db);
const seeded = await seedDemo(db);
const data = await seedDemoData(db);
await seedDemoPurchases(db);
await seedDemoPlans(db);
await seedDemoReport(db);
db.$client.close();

let sink: MailSink | undefined;
if (cfg.MAIL_SINK === 'on') {
  try {
    sink = await startMailSink({ smtpPort: cfg.SMTP_PORT, webPort: cfg.MAIL_SINK_WEB_PORT, mailDirectory: `${cfg.DATA_DIR}/mail` });
  } catch (e) {
    console.error(`Could not start the local mail sink on ports ${cfg.SMTP_PORT}/${cfg.MAIL_SINK_WEB_PORT}: ${(e as Error).message}\nSet SMTP_PORT and MAIL_SINK_WEB_PORT to free ports, or MAIL_SINK=off with a real SMTP_HOST.`);
    process.exit(1);
  }
}

let payments: PaymentFake | undefined;
if (cfg.PAYMENT_FAKE === 'on') {
  try {
    payments = await startPaymentFake({ port: cfg.PAYMENT_FAKE_PORT, secretKey: cfg.STRIPE_SECRET_KEY, webhookSecret: cfg.STRIPE_WEBHOOK_SECRET, webhookUrl: `${cfg.baseUrl}/api/payments/webhook`, quiet: true });
  } catch (e) {
    console.error(`Could not start the local payment fake on port ${cfg.PAYMENT_FAKE_PORT}: ${(e as Error).message}\nSet PAYMENT_FAKE_PORT to a free port, or PAYMENT_FAKE=off with real test-mode keys.`);
    await sink?.stop();
    process.exit(1);
  }
}

const app = await startAppServer({ HOST: cfg.HOST, PORT: String(cfg.PORT), NODE_ENV: process.env.NODE_ENV ?? 'production' });

const pad = (s: string, n: number) => s.padEnd(n);
const roleOf = (key: string) => {
  const role = DEMO_WORKSPACES[0]!.members.find(([k]) => k === key)?.[1];
  return role ? ROLE_LABELS[role] : '';
};
console.log(`
Varledger is running at ${cfg.baseUrl}
  database  ${cfg.DATABASE_URL}  (demo: ${seeded.workspaces} workspaces, ${seeded.sites} sites; ${seeded.created} objects, ${data.imported} meter imports, ${data.tariffs} tariffs, ${data.bills} bills added now)
  mailbox   ${sink ? sink.url : `off (mail goes to ${cfg.SMTP_HOST}:${cfg.SMTP_PORT})`}
  payments  ${payments ? `local fake at ${payments.url} (test card 4242 4242 4242 4242)` : cfg.paymentApi.base}

Demo accounts (password for all: ${DEMO_PASSWORD})
${DEMO_PEOPLE.map((p) => `  ${pad(roleOf(p.key), 15)} ${pad(p.email, 32)} ${p.name}`).join('\n')}

Press Ctrl-C to stop.`);

async function shutdown() {
  await app.stop();
  await payments?.stop();
  await sink?.stop();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
app.child.on('exit', async (code) => {
  console.error(`The app server stopped (exit code ${code}).`);
  await payments?.stop();
  await sink?.stop();
  process.exit(code ?? 1);
});
