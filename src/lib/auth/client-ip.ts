/**
 * The client address better-auth's rate limiter keys on. The launcher (src/scripts/serve.mjs)
 * makes Astro's client address trustworthy (the socket's, or a trusted proxy's); the app then
 * hands it to better-auth in a header of its own, overwriting whatever the client sent.
 */
export const CLIENT_IP_HEADER = 'x-varledger-client-ip';

/** A copy of the request carrying the client address for better-auth. */
export async function withClientIp(request: Request, clientAddress: string | undefined): Promise<Request> {
  const headers = new Headers(request.headers);
  headers.set(CLIENT_IP_HEADER, clientAddress || 'unknown');
  const hasBody = request.method !== 'GET' && request.method !== 'HEAD';
  return new Request(request.url, { method: request.method, headers, body: hasBody ? await request.arrayBuffer() : undefined, redirect: 'manual' });
}
