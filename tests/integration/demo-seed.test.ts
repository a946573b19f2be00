/**
 * The README promises that `npm start` twice changes nothing: every demo seeder run a second
 * time on the same database adds no row anywhere (counted table by table) and no activity entry.
 */
import { describe, expect, it } from 'vitest';
import { rmSync } from 'node:fs';
import { openDb } from '../../src/lib/db/client';
import { seedDemo } from '../../src/lib/demo/seed';
import { seedDemoData } from '../../src/lib/demo/seed-data';
import { seedDemoPurchases } from '../../src/lib/demo/seed-purchases';
import { seedDemoPlans } from '../../src/lib/demo/seed-plans';
import { seedDemoReport } from '../../src/lib/demo/seed-report';
import { freshDemoDatabase } from '../../src/scripts/lib/fresh-database';

const TABLES = ['user', 'organization', 'member', 'site', 'meter', 'meter_import', 'interval_block', 'tariff', 'bill', 'correction_plan', 'purchase', 'savings_report', 'audit_event'];

describe('demo seeding', () => {
  it('a second run of every seeder changes no table', async () => {
    const { dataDir, databaseUrl } = await freshDemoDatabase('varledger-seed-twice', 'seed');
    const { db, ready } = openDb(databaseUrl);
    await ready;
    const seedAll = async () => {
      await seedDemo(db);
      await seedDemoData(db);
      await seedDemoPurchases(db);
      await seedDemoPlans(db);
      await seedDemoReport(db);
    };
    const counts = async () => Object.fromEntries(await Promise.all(TABLES.map(async (t) => [t, Number((await db.$client.execute(`SELECT count(*) AS n FROM "${t}"`)).rows[0]!.n)] as const)));
    try {
      await seedAll();
      const first = await counts();
      expect(first.interval_block).toBeGreaterThan(0);
      expect(first.audit_event).toBeGreaterThan(0);
      await seedAll();
      expect(await counts()).toEqual(first);
    } finally {
      db.$client.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  }, 120_000);
});
