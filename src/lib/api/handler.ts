/**
 * Wraps an endpoint so every failure becomes our JSON error shape: ApiError as is,
 * zod errors as 400 naming the field, anything else as a logged 500 without internals.
 */
import type { APIContext, APIRoute } from 'astro';
import { z } from 'zod';
import { ApiError, errorResponse, fromZod, json } from './errors';

export function endpoint(fn: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
  return async (ctx) => {
    try {
      return await fn(ctx);
    } catch (err) {
      if (err instanceof ApiError) return errorResponse(err);
      if (err instanceof z.ZodError) return errorResponse(fromZod(err));
      console.error(`[api] ${ctx.request.method} ${new URL(ctx.request.url).pathname} failed`, err);
      return json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again; if it keeps failing, tell us the time it happened.' } }, 500);
    }
  };
}

const MAX_JSON_BYTES = 256 * 1024;

/** Reads and validates a JSON body: 415 if not JSON, 413 if too large, 400 if malformed or invalid. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S, maxBytes = MAX_JSON_BYTES): Promise<z.infer<S>> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.includes('application/json')) throw new ApiError(415, 'unsupported_media_type', 'Send the body as JSON (Content-Type: application/json).');
  const declared = Number(request.headers.get('content-length') ?? '0');
  const tooLarge = () => new ApiError(413, 'too_large', `The body is larger than ${maxBytes / 1024} KB.`);
  if (declared > maxBytes) throw tooLarge();
  const text = await request.text();
  if (text.length > maxBytes) throw tooLarge();
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new ApiError(400, 'invalid_json', 'The body is not valid JSON.');
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw fromZod(parsed.error);
  return parsed.data;
}

/** Validates path or query parameters with a schema; 400 names the parameter. */
export function readParams<S extends z.ZodType>(values: unknown, schema: S): z.infer<S> {
  const parsed = schema.safeParse(values);
  if (!parsed.success) throw fromZod(parsed.error, 'params');
  return parsed.data;
}
