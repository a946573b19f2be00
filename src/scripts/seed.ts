/** `npm run seed`: migrates, then seeds the demo scenario (idempotent). */
import { getConfig } from '../lib/config';
import { openDb } from '../lib/db/client';
import { applyMigrations } from '../lib/db/migrate';
import { seedDemo } from '../lib/demo/seed';
import { seedDemoData } from '../lib/demo/seed-data';
import { seedDemoPurchases } from '../lib/demo/seed-purchases';
import { seedDemoPlans } from '../lib/demo/seed-plans';
import { seedDemoReport } from '../lib/demo/seed-report';

const cfg = getConfig();
const { db, ready } = openDb(cfg.DATABASE_URL, cfg.DATABASE_AUTH_TOKEN);
await ready;
await applyMigrations(db);
const s = await seedDemo(db);
const d = await seedDemoData(db);
await seedDemoPurchases(db);
await seedDemoPlans(db);
await seedDemoReport(db);
console.log(`Demo seeded: ${s.people} people, ${s.workspaces} workspaces, ${s.sites} sites (${s.created} objects created now; ${d.imported} meter imports, ${d.tariffs} tariffs, ${d.bills} bills).`);
db.$client.close();
