import { z } from 'zod';
import { endpoint, readJson, readParams } from '@/lib/api/handler';
import { ApiError, json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { deleteTariff, findTariffFrom, getTariff, updateTariff } from '@/lib/db/tariffs';
import { atomically, deleteRecorded, recordEvent } from '@/lib/db/audit-log';
import { TariffVersionSchema } from '@/lib/schemas/tariff';
import { refuseUnfitDemandWindow } from '@/lib/tariff-editor/data-fit';

export const prerender = false;
const Params = z.object({ tariffId: z.string().min(1).max(64) });

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { tariffId } = readParams(ctx.params, Params);
  const t = await getTariff(getDb(), workspace.id, site.id, tariffId);
  if (!t) throw notFound('Tariff');
  return json({ tariff: t });
});

/** Replaces a tariff version's rules, name or start date. */
export const PUT = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'tariff:edit');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { tariffId } = readParams(ctx.params, Params);
  const db = getDb();
  const existing = await getTariff(db, workspace.id, site.id, tariffId);
  if (!existing) throw notFound('Tariff');
  const t = await readJson(ctx.request, TariffVersionSchema);
  await refuseUnfitDemandWindow(db, workspace.id, site.id, t);
  const clash = await findTariffFrom(db, workspace.id, site.id, t.effectiveFrom);
  if (clash && clash.id !== tariffId) throw new ApiError(409, 'duplicate_version', `Another tariff version already starts on ${t.effectiveFrom}.`, { effectiveFrom: 'Already used by another version.' });
  const updated = await atomically(db, async (tx) => {
    const row = await updateTariff(tx, workspace.id, site.id, tariffId, t);
    await recordEvent(tx, workspace.id, user.id, { action: 'tariff.updated', subjectType: 'tariff', subjectId: tariffId, detail: { siteId: site.id, before: existing.definition, after: t } });
    return row;
  });
  return json({ tariff: updated });
});

export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'tariff:edit');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { tariffId } = readParams(ctx.params, Params);
  const db = getDb();
  const existing = await getTariff(db, workspace.id, site.id, tariffId);
  if (!existing) throw notFound('Tariff');
  const deleted = await deleteRecorded(db, workspace.id, user.id, (tx) => deleteTariff(tx, workspace.id, site.id, tariffId), { action: 'tariff.deleted', subjectType: 'tariff', subjectId: tariffId, detail: { siteId: site.id, name: existing.name, effectiveFrom: existing.effectiveFrom } });
  if (!deleted) throw notFound('Tariff');
  return new Response(null, { status: 204 });
});
