/**
 * Wraps an endpoint so every failure becomes our JSON error shape: ApiError as is,
 * zod errors as 400 naming the field, a database still locked after its retries as 503
 * `busy` with Retry-After, anything else as a logged 500 without internals.
 */
import type { APIContext, APIRoute } from 'astro';
import { z } from 'zod';
import { ApiError, errorResponse, fromZod, json } from './errors';
import { BUSY_RETRY_AFTER_SECONDS, isBusyError } from '../db/busy';

/** The answer when the database stayed locked by another writer past the retry window. */
export function busyResponse(): Response {
  return json({ error: { code: 'busy', message: 'The database is busy with another change right now, so nothing was saved. Please try again in a few seconds.' } }, 503, { 'retry-after': String(BUSY_RETRY_AFTER_SECONDS) });
}

export function endpoint(fn: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
  return async (ctx) => {
    try {
      return await fn(ctx);
    } catch (err) {
      if (err instanceof ApiError) {
        const res = errorResponse(err);
        // 502/503 from a dependency (payment service, database) tell the client when to retry.
        if (err.status === 502 || err.status === 503) res.headers.set('retry-after', String(err.extra?.retryAfterSeconds ?? BUSY_RETRY_AFTER_SECONDS));
        return res;
      }
      if (err instanceof z.ZodError) return errorResponse(fromZod(err));
      if (isBusyError(err)) {
        console.warn(`[api] ${ctx.request.method} ${new URL(ctx.request.url).pathname}: database busy, answered 503`);
        return busyResponse();
      }
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
