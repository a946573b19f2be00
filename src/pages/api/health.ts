import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { getDb } from '@/lib/db/client';

export const prerender = false;

/** Liveness and database reachability, for load balancers and the test setup. */
export const GET = endpoint(async () => {
  await getDb().$client.execute('SELECT 1');
  return json({ ok: true });
});
