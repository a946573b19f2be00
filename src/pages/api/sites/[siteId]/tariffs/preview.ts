import { endpoint, readJson, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { TariffVersionSchema } from '@/lib/schemas/tariff';
import { previewTariff } from '@/lib/tariff-editor/preview';
import { PreviewQuerySchema } from '@/lib/tariff-editor/preview-schema';

export const prerender = false;

/** The posted tariff version's PF charges over the last twelve months of meter data. Writes nothing. */
export const POST = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const q = readParams(Object.fromEntries(ctx.url.searchParams), PreviewQuerySchema);
  const draft = await readJson(ctx.request, TariffVersionSchema);
  return json({ preview: await previewTariff(getDb(), workspace.id, site, draft, q.compareTo) });
});
