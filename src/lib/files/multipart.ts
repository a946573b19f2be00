/**
 * Reads a multipart/form-data request without buffering it: small text fields are kept,
 * the single file part is streamed to the file store. 413 before reading when the declared
 * length is over the limit, and as soon as the file passes it otherwise.
 */
import busboy from 'busboy';
import { Readable } from 'node:stream';
import { ApiError } from '../api/errors';
import { discardTemp, receiveToTemp, type Received } from './store';

export type MultipartUpload = { fields: Record<string, string>; file: (Received & { fileName: string; mimeType: string }) | null };

const MB = (n: number) => `${(n / 1024 / 1024).toFixed(n >= 1024 * 1024 ? 0 : 2)} MB`;

/** `textFields`: the text fields the endpoint reads; any other field (or a file in another field) is refused with 400 naming it. */
export async function readMultipart(request: Request, opts: { fileField: string; maxFileBytes: number; textFields?: readonly string[] }): Promise<MultipartUpload> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.startsWith('multipart/form-data')) throw new ApiError(415, 'unsupported_media_type', `Send the file as multipart/form-data with the file in the "${opts.fileField}" field.`);
  const declared = Number(request.headers.get('content-length') ?? 'NaN');
  const tooLarge = () => new ApiError(413, 'too_large', `The file is larger than the ${MB(opts.maxFileBytes)} limit. Split it into smaller date ranges, or ask your administrator to raise UPLOAD_MAX_BYTES.`);
  if (Number.isFinite(declared) && declared > opts.maxFileBytes + 64 * 1024) throw tooLarge();
  if (!request.body) throw new ApiError(400, 'invalid_input', `No file was sent in the "${opts.fileField}" field.`, { [opts.fileField]: 'Required.' });

  const bb = busboy({ headers: { 'content-type': type }, limits: { files: 1, fields: 20, fieldSize: 64 * 1024, fileSize: opts.maxFileBytes + 1 } });
  const fields: Record<string, string> = Object.create(null);
  const unknown: string[] = [];
  const state: { file: Promise<MultipartUpload['file']> | null } = { file: null };
  const done = new Promise<void>((resolve, reject) => {
    bb.on('field', (name, value) => {
      if ((opts.textFields ?? []).includes(name)) fields[name] = value;
      else unknown.push(name);
    });
    bb.on('file', (name, stream, info) => {
      if (name !== opts.fileField || state.file) {
        if (name !== opts.fileField) unknown.push(name);
        stream.resume();
        return;
      }
      state.file = receiveToTemp(stream, opts.maxFileBytes).then((r) => ({ ...r, fileName: info.filename ?? 'upload', mimeType: info.mimeType ?? 'application/octet-stream' }));
    });
    bb.on('error', reject);
    bb.on('close', resolve);
  });
  const body = Readable.fromWeb(request.body as import('node:stream/web').ReadableStream<Uint8Array>);
  body.on('error', (e) => bb.destroy(e));
  body.pipe(bb);
  try {
    await done;
  } catch (e) {
    const f = await state.file?.catch(() => null);
    if (f) await discardTemp(f);
    throw new ApiError(400, 'invalid_multipart', `The upload could not be read as multipart/form-data (${(e as Error).message}).`);
  }
  const file = state.file ? await state.file : null;
  if (file?.truncated) throw tooLarge();
  if (unknown.length) {
    if (file) await discardTemp(file);
    const named = Object.fromEntries(unknown.map((n) => [n, 'Unknown field: remove it.']));
    throw new ApiError(400, 'invalid_input', `${unknown[0]}: Unknown field: remove it.`, named);
  }
  return { fields, file };
}
