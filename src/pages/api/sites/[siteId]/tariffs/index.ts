import { endpoint, readJson } from '@/lib/api/handler';
import { ApiError, json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { createTariff, findTariffFrom, listTariffs } from '@/lib/db/tariffs';
import { atomically, recordEvent } from '@/lib/db/audit-log';
import { TariffVersionSchema } from '@/lib/schemas/tariff';
import { refuseUnfitDemandWindow } from '@/lib/tariff-editor/data-fit';

export const prerender = false;

/** The site's tariff versions, oldest first. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  return json({ tariffs: await listTariffs(getDb(), workspace.id, site.id) });
});

/** Adds a tariff version in force from `effectiveFrom`. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'tariff:edit');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const t = await readJson(ctx.request, TariffVersionSchema);
  const db = getDb();
  await refuseUnfitDemandWindow(db, workspace.id, site.id, t);
  if (await findTariffFrom(db, workspace.id, site.id, t.effectiveFrom)) {
    throw new ApiError(409, 'duplicate_version', `A tariff version already starts on ${t.effectiveFrom}. Edit that version or choose another date.`, { effectiveFrom: 'Already used by another version.' });
  }
  const created = await atomically(db, async (tx) => {
    const row = await createTariff(tx, workspace.id, site.id, t, user.id);
    await recordEvent(tx, workspace.id, user.id, { action: 'tariff.created', subjectType: 'tariff', subjectId: row.id, detail: { siteId: site.id, name: t.name, effectiveFrom: t.effectiveFrom, rules: t.rules.length } });
    return row;
  });
  return json({ tariff: created }, 201);
});
