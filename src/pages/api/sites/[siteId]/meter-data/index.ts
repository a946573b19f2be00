import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getConfig } from '@/lib/config';
import { getDb } from '@/lib/db/client';
import { listMeters } from '@/lib/db/intervals';
import { listImports } from '@/lib/db/meter-imports';
import { importDto, meterDto } from '@/lib/meter-data/dto';
import { ImportIdSchema, receiveMeterUpload } from '@/lib/meter-data/receive';
import { z } from 'zod';

export const prerender = false;

/** The site's meters (with their saved import profiles) and its import history. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const db = getDb();
  const [meters, imports] = await Promise.all([listMeters(db, workspace.id, site.id), listImports(db, workspace.id, site.id)]);
  return json({ meters: meters.map(meterDto), imports: imports.map((r) => importDto(r.imp, r)) });
});

/** Uploads a meter export (multipart: `file`, `mapping` JSON, optional `replace`=true) and imports it, all or nothing. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'meter:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { importId } = readParams(Object.fromEntries(ctx.url.searchParams), z.strictObject({ importId: ImportIdSchema.optional() }));
  const db = getDb();
  const row = await receiveMeterUpload(db, ctx.request, { site, organizationId: workspace.id, userId: user.id, maxBytes: getConfig().UPLOAD_MAX_BYTES, importId });
  return json({ import: importDto(row, undefined, true) }, 201);
});
