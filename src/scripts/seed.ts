/** `npm run seed`: migrates, then seeds the demo scenario (idempotent). */
import { getConfig } from '../lib/config';
import { openDb } from '../lib/db/client';
import { applyMigrations } from '../lib/db/migrate';
import { seedDemo } from '../lib/demo/seed';
import { seedDemoData } from '../lib/demo/seed-data';

const cfg = getConfig();
const { db, ready } = openDb(cfg.DATABASE_URL, cfg.DATABASE_AUTH_TOKEN);
await ready;
await applyMigrations(db);
const s = await seedDemo(db);
const d = await seedDemoData(db);
console.log(`Demo seeded: ${s.people} people, ${s.workspaces} workspaces, ${s.sites} sites (${s.created} objects created now; ${d.imported} meter imports, ${d.tariffs} tariffs, ${d.bills} bills).`);
db.$client.close();
