import { endpoint, readJson } from '@/lib/api/handler';
import { ApiError, json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { createSite, findSiteByName, listSites } from '@/lib/db/sites';
import { atomically, recordEvent } from '@/lib/db/audit-log';
import { SiteCreateSchema } from '@/lib/schemas/site';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  return json({ sites: await listSites(getDb(), workspace.id) });
});

export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'site:create');
  const input = await readJson(ctx.request, SiteCreateSchema);
  const db = getDb();
  if (await findSiteByName(db, workspace.id, input.name)) {
    throw new ApiError(409, 'duplicate_name', `A site named "${input.name}" already exists in this workspace. Choose another name.`, { name: 'Already used by another site.' });
  }
  const site = await atomically(db, async (tx) => {
    const created = await createSite(tx, workspace.id, input);
    await recordEvent(tx, workspace.id, user.id, { action: 'site.created', subjectType: 'site', subjectId: created.id, detail: { name: created.name } });
    return created;
  });
  return json({ site }, 201);
});
