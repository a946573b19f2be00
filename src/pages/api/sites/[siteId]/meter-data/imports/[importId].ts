import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { getImport, getStoredFile } from '@/lib/db/meter-imports';
import { importDto } from '@/lib/meter-data/dto';

export const prerender = false;

/** One import with its progress, data-quality report and problems (poll it while an upload runs). */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { importId } = readParams(ctx.params, z.object({ importId: z.string().min(1).max(64) }));
  const db = getDb();
  const row = await getImport(db, workspace.id, site.id, importId);
  if (!row) throw notFound('Import');
  const file = await getStoredFile(db, workspace.id, row.fileId);
  return json({ import: importDto(row, file, true) });
});
