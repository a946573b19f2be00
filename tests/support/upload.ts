/** Multipart uploads through the real server, as the browser sends them. */
import type { Client } from './http';

export async function uploadFile(c: Client, path: string, file: { name: string; content: string | Uint8Array<ArrayBuffer> | Buffer<ArrayBuffer>; type?: string }, fields: Record<string, string> = {}) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append('file', new Blob([file.content], { type: file.type ?? 'text/csv' }), file.name);
  return c.request('POST', path, form as unknown as string);
}
