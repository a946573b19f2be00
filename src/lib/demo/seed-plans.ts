/**
 * Demo correction plans: two saved plans on each of two demo plants, with invented costs,
 * evaluated on the plants' own demo data through the same service the endpoints use.
 * Idempotent: a plan whose name already exists on the site is left as it is.
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { member, organization, user } from '../db/schema';
import { findSiteByName, toSiteDto } from '../db/sites';
import { listMeters } from '../db/intervals';
import { listTariffs } from '../db/tariffs';
import { PlanSpecSchema, type PlanSpecInput } from '../correction-plans/plan-spec';
import { findPlanByName } from '../correction-plans/plans-store';
import { savePlan } from '../correction-plans/service';
import { DEMO_WORKSPACES } from './scenario';

export const DEMO_PLANS: { siteName: string; spec: PlanSpecInput }[] = [
  {
    siteName: 'Brackwater Kiln Works',
    spec: { name: 'Kiln hall fixed 150 kvar', bank: { kind: 'fixed', kvar: 150, ratedVoltageV: 480 }, costs: { perKvar: 32, fixedInstallation: 3800, omPctOfCapex: 1 }, finance: { discountRate: 0.08, lifeYears: 15 } },
  },
  {
    siteName: 'Brackwater Kiln Works',
    spec: { name: 'Main switchboard 300 kvar, 6 steps', bank: { kind: 'switched', totalKvar: 300, steps: 6, targetPf: 0.95, ratedVoltageV: 480 }, costs: { perKvar: 64, fixedInstallation: 5200, omPctOfCapex: 1.5 }, finance: { discountRate: 0.08, lifeYears: 15 } },
  },
  {
    siteName: 'Tarn Valley Glaze Plant',
    spec: { name: 'Glaze line 250 kvar, 5 steps', bank: { kind: 'switched', totalKvar: 250, steps: 5, targetPf: 0.96 }, costs: { perKvar: 58, fixedInstallation: 4100, omPctOfCapex: 1 }, finance: { discountRate: 0.07, lifeYears: 15 } },
  },
  {
    siteName: 'Tarn Valley Glaze Plant',
    spec: { name: 'Glaze line 250 kvar detuned 7 %', bank: { kind: 'switched', totalKvar: 250, steps: 5, targetPf: 0.96 }, costs: { perKvar: 58, fixedInstallation: 4100, detuned: { premiumPerKvar: 36, reactorPct: 7 }, omPctOfCapex: 1.2 }, finance: { discountRate: 0.07, lifeYears: 15 } },
  },
];

export async function seedDemoPlans(db: Db): Promise<{ created: number }> {
  let created = 0;
  const ws = DEMO_WORKSPACES[0]!;
  const org = await db.query.organization.findFirst({ where: eq(organization.slug, ws.slug) });
  const author = await db.query.user.findFirst({ where: eq(user.email, 'consultant@fieldline.example') });
  if (!org || !author) return { created };
  if (!(await db.query.member.findFirst({ where: and(eq(member.organizationId, org.id), eq(member.userId, author.id)) }))) return { created };
  for (const p of DEMO_PLANS) {
    const row = await findSiteByName(db, org.id, p.siteName);
    if (!row) continue;
    const spec = PlanSpecSchema.parse(p.spec);
    if (await findPlanByName(db, org.id, row.id, spec.name)) continue;
    // Plans need the plant's meter data and tariff (seeded by seedDemoData first).
    if ((await listMeters(db, org.id, row.id)).length === 0 || (await listTariffs(db, org.id, row.id)).length === 0) continue;
    await savePlan(db, org.id, author.id, toSiteDto(row), spec);
    created++;
  }
  return { created };
}
