/**
 * The one place that reads process.env. Every setting has an embedded default so the app
 * starts with no configuration at all; a bad value stops start-up with a readable list.
 */
import { z } from 'zod';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

const port = (def: number) => z.coerce.number().int().min(0).max(65535).default(def);

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port(4321),
  APP_URL: z.url().optional().describe('Public URL of the app; defaults to http://HOST:PORT'),
  DATABASE_URL: z.string().min(1).default('file:./data/varledger.db'),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  DATA_DIR: z.string().min(1).default('./data'),
  AUTH_SECRET: z.string().min(32, 'AUTH_SECRET must be at least 32 characters').optional(),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port(1025),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  MAIL_FROM: z.string().min(3).default('Varledger <no-reply@varledger.local>'),
  MAIL_SINK: z.enum(['on', 'off']).default('on').describe('Start the local SMTP sink with `npm start` (turn off when SMTP_HOST is a real server)'),
  MAIL_SINK_WEB_PORT: port(1080),
  UPLOAD_MAX_BYTES: z.coerce.number().int().min(1024).default(100 * 1024 * 1024).describe('Largest meter-data upload, bytes'),
  BILL_DOCUMENT_MAX_BYTES: z.coerce.number().int().min(1024).default(10 * 1024 * 1024).describe('Largest bill document (PDF, PNG, JPEG), bytes'),
  SECURE_COOKIES: z.enum(['auto', 'true', 'false']).default('auto'),
  TRUST_PROXY_HEADER: z.enum(['x-forwarded-for', 'x-real-ip']).optional().describe('Behind a reverse proxy: the header it sets with the client address (sign-in rate limits key on it; read by src/scripts/serve.mjs); unset, the socket address is used and forwarded-for headers from clients are ignored'),
  STRIPE_SECRET_KEY: z.string().regex(/^sk_(test|live)_[A-Za-z0-9]+$/, 'STRIPE_SECRET_KEY must look like sk_test_... or sk_live_...').default('sk_test_varledgerLocalFake0000000000').describe('Secret API key of the payment provider (the default only works with the local fake)'),
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_[A-Za-z0-9]+$/, 'STRIPE_WEBHOOK_SECRET must look like whsec_...').default('whsec_varledgerLocalFake0000000000').describe('Signing secret of the webhook endpoint'),
  STRIPE_API_BASE: z.string().optional().describe('API base URL; defaults to the local fake when PAYMENT_FAKE=on, else https://api.stripe.com'),
  PAYMENT_FAKE: z.enum(['on', 'off']).default('on').describe('Start the local payment fake with `npm start`'),
  PAYMENT_FAKE_PORT: port(12111),
  SITE_AUDIT_PRICE: z.coerce.number().int().min(50).max(99_999_999).default(29_000).describe('Price of one Site audit in minor units (cents, pence)'),
  SITE_AUDIT_CURRENCY: z.string().regex(/^[A-Za-z]{3}$/, 'SITE_AUDIT_CURRENCY must be a three-letter ISO 4217 code').default('USD').transform((c) => c.toUpperCase()),
});

export type PaymentApi = { host: string; port: number; protocol: 'http' | 'https'; base: string; isFake: boolean };

export type AppConfig = z.infer<typeof EnvSchema> & { baseUrl: string; authSecret: string; secureCookies: boolean; mailboxUrl: string; paymentApi: PaymentApi };

let cached: AppConfig | undefined;

/** Reads, validates and caches the configuration; throws with every bad field listed. */
export function getConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  if (cached && env === process.env) return cached;
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Varledger cannot start: bad configuration\n${lines.join('\n')}`);
  }
  const v = parsed.data;
  const baseUrl = (v.APP_URL ?? `http://${v.HOST === '0.0.0.0' ? '127.0.0.1' : v.HOST}:${v.PORT}`).replace(/\/$/, '');
  const secureCookies = v.SECURE_COOKIES === 'auto' ? baseUrl.startsWith('https://') : v.SECURE_COOKIES === 'true';
  const mailboxUrl = `http://127.0.0.1:${v.MAIL_SINK_WEB_PORT}`;
  const paymentApi = paymentApiOf(v.STRIPE_API_BASE, v.PAYMENT_FAKE, v.PAYMENT_FAKE_PORT);
  if (typeof paymentApi === 'string') throw new Error(`Varledger cannot start: bad configuration\n  STRIPE_API_BASE: ${paymentApi}`);
  const config: AppConfig = { ...v, baseUrl, authSecret: v.AUTH_SECRET ?? localSecret(v.DATA_DIR), secureCookies, mailboxUrl, paymentApi };
  if (env === process.env) cached = config;
  return config;
}

/**
 * Where the payment SDK sends its calls. Unset: the local fake (PAYMENT_FAKE=on) or the real API.
 * Returns the problem as a string when the URL cannot be used.
 */
function paymentApiOf(base: string | undefined, fake: 'on' | 'off', fakePort: number): PaymentApi | string {
  const raw = base?.trim() || (fake === 'on' ? `http://127.0.0.1:${fakePort}` : 'https://api.stripe.com');
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    return `"${raw}" is not a URL`;
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return 'use an http:// or https:// URL';
  const protocol = url.protocol === 'https:' ? 'https' : 'http';
  const port = url.port ? Number(url.port) : protocol === 'https' ? 443 : 80;
  return { host: url.hostname, port, protocol, base: `${protocol}://${url.host}`, isFake: url.hostname !== 'api.stripe.com' };
}

/**
 * Without AUTH_SECRET a random secret is made once and kept in the data folder, so sessions
 * survive restarts on one machine. Several app instances must share AUTH_SECRET instead.
 */
function localSecret(dataDir: string): string {
  const file = `${dataDir}/auth-secret`;
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dirname(file), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

/** Every setting with its default, for the README and `--help`. */
export const CONFIG_DOC = EnvSchema.shape;
