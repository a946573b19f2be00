import { endpoint, readJson, readParams } from '@/lib/api/handler';
import { ApiError, json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { deleteSite, findSiteByName, getSite, updateSite } from '@/lib/db/sites';
import { atomically, deleteRecorded, recordEvent } from '@/lib/db/audit-log';
import { SiteIdParams, SiteUpdateSchema } from '@/lib/schemas/site';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const { siteId } = readParams(ctx.params, SiteIdParams);
  const site = await getSite(getDb(), workspace.id, siteId);
  if (!site) throw notFound('Site');
  return json({ site });
});

export const PATCH = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'site:edit');
  const { siteId } = readParams(ctx.params, SiteIdParams);
  const db = getDb();
  const existing = await getSite(db, workspace.id, siteId);
  if (!existing) throw notFound('Site');
  const patch = await readJson(ctx.request, SiteUpdateSchema);
  if (patch.name && patch.name !== existing.name && (await findSiteByName(db, workspace.id, patch.name))) {
    throw new ApiError(409, 'duplicate_name', `A site named "${patch.name}" already exists in this workspace. Choose another name.`, { name: 'Already used by another site.' });
  }
  const site = await atomically(db, async (tx) => {
    const updated = await updateSite(tx, workspace.id, siteId, patch);
    if (updated) await recordEvent(tx, workspace.id, user.id, { action: 'site.updated', subjectType: 'site', subjectId: siteId, detail: { fields: Object.keys(patch) } });
    return updated;
  });
  if (!site) throw notFound('Site');
  return json({ site });
});

export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'site:delete');
  const { siteId } = readParams(ctx.params, SiteIdParams);
  const db = getDb();
  const existing = await getSite(db, workspace.id, siteId);
  if (!existing) throw notFound('Site');
  const deleted = await deleteRecorded(db, workspace.id, user.id, (tx) => deleteSite(tx, workspace.id, siteId), { action: 'site.deleted', subjectType: 'site', subjectId: siteId, detail: { name: existing.name } });
  if (!deleted) throw notFound('Site');
  return new Response(null, { status: 204 });
});
