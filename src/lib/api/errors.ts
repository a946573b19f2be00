/**
 * One JSON error shape for every endpoint: `{ error: { code, message, fields? } }`.
 * `fields` maps a field path (or CSV row) to what is wrong with it.
 */
import { z } from 'zod';

export type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string>; [k: string]: unknown } };

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** Further members of `error`, e.g. `problems` of a rejected file or the `overlap` found. */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const unauthorized = () => new ApiError(401, 'unauthorized', 'Sign in to continue.');
export const forbidden = (what: string) => new ApiError(403, 'forbidden', `Your role in this workspace does not allow you to ${what}.`);
export const notFound = (what: string) => new ApiError(404, 'not_found', `${what} was not found in this workspace.`);

/** Turns zod issues into `{ "path.to.field": "message" }` and one readable sentence. */
export function fromZod(error: z.ZodError, where = 'body'): ApiError {
  // A null-prototype map: a field named like an Object member (constructor, __proto__) is still named.
  const fields: Record<string, string> = Object.create(null);
  for (const issue of error.issues) {
    const keys = issue.code === 'unrecognized_keys' ? issue.keys.map((k) => [...issue.path, k].join('.')) : [issue.path.join('.') || where];
    for (const key of keys) if (!Object.hasOwn(fields, key)) fields[key] = issue.code === 'unrecognized_keys' ? 'Unknown field: remove it.' : issue.message;
  }
  const first = Object.entries(fields)[0];
  const message = first ? `${first[0]}: ${first[1]}` : 'The request is not valid.';
  return new ApiError(400, 'invalid_input', message, fields);
}

export function json(data: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(data), { status, headers: { 'content-type': 'application/json; charset=utf-8', ...headers } });
}

export function errorResponse(err: ApiError): Response {
  const body: ErrorBody = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}), ...(err.extra ?? {}) } };
  return json(body, err.status);
}

/** Schema of the error body, for the OpenAPI document. */
export const ErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional().meta({ description: 'What is wrong with each field, by path' }),
    problems: z.array(z.object({ row: z.number().nullable(), column: z.string().nullable(), value: z.string().nullable(), message: z.string(), code: z.string() })).optional().meta({ description: 'File problems (first 100), rows 1-based' }),
    totalProblems: z.number().optional(),
  }),
});
