/** `npm run db:migrate`: applies the committed migrations to DATABASE_URL. */
import { getConfig } from '../lib/config';
import { openDb } from '../lib/db/client';
import { applyMigrations } from '../lib/db/migrate';

const cfg = getConfig();
const { db, ready } = openDb(cfg.DATABASE_URL, cfg.DATABASE_AUTH_TOKEN);
await ready;
await applyMigrations(db);
console.log(`Migrations applied to ${cfg.DATABASE_URL}`);
db.$client.close();
