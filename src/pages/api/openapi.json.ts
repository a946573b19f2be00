import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { buildOpenApi } from '@/lib/api/openapi';
import { getConfig } from '@/lib/config';

export const prerender = false;

let cached: unknown;

export const GET = endpoint(() => json((cached ??= buildOpenApi(getConfig().baseUrl))));
