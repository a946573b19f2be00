/**
 * The HTTP side of a meter-data upload: read the multipart body to the file store, check
 * the mapping and the bytes, refuse a file already imported, then run the import.
 */
import { z } from 'zod';
import { randomBytes } from 'node:crypto';
import type { Db } from '../db/client';
import { ApiError, fromZod } from '../api/errors';
import { readMultipart } from '../files/multipart';
import { commitToStore, discardTemp } from '../files/store';
import { MeterMappingSchema } from '../import/mapping-schema';
import { addStoredFile, findStoredFile, importedFromFile } from '../db/meter-imports';
import { runImport } from './import-file';
import type { SiteDto } from '../schemas/site';
import { sanitizeFileName } from '../files/names';

export const ImportIdSchema = z.string().regex(/^imp_[A-Za-z0-9_-]{8,40}$/, 'An import id looks like imp_ followed by 8 to 40 letters, digits, - or _.');
export const newImportId = () => `imp_${randomBytes(12).toString('base64url')}`;

export async function receiveMeterUpload(db: Db, request: Request, ctx: { site: SiteDto; organizationId: string; userId: string; maxBytes: number; importId?: string }) {
  const upload = await readMultipart(request, { fileField: 'file', maxFileBytes: ctx.maxBytes, textFields: ['mapping', 'replace'] });
  const file = upload.file;
  try {
    if (!file) throw new ApiError(400, 'invalid_input', 'Attach the meter export in the "file" field.', { file: 'Required.' });
    let mappingJson: unknown;
    try {
      mappingJson = JSON.parse(upload.fields.mapping ?? '');
    } catch {
      throw new ApiError(400, 'invalid_input', 'Send the confirmed column mapping as JSON in the "mapping" field.', { mapping: 'Missing or not JSON.' });
    }
    const mapping = MeterMappingSchema.safeParse(mappingJson);
    if (!mapping.success) {
      const e = fromZod(mapping.error);
      const fields = Object.fromEntries(Object.entries(e.fields ?? {}).map(([k, v]) => [`mapping.${k}`, v]));
      throw new ApiError(400, 'invalid_input', `mapping.${e.message}`, fields);
    }
    const importId = ctx.importId ?? newImportId();
    if (upload.fields.replace !== undefined && upload.fields.replace !== 'true' && upload.fields.replace !== 'false') throw new ApiError(400, 'invalid_input', 'replace: Send true or false.', { replace: 'Send true or false.' });
    const replace = upload.fields.replace === 'true';
    const fileName = sanitizeFileName(file.fileName);
    let stored = await findStoredFile(db, ctx.organizationId, ctx.site.id, 'meter-data', file.sha256);
    if (stored && !replace) {
      const earlier = await importedFromFile(db, ctx.organizationId, stored.id);
      if (earlier) {
        await discardTemp(file);
        throw new ApiError(409, 'already_imported', `This file was already imported on ${earlier.createdAt.toISOString().slice(0, 10)} (${earlier.intervals.toLocaleString('en-US')} intervals). Nothing was added. To import it again with another mapping, upload it with "replace".`, undefined, { importId: earlier.id });
      }
    }
    await commitToStore(file);
    stored ??= await addStoredFile(db, { organizationId: ctx.organizationId, siteId: ctx.site.id, kind: 'meter-data', sha256: file.sha256, fileName, contentType: 'text/csv', bytes: file.bytes, createdBy: ctx.userId });
    return await runImport(db, { importId, site: ctx.site, organizationId: ctx.organizationId, userId: ctx.userId, fileId: stored.id, sha256: file.sha256, bytes: file.bytes, mapping: mapping.data, replace });
  } finally {
    if (file) await discardTemp(file).catch(() => undefined);
  }
}
