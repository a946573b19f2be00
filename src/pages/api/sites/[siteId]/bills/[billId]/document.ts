import { z } from 'zod';
import { Readable } from 'node:stream';
import { endpoint, readParams } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { getConfig } from '@/lib/config';
import { getBill } from '@/lib/db/bills';
import { getStoredFile } from '@/lib/db/meter-imports';
import { attachDocument } from '@/lib/bills/service';
import { openStored } from '@/lib/files/store';

export const prerender = false;
const Params = z.object({ billId: z.string().min(1).max(64) });

/** The bill document, to members of its workspace only; `?download=1` saves instead of showing it. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { billId } = readParams(ctx.params, Params);
  const db = getDb();
  const b = await getBill(db, workspace.id, site.id, billId);
  const file = b?.documentFileId ? await getStoredFile(db, workspace.id, b.documentFileId) : undefined;
  if (!b || !file) throw notFound('Bill document');
  const disposition = ctx.url.searchParams.get('download') === '1' ? 'attachment' : 'inline';
  return new Response(Readable.toWeb(openStored(file.sha256)) as ReadableStream, {
    headers: {
      'content-type': file.contentType,
      'content-length': String(file.bytes),
      'content-disposition': `${disposition}; filename="${file.fileName.replace(/[^\x20-\x7e]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
      'cache-control': 'private, no-store',
      'content-security-policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; frame-ancestors 'self'",
      'x-frame-options': 'SAMEORIGIN',
    },
  });
});

/** Attaches the bill document (multipart `file`: PDF, PNG or JPEG, checked by content; 10 MB at most). */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'bill:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { billId } = readParams(ctx.params, Params);
  const db = getDb();
  const b = await getBill(db, workspace.id, site.id, billId);
  if (!b) throw notFound('Bill');
  const stored = await attachDocument({ db, organizationId: workspace.id, site, userId: user.id }, b, ctx.request, getConfig().BILL_DOCUMENT_MAX_BYTES);
  return json({ document: { fileName: stored.fileName, contentType: stored.contentType, bytes: stored.bytes } }, 201);
});
