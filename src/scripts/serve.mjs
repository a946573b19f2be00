/**
 * Production launcher for the built app: `node src/scripts/serve.mjs` (npm start and the tests use it).
 *
 * It serves Astro's standalone handler from our own HTTP server for one reason: Astro takes the
 * client address (which sign-in rate limits key on) from X-Forwarded-For whenever a request
 * carries one, so any client could claim any address. Here that header is overwritten on every
 * request with the socket's address, or, when TRUST_PROXY_HEADER names the header our own
 * reverse proxy sets, with the last address that proxy appended. Plain JavaScript, no build step;
 * it reads only HOST, PORT, TRUST_PROXY_HEADER and VARLEDGER_DIST (the app's own settings are
 * read and validated by src/lib/config.ts inside the app).
 */
import { createServer } from 'node:http';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = fileURLToPath(new URL('../../', import.meta.url));
const dist = (process.env.VARLEDGER_DIST ?? 'dist').replace(/^\.\//, '').replace(/\/$/, '');
process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const { handler } = await import(pathToFileURL(`${root}${dist}/server/entry.mjs`).href);

const trusted = process.env.TRUST_PROXY_HEADER?.toLowerCase();
if (trusted && !['x-forwarded-for', 'x-real-ip'].includes(trusted)) {
  console.error(`Varledger cannot start: TRUST_PROXY_HEADER must be x-forwarded-for or x-real-ip, not "${trusted}"`);
  process.exit(1);
}

/** The address to believe: the trusted proxy's last entry, else the socket. */
function clientAddressOf(headers, socketAddress) {
  if (trusted) {
    const raw = headers[trusted];
    const last = (Array.isArray(raw) ? raw.join(',') : (raw ?? '')).split(',').map((s) => s.trim()).filter(Boolean).at(-1);
    if (last) return last;
  }
  return socketAddress ?? '';
}

const server = createServer((req, res) => {
  const address = clientAddressOf(req.headers, req.socket.remoteAddress);
  if (address) req.headers['x-forwarded-for'] = address;
  else delete req.headers['x-forwarded-for'];
  handler(req, res);
});
const port = Number(process.env.PORT ?? 4321);
const host = process.env.HOST ?? '127.0.0.1';
server.listen(port, host, () => console.log(`Varledger listening on http://${host}:${port}`));
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
