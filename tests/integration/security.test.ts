/**
 * Security through the real server: production-mode cookies and sign-in rate limiting (a server
 * of its own, NODE_ENV=production behind an https public URL), origin checks, security headers
 * and the content security policy, file names and upload types, and secrets kept out of what the
 * browser receives. Expected values are the product's own settings, named beside each check,
 * and the cookie and header rules of RFC 6265bis (__Secure- prefix) and the CSP Level 3 spec.
 */
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import { readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { join } from 'node:path';
import { ENTRY, startAppServer, type AppServer } from '../../src/scripts/lib/app-server';
import { freePort, freshDemoDatabase } from '../../src/scripts/lib/fresh-database';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { TEST_PAYMENT_KEYS } from '../support/payment-keys';

const PUBLIC_URL = 'https://varledger.test';

/** One HTTP request from a chosen loopback source address (rate limits key on the client address). */
function call(base: string, method: string, path: string, opts: { body?: unknown; from?: string; headers?: Record<string, string> } = {}) {
  const url = new URL(path, base);
  const payload = opts.body === undefined ? undefined : JSON.stringify(opts.body);
  return new Promise<{ status: number; headers: Record<string, string | string[] | undefined>; text: string }>((resolve, reject) => {
    const req = httpRequest(
      { host: url.hostname, port: url.port, path: url.pathname + url.search, method, localAddress: opts.from ?? '127.0.0.1', headers: { origin: PUBLIC_URL, ...(payload ? { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload) } : {}), ...opts.headers } },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (d) => (text += d));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
      },
    );
    req.on('error', reject);
    if (payload) req.write(payload);
    req.end();
  });
}

describe('production mode (NODE_ENV=production, public URL https://varledger.test)', () => {
  let server: AppServer;
  let dir: string;

  beforeAll(async () => {
    const fresh = await freshDemoDatabase('varledger-prod', 'prod');
    dir = fresh.dataDir;
    const databaseUrl = fresh.databaseUrl;
    const port = await freePort();
    server = await startAppServer(
      { NODE_ENV: 'production', TEST: 'false', VITEST: '', HOST: '127.0.0.1', PORT: String(port), APP_URL: PUBLIC_URL, DATABASE_URL: databaseUrl, DATA_DIR: dir, AUTH_SECRET: 'a-production-like-secret-of-48-characters-000000', SMTP_PORT: String(await freePort()), STRIPE_SECRET_KEY: TEST_PAYMENT_KEYS.secretKey, STRIPE_WEBHOOK_SECRET: TEST_PAYMENT_KEYS.webhookSecret, STRIPE_API_BASE: 'http://127.0.0.1:9' },
      { quiet: true },
    );
  }, 60_000);
  afterAll(async () => {
    await server?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('sets the session cookie Secure, HttpOnly, SameSite=Lax with the __Secure- prefix (RFC 6265bis 4.1.3.1)', async () => {
    const r = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.owner, password: DEMO.password }, from: '127.0.0.5' });
    expect(r.status).toBe(200);
    const cookies = ([] as string[]).concat(r.headers['set-cookie'] ?? []);
    const session = cookies.find((c) => c.startsWith('__Secure-varledger.session_token='));
    expect(session, cookies.join('\n')).toBeTruthy();
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
    // The cookie signs the person in, and HSTS is sent once the public URL is https.
    const me = await call(server.url, 'GET', '/api/me', { headers: { cookie: session!.split(';')[0]! } });
    expect(me.status).toBe(200);
    expect(JSON.parse(me.text).user.email).toBe(DEMO.owner);
    expect(me.headers['strict-transport-security']).toMatch(/max-age=\d{7,}/);
  });

  it('limits sign-in to 10 attempts a minute per client address, with Retry-After, and the limit cannot be dodged with a forged header', async () => {
    // The product's setting: /sign-in/email, window 60 s, max 10 (src/lib/auth/auth.ts).
    const from = '127.0.0.2';
    const statuses: number[] = [];
    for (let i = 0; i < 10; i++) statuses.push((await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.energy, password: `wrong-password-${i}` }, from })).status);
    expect(statuses).toEqual(Array(10).fill(401));
    const limited = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.energy, password: DEMO.password }, from });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['x-retry-after'] ?? limited.headers['retry-after'])).toBeGreaterThan(0);
    // A client claiming another address in headers is still the same socket address.
    const forged = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.energy, password: DEMO.password }, from, headers: { 'x-forwarded-for': '203.0.113.9', 'x-varledger-client-ip': '203.0.113.10', 'x-real-ip': '203.0.113.11' } });
    expect(forged.status).toBe(429);
    // Someone else (another address) signs in meanwhile: one person's lock-out is not everyone's.
    const other = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.energy, password: DEMO.password }, from: '127.0.0.3' });
    expect(other.status).toBe(200);
  });

  it('refuses a state-changing call from another origin, and the sign-in from one (CSRF)', async () => {
    const signIn = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.owner, password: DEMO.password }, from: '127.0.0.4', headers: { origin: 'https://evil.example' } });
    expect(signIn.status).toBe(403);
    const ok = await call(server.url, 'POST', '/api/auth/sign-in/email', { body: { email: DEMO.owner, password: DEMO.password }, from: '127.0.0.4' });
    const cookie = ([] as string[]).concat(ok.headers['set-cookie'] ?? []).find((c) => c.startsWith('__Secure-varledger.session_token='))!.split(';')[0]!;
    const post = await call(server.url, 'POST', '/api/sites', { body: { name: 'Cross-site site', timeZone: 'UTC' }, headers: { origin: 'https://evil.example', cookie } });
    expect(post.status).toBe(403);
    expect(JSON.parse(post.text).error.code).toBe('bad_origin');
  });
});

describe('origin checks (test server)', () => {
  it('a cookie-bearing write without Origin or from another origin is refused; a cookie-less script reaches the auth check', async () => {
    const owner = await as(DEMO.owner);
    const base = inject('baseUrl');
    for (const method of ['POST', 'PATCH', 'PUT', 'DELETE']) {
      const evil = await owner.request(method, '/api/sites', { name: 'x', timeZone: 'UTC' }, { origin: 'https://evil.example' });
      expect(evil.status, method).toBe(403);
      expect(evil.json.error.code).toBe('bad_origin');
    }
    // A cookie but no Origin (old browsers, some form posts): refused as well.
    const noOrigin = await fetch(`${base}/api/sites`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: 'varledger.session_token=anything' }, body: '{}' });
    expect(noOrigin.status).toBe(403);
    // No cookie and no Origin: not a browser riding a session, so it gets the normal 401.
    const script = await fetch(`${base}/api/sites`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' });
    expect(script.status).toBe(401);
  });
});

describe('security headers and content security policy', () => {
  const directives = (csp: string) => Object.fromEntries(csp.split(';').map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k, v]));

  it('pages and API answers carry the headers; the policy allows only our own origin, no framing, no plugins', async () => {
    const owner = await as(DEMO.owner);
    for (const path of ['/', '/sign-in', '/api/me', '/api/health', '/no-such-page']) {
      const r = await owner.request('GET', path);
      const h = r.res.headers;
      expect(h.get('x-content-type-options'), path).toBe('nosniff');
      expect(h.get('x-frame-options'), path).toBe('DENY');
      expect(h.get('referrer-policy'), path).toBe('same-origin');
      const csp = directives(h.get('content-security-policy') ?? '');
      expect(csp['default-src'], path).toEqual(["'self'"]);
      expect(csp['frame-ancestors'], path).toEqual(["'none'"]);
      expect(csp['object-src'], path).toEqual(["'none'"]);
      expect(csp['base-uri'], path).toEqual(["'self'"]);
      expect(csp['form-action'], path).toEqual(["'self'"]);
      expect(csp['connect-src'], path).toEqual(["'self'"]);
      // No remote script or font source anywhere in the policy.
      expect(JSON.stringify(csp), path).not.toMatch(/https?:/);
      if (path.startsWith('/api/')) expect(h.get('cache-control'), path).toBe('no-store');
    }
  });
});

describe('file names and upload types', () => {
  it('a bill document name is stripped of paths, controls and quotes; Content-Disposition cannot be split', async () => {
    const energy = await as(DEMO.energy);
    const siteId = (await energy.post('/api/sites', { name: 'Security names site', timeZone: 'UTC' })).json.site.id;
    const billId = (await energy.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-03-01', periodEnd: '2026-03-31', kwh: 10 })).json.bill.id;
    const pdf = new TextEncoder().encode('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
    const up = await uploadFile(energy, `/api/sites/${siteId}/bills/${billId}/document`, { name: '..\\..\\windows\\"march"\r\nX-Injected: 1\t<bill>.pdf', content: pdf, type: 'application/pdf' });
    expect(up.status, JSON.stringify(up.json)).toBe(201);
    expect(up.json.document.fileName).not.toMatch(/[\\/"\r\n\t<>]/);
    expect(up.json.document.fileName).toMatch(/march.*bill\.pdf$/);
    const got = await energy.request('GET', `/api/sites/${siteId}/bills/${billId}/document?download=1`);
    expect(got.status).toBe(200);
    expect(got.res.headers.get('x-injected')).toBeNull();
    expect(got.res.headers.get('content-disposition')).toMatch(/^attachment; filename="[^"\r\n]+"; filename\*=UTF-8''/);
    expect(got.res.headers.get('x-content-type-options')).toBe('nosniff');
  });

  it('a document is judged by its bytes: an executable or HTML named .pdf is refused with 415 and not stored', async () => {
    const energy = await as(DEMO.energy);
    const siteId = (await energy.post('/api/sites', { name: 'Security types site', timeZone: 'UTC' })).json.site.id;
    const billId = (await energy.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-03-01', periodEnd: '2026-03-31', kwh: 10 })).json.bill.id;
    for (const content of ['MZ\x90\x00 an executable header', '<html><script>alert(1)</script></html>', '%PD not quite']) {
      const r = await uploadFile(energy, `/api/sites/${siteId}/bills/${billId}/document`, { name: 'bill.pdf', content, type: 'application/pdf' });
      expect(r.status, content).toBe(415);
      expect(r.json.error.code).toEqual(expect.any(String));
    }
    expect((await energy.get(`/api/sites/${siteId}/bills/${billId}/document`)).status).toBe(404);
  });

  it('a meter upload that is not text (a PNG) is refused before anything is stored', async () => {
    const energy = await as(DEMO.energy);
    const siteId = (await energy.post('/api/sites', { name: 'Security meter type site', timeZone: 'UTC' })).json.site.id;
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1]);
    const r = await uploadFile(energy, `/api/sites/${siteId}/meter-data`, { name: 'meter.csv', content: png, type: 'text/csv' }, { mapping: '{}' });
    expect(r.status).toBeGreaterThanOrEqual(400);
    expect(r.status).toBeLessThan(500);
    const after = (await energy.get(`/api/sites/${siteId}/meter-data`)).json;
    expect(after.meters).toEqual([]);
  });
});

describe('secrets never reach the browser', () => {
  /** Every file the browser can be sent: the built client folder. */
  function clientFiles(dir: string): string[] {
    return readdirSync(dir).flatMap((f) => {
      const p = join(dir, f);
      return statSync(p).isDirectory() ? clientFiles(p) : [p];
    });
  }

  it('the client bundle holds no key, signing secret, database URL or server-only module', () => {
    const clientDir = ENTRY.replace(/server\/entry\.mjs$/, 'client');
    const files = clientFiles(clientDir).filter((f) => /\.(m?js|css|html|json|map)$/.test(f));
    expect(files.length).toBeGreaterThan(10);
    const patterns: [string, RegExp][] = [
      ['payment secret key', /sk_(test|live)_[A-Za-z0-9]{8,}/],
      ['webhook signing secret', /whsec_[A-Za-z0-9]{8,}/],
      ['auth secret setting', /AUTH_SECRET|authSecret/],
      ['database URL', /DATABASE_URL|file:\.\/data\/|libsql:\/\//],
      ['SMTP password setting', /SMTP_PASSWORD/],
      ['server environment', /process\.env\.[A-Z_]{4,}/],
      ['server-only module', /drizzle-orm\/libsql|@libsql\/client|nodemailer|better-sqlite/],
    ];
    const found: string[] = [];
    for (const f of files) {
      const text = readFileSync(f, 'utf8');
      for (const [what, re] of patterns) if (re.test(text)) found.push(`${what} in ${f.slice(clientDir.length)}`);
    }
    expect(found).toEqual([]);
  });

  it('pages rendered for a signed-in Owner carry none of the running server’s secrets', async () => {
    const owner = await as(DEMO.owner);
    const secrets = [TEST_PAYMENT_KEYS.secretKey, TEST_PAYMENT_KEYS.webhookSecret, inject('databaseUrl'), inject('dataDir')];
    const siteId = (await owner.get('/api/sites')).json.sites[0].id;
    for (const path of ['/', '/members', '/purchases', '/payback', '/activity', `/sites/${siteId}`, `/sites/${siteId}/bills`, `/sites/${siteId}/correction`, '/api/me', '/api/openapi.json']) {
      const r = await owner.request('GET', path);
      expect(r.status, path).toBe(200);
      const text = typeof r.json === 'string' ? r.json : JSON.stringify(r.json);
      for (const s of secrets) expect(text.includes(s), `${path} contains ${s.slice(0, 8)}…`).toBe(false);
    }
  });
});

describe('sign-in answers', () => {
  it('an unknown address and a wrong password get the same answer (no account discovery)', async () => {
    const unknown = await new Client().post('/api/auth/sign-in/email', { email: 'nobody-here@test.example', password: 'some-password-1' });
    const wrong = await new Client().post('/api/auth/sign-in/email', { email: DEMO.owner, password: 'some-password-1' });
    expect(unknown.status).toBe(wrong.status);
    expect(unknown.json).toEqual(wrong.json);
  });
});
