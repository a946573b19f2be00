/**
 * Seeds the demo idempotently: people (already verified), workspaces, memberships, sites.
 * Running it twice changes nothing; a demo object someone deleted is put back.
 */
import { and, eq } from 'drizzle-orm';
import { hashPassword } from 'better-auth/crypto';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { account, member, organization, user } from '../db/schema';
import { createSite, findSiteByName } from '../db/sites';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_WORKSPACES } from './scenario';

export type SeedSummary = { people: number; workspaces: number; sites: number; created: number };

export async function ensureUser(db: Db, p: { name: string; email: string }, password: string): Promise<{ id: string; created: boolean }> {
  const existing = await db.query.user.findFirst({ where: eq(user.email, p.email) });
  if (existing) return { id: existing.id, created: false };
  const id = newId('usr');
  await db.insert(user).values({ id, name: p.name, email: p.email, emailVerified: true });
  await db.insert(account).values({ id: newId('acc'), accountId: id, providerId: 'credential', userId: id, password: await hashPassword(password) });
  return { id, created: true };
}

export async function ensureWorkspace(db: Db, name: string, slug: string): Promise<{ id: string; created: boolean }> {
  const existing = await db.query.organization.findFirst({ where: eq(organization.slug, slug) });
  if (existing) return { id: existing.id, created: false };
  const id = newId('org');
  await db.insert(organization).values({ id, name, slug });
  return { id, created: true };
}

export async function ensureMember(db: Db, organizationId: string, userId: string, role: string): Promise<boolean> {
  const existing = await db.query.member.findFirst({ where: and(eq(member.organizationId, organizationId), eq(member.userId, userId)) });
  if (existing) return false;
  await db.insert(member).values({ id: newId('mem'), organizationId, userId, role });
  return true;
}

export async function seedDemo(db: Db): Promise<SeedSummary> {
  let created = 0;
  let sites = 0;
  const ids = new Map<string, string>();
  for (const p of DEMO_PEOPLE) {
    const u = await ensureUser(db, p, DEMO_PASSWORD);
    ids.set(p.key, u.id);
    if (u.created) created++;
  }
  for (const w of DEMO_WORKSPACES) {
    const ws = await ensureWorkspace(db, w.name, w.slug);
    if (ws.created) created++;
    for (const [key, role] of w.members) if (await ensureMember(db, ws.id, ids.get(key)!, role)) created++;
    for (const s of w.sites) {
      sites++;
      if (!(await findSiteByName(db, ws.id, s.name))) {
        await createSite(db, ws.id, s);
        created++;
      }
    }
  }
  return { people: DEMO_PEOPLE.length, workspaces: DEMO_WORKSPACES.length, sites, created };
}
