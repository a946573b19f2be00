import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { PreviewRequestSchema, previewMeterFile } from '@/lib/meter-data/preview';

export const prerender = false;

/** The mapping step: proposes a mapping from the head of a file and shows the first rows as parsed. Writes nothing. */
export const POST = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'meter:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  // The head of the file travels as a JSON string: allow for its escaping on top of 256 KB.
  const req = await readJson(ctx.request, PreviewRequestSchema, 1024 * 1024);
  return json(await previewMeterFile(req, site.timeZone));
});
