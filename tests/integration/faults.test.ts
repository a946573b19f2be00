/**
 * Faults the app must survive, each on a private built server with its own SQLite file:
 * a server killed mid-import, two imports racing for one meter, another writer holding
 * SQLite's lock, the SMTP server down, the payment service down or a webhook failing.
 * Real parts only: the built server over HTTP, the SQLite file read directly, maildev
 * over SMTP and its REST API, the payment fake over HTTP.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import type { Client as SqlClient } from '@libsql/client';
import { DEMO, type Client } from '../support/http';
import { uploadFile } from '../support/upload';
import { constantLoadMapping } from '../support/constant-load';
import { freePort } from '../support/global-setup';
import { holdWriteLock, sleep, startRig, waitFor, type Rig } from '../support/fault-rig';
import { payOnHostedPage } from '../support/payments';
import { TEST_PAYMENT_KEYS } from '../support/payment-keys';
import { startMailSink, type MailSink } from '../../src/scripts/lib/mail-sink';
import { startPaymentFake, type PaymentFake } from '../../src/scripts/lib/payment-fake';
import { BUSY_WINDOW_MS } from '../../src/lib/db/busy';

let survived = 0;
/** Called as the last line of a test, after its assertions: counts the fault cases that held. */
const held = () => void survived++;
afterAll(() => console.log(`faults: ${survived} cases survived`));

/** An invented constant load: `count` intervals of `minutes` from `fromIso`, ISO UTC stamps. */
function loadCsv(fromIso: string, count: number, minutes: number, kwh: number, kvarh: number): string {
  const t0 = Date.parse(fromIso);
  const lines = ['Start,kWh,kvarh lag,kvarh lead'];
  for (let i = 0; i < count; i++) lines.push(`${new Date(t0 + i * minutes * 60_000).toISOString()},${kwh},${kvarh},0`);
  return lines.join('\n') + '\n';
}
const mapping = JSON.stringify(constantLoadMapping);

const f64 = (v: unknown): Float64Array => {
  const u8 = v instanceof ArrayBuffer ? new Uint8Array(v) : new Uint8Array((v as Uint8Array).buffer, (v as Uint8Array).byteOffset, (v as Uint8Array).byteLength);
  const out = new Float64Array(u8.byteLength / 8);
  new Uint8Array(out.buffer).set(u8);
  return out;
};

/** Every stored interval of a site, read straight from interval_block (little-endian Float64 blobs). */
async function storedIntervals(sql: SqlClient, siteId: string) {
  const rs = await sql.execute({ sql: 'SELECT b.day, b.count, b.start_ms, b.kwh, b.import_id FROM interval_block b JOIN meter m ON m.id = b.meter_id WHERE m.site_id = ? ORDER BY b.day', args: [siteId] });
  const out: { t: number; kwh: number; importId: string }[] = [];
  for (const r of rs.rows) {
    const t = f64(r.start_ms);
    const k = f64(r.kwh);
    for (let i = 0; i < Number(r.count); i++) out.push({ t: t[i]!, kwh: k[i]!, importId: String(r.import_id) });
  }
  return { blocks: rs.rows.length, intervals: out };
}

/** No stack frame or server path in what the browser got. */
const noStack = (html: string) => !/\bat [^\s()]+ \([^)]*:\d+:\d+\)/.test(html) && !html.includes('node_modules') && !html.includes('entry.mjs');

async function newSite(c: Client, name: string): Promise<string> {
  const r = await c.post('/api/sites', { name, timeZone: 'UTC' });
  if (r.status !== 201) throw new Error(`site creation failed: ${r.status} ${JSON.stringify(r.json)}`);
  return r.json.site.id;
}

describe('a server killed in the middle of a large import', () => {
  let rig: Rig;
  beforeAll(async () => {
    rig = await startRig({ smtpPort: await freePort() });
  });
  afterAll(async () => rig?.dispose());

  it('leaves no interval data, shows the import as interrupted, and takes the same file again', async () => {
    const energy = await rig.as(DEMO.energy);
    const siteId = await newSite(energy, 'Kiln Lane cold store');
    const path = `/api/sites/${siteId}/meter-data`;
    // A year of 1-minute data: 365 days x 1,440 = 525,600 rows (arithmetic), 6 kWh and 3 kvarh lagging a minute.
    const csv = loadCsv('2025-01-01T00:00:00Z', 525_600, 1, 6, 3);
    const importId = `imp_kill${randomBytes(8).toString('hex')}`;
    const upload = uploadFile(energy, `${path}?importId=${importId}`, { name: 'kiln-lane-2025-1min.csv', content: csv }, { mapping }).then(
      (r) => r,
      (e: unknown) => e,
    );
    const seen = await waitFor(
      'rows being read',
      async () => {
        const r = await energy.get(`${path}/imports/${importId}`);
        return r.status === 200 && r.json.import.status === 'processing' && r.json.import.rowsProcessed > 0 ? r.json.import : undefined;
      },
      20,
    );
    expect(seen.rowsProcessed).toBeLessThan(525_600);
    await rig.kill();
    // The upload never got an answer: the process died under it.
    expect(await upload).toBeInstanceOf(Error);

    await rig.start();
    const detail = await energy.get(`${path}/imports/${importId}`);
    expect(detail.status).toBe(200);
    expect(detail.json.import.status).toBe('interrupted');
    expect(detail.json.import.intervals).toBe(0);
    expect(detail.json.import.problems[0].message).toMatch(/nothing from it was stored/i);
    const history = await energy.get(path);
    expect(history.json.imports.find((i: { id: string }) => i.id === importId).status).toBe('interrupted');
    expect((await energy.get(`/api/sites/${siteId}/intervals`)).json.intervals).toBe(0);
    const sql = rig.sql();
    const byImport = await sql.execute({ sql: 'SELECT count(*) AS n FROM interval_block WHERE import_id = ?', args: [importId] });
    expect(Number(byImport.rows[0]!.n)).toBe(0);
    expect((await storedIntervals(sql, siteId)).blocks).toBe(0);

    // The same bytes again: not refused as already imported, and the totals are the file's.
    const again = await uploadFile(energy, path, { name: 'kiln-lane-2025-1min.csv', content: csv }, { mapping });
    expect(again.status, JSON.stringify(again.json)).toBe(201);
    expect(again.json.import).toMatchObject({ status: 'imported', intervals: 525_600 });
    const stored = await storedIntervals(sql, siteId);
    expect(stored.blocks).toBe(365); // one block per UTC day of 2025 (decision 13)
    expect(stored.intervals).toHaveLength(525_600);
    const periods = (await energy.get(`/api/sites/${siteId}/findings`)).json.periods as { metrics: { kwh: number; pfAvgLagging: number } }[];
    expect(periods).toHaveLength(12);
    // 525,600 minutes x 6 kWh = 3,153,600 kWh (arithmetic).
    expect(periods.reduce((s, p) => s + p.metrics.kwh, 0)).toBeCloseTo(3_153_600, 3);
    // PF = P / S = 6 / sqrt(6² + 3²) = 0.894427 (power triangle, common practice).
    expect(periods[0]!.metrics.pfAvgLagging).toBeCloseTo(0.894427, 5);
    held();
  });
});

describe('two imports to the same meter at once', () => {
  let rig: Rig;
  let energy: Client;
  let sql: SqlClient;
  beforeAll(async () => {
    rig = await startRig({ smtpPort: await freePort() });
    energy = await rig.as(DEMO.energy);
    sql = rig.sql();
  });
  afterAll(async () => rig?.dispose());

  it('overlapping files: exactly one lands, the other is refused, the stored data is one file, never a mix', async () => {
    const siteId = await newSite(energy, 'Quarry Road bakery');
    const path = `/api/sites/${siteId}/meter-data`;
    // Twenty days of 1-minute data each (28,800 intervals, big enough that both are read at the same time); B starts ten days into A.
    const files = [
      { name: 'bakery-a.csv', from: '2026-01-01T00:00:00Z', kwh: 1.5, content: loadCsv('2026-01-01T00:00:00Z', 28_800, 1, 1.5, 0.9) },
      { name: 'bakery-b.csv', from: '2026-01-11T00:00:00Z', kwh: 2.5, content: loadCsv('2026-01-11T00:00:00Z', 28_800, 1, 2.5, 0.5) },
    ];
    const answers = await Promise.all(files.map((f) => uploadFile(energy, path, { name: f.name, content: f.content }, { mapping })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
    const wi = answers.findIndex((a) => a.status === 201);
    const winner = files[wi]!;
    const loser = answers[1 - wi]!;
    expect(loser.json.error.code).toBe('overlap');
    expect(loser.json.error.message).toMatch(/overlaps data already imported/);
    const stored = await storedIntervals(sql, siteId);
    expect(stored.intervals).toHaveLength(28_800);
    expect(new Set(stored.intervals.map((i) => i.kwh))).toEqual(new Set([winner.kwh]));
    expect(stored.intervals[0]!.t).toBe(Date.parse(winner.from));
    expect(new Set(stored.intervals.map((i) => i.importId))).toEqual(new Set([answers[wi]!.json.import.id]));
    const refused = await energy.get(`${path}/imports/${loser.json.error.importId}`);
    expect(refused.json.import.status).toBe('rejected');
    held();
  });

  it('overlapping files sent to two app instances on one database at once: one lands, the other is refused, no mix', async () => {
    const twin = await rig.twin();
    try {
      const other = await twin.as(DEMO.energy);
      const siteId = await newSite(energy, 'Quarry Road bakery store');
      const path = `/api/sites/${siteId}/meter-data`;
      const files = [
        { client: energy, name: 'store-a.csv', from: '2026-02-01T00:00:00Z', kwh: 1.5, content: loadCsv('2026-02-01T00:00:00Z', 28_800, 1, 1.5, 0.9) },
        { client: other, name: 'store-b.csv', from: '2026-02-11T00:00:00Z', kwh: 2.5, content: loadCsv('2026-02-11T00:00:00Z', 28_800, 1, 2.5, 0.5) },
      ];
      const answers = await Promise.all(files.map((f) => uploadFile(f.client, path, { name: f.name, content: f.content }, { mapping })));
      expect(answers.map((a) => a.status).sort(), JSON.stringify(answers.map((a) => a.json?.error?.code))).toEqual([201, 409]);
      const wi = answers.findIndex((a) => a.status === 201);
      expect(answers[1 - wi]!.json.error.code).toBe('overlap');
      const stored = await storedIntervals(sql, siteId);
      expect(stored.intervals).toHaveLength(28_800);
      expect(new Set(stored.intervals.map((i) => i.kwh))).toEqual(new Set([files[wi]!.kwh]));
    } finally {
      await twin.stop();
    }
    held();
  });

  it('the same file twice at once: one import, the other told it is already there', async () => {
    const siteId = await newSite(energy, 'Quarry Road bakery annex');
    const path = `/api/sites/${siteId}/meter-data`;
    const content = loadCsv('2026-02-01T00:00:00Z', 960, 15, 80, 40);
    const answers = await Promise.all([0, 1].map(() => uploadFile(energy, path, { name: 'annex-feb.csv', content }, { mapping })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
    const loser = answers.find((a) => a.status === 409)!;
    expect(['already_imported', 'overlap']).toContain(loser.json.error.code);
    const stored = await storedIntervals(sql, siteId);
    expect(stored.intervals).toHaveLength(960);
    expect(new Set(stored.intervals.map((i) => i.kwh))).toEqual(new Set([80]));
    held();
  });

  it('two ranges that do not overlap (but share a day) at once: both land, whole', async () => {
    const siteId = await newSite(energy, 'Mill Lane dairy');
    const path = `/api/sites/${siteId}/meter-data`;
    // A: 1 Mar 00:00 to 10 Mar 11:45 (9 x 96 + 48 = 912 quarter-hours); B: 10 Mar 12:00 onwards (960). 10 Mar holds both.
    const a = { from: '2026-03-01T00:00:00Z', n: 912, kwh: 120 };
    const b = { from: '2026-03-10T12:00:00Z', n: 960, kwh: 70 };
    const answers = await Promise.all([a, b].map((f, i) => uploadFile(energy, path, { name: `dairy-${i}.csv`, content: loadCsv(f.from, f.n, 15, f.kwh, 30) }, { mapping })));
    expect(answers.map((r) => r.status), JSON.stringify(answers.map((r) => r.json?.error))).toEqual([201, 201]);
    const stored = await storedIntervals(sql, siteId);
    expect(stored.intervals).toHaveLength(a.n + b.n);
    const split = Date.parse(b.from);
    expect(stored.intervals.every((i) => i.kwh === (i.t < split ? a.kwh : b.kwh))).toBe(true);
    // Consecutive quarter-hours with no gap and no duplicate across the shared day.
    expect(stored.intervals.every((i, k) => k === 0 || i.t - stored.intervals[k - 1]!.t === 900_000)).toBe(true);
    held();
  });
});

describe('SQLite busy: another writer holds the lock', () => {
  let rig: Rig;
  let energy: Client;
  let sql: SqlClient;
  beforeAll(async () => {
    rig = await startRig({ smtpPort: await freePort() });
    energy = await rig.as(DEMO.energy);
    sql = rig.sql();
  });
  afterAll(async () => rig?.dispose());

  const siteNames = async () => ((await energy.get('/api/sites')).json.sites as { name: string }[]).map((s) => s.name);

  it('a write that waits about a second for the lock succeeds', async () => {
    const lock = await holdWriteLock(sql);
    const pending = energy.post('/api/sites', { name: 'Tannery Row workshop', timeZone: 'UTC' });
    await sleep(1000);
    await lock.release();
    const r = await pending;
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(await siteNames()).toContain('Tannery Row workshop');
    held();
  });

  it('a write locked out past the busy window answers 503 busy with Retry-After and writes nothing', async () => {
    const lock = await holdWriteLock(sql);
    let r;
    try {
      r = await energy.post('/api/sites', { name: 'Ropewalk depot', timeZone: 'UTC' });
    } finally {
      await lock.release();
    }
    expect(r.status).toBe(503);
    expect(r.json.error.code).toBe('busy');
    expect(r.json.error.message).toMatch(/try again/i);
    expect(Number(r.res.headers.get('retry-after'))).toBeGreaterThan(0);
    const rows = await sql.execute({ sql: 'SELECT count(*) AS n FROM site WHERE name = ?', args: ['Ropewalk depot'] });
    expect(Number(rows.rows[0]!.n)).toBe(0);
    const events = async () => Number((await sql.execute({ sql: "SELECT count(*) AS n FROM audit_event WHERE action = 'site.created' AND detail LIKE ?", args: ['%Ropewalk depot%'] })).rows[0]!.n);
    expect(await events(), 'no activity entry for a site that was not saved').toBe(0);
    // Once the other writer is done, the same request goes through, with its one activity entry.
    const retry = await energy.post('/api/sites', { name: 'Ropewalk depot', timeZone: 'UTC' });
    expect(retry.status).toBe(201);
    expect(await events()).toBe(1);
    held();
  }, BUSY_WINDOW_MS + 30_000);

  it('a sign-in locked out past the busy window answers 503 in our JSON shape with Retry-After, then signs in', async () => {
    const lock = await holdWriteLock(sql);
    let r;
    try {
      r = await rig.anonymous().post('/api/auth/sign-in/email', { email: DEMO.owner, password: DEMO.password });
    } finally {
      await lock.release();
    }
    expect(r.status).toBe(503);
    expect(r.json.error.code).toBe('busy');
    expect(r.json.error.message).toMatch(/try again/i);
    expect(Number(r.res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await rig.anonymous().post('/api/auth/sign-in/email', { email: DEMO.owner, password: DEMO.password })).status).toBe(200);
    held();
  }, BUSY_WINDOW_MS + 30_000);

  it('a meter upload locked out answers 503, leaves no interval or half-done import, and imports afterwards', async () => {
    const siteId = await newSite(energy, 'Ropewalk depot yard');
    const path = `/api/sites/${siteId}/meter-data`;
    const content = loadCsv('2026-04-01T00:00:00Z', 96 * 3, 15, 100, 60);
    const lock = await holdWriteLock(sql);
    let r;
    try {
      r = await uploadFile(energy, path, { name: 'yard-april.csv', content }, { mapping });
    } finally {
      await lock.release();
    }
    expect(r.status).toBe(503);
    expect(r.json.error.code).toBe('busy');
    expect((await storedIntervals(sql, siteId)).blocks).toBe(0);
    const stuck = await sql.execute({ sql: "SELECT count(*) AS n FROM meter_import WHERE site_id = ? AND status = 'processing'", args: [siteId] });
    expect(Number(stuck.rows[0]!.n)).toBe(0);
    const ok = await uploadFile(energy, path, { name: 'yard-april.csv', content }, { mapping });
    expect(ok.status, JSON.stringify(ok.json)).toBe(201);
    expect(ok.json.import.intervals).toBe(288);
    held();
  }, BUSY_WINDOW_MS + 30_000);

  it('pages render while another writer holds the lock (reads are not blocked), with no stack', async () => {
    const siteId = ((await energy.get('/api/sites')).json.sites as { id: string }[])[0]!.id;
    const lock = await holdWriteLock(sql);
    try {
      for (const page of ['/', '/members', `/sites/${siteId}`, `/sites/${siteId}/meter-data`, '/purchases']) {
        const r = await energy.get(page);
        expect(r.status, page).toBe(200);
        expect(noStack(String(r.json)), page).toBe(true);
      }
    } finally {
      await lock.release();
    }
    held();
  });

  it('a page or API call whose session must be refreshed while the lock is held gets our busy page or a 503 JSON, then works', async () => {
    const c = await rig.as(DEMO.finance);
    // Make the session two days old (better-auth refreshes a session older than a day: a write).
    const user = await sql.execute({ sql: 'SELECT id FROM user WHERE email = ?', args: [DEMO.finance] });
    await sql.execute({ sql: 'UPDATE session SET expires_at = ? WHERE user_id = ?', args: [Date.now() + 12 * 86_400_000, user.rows[0]!.id] });
    const lock = await holdWriteLock(sql);
    let page, call;
    try {
      // The middleware meets the lock on the page and again on the error page it falls back to.
      [page, call] = await Promise.all([c.get('/members'), c.get('/api/sites')]);
    } finally {
      await lock.release();
    }
    expect([500, 503]).toContain(page.status);
    expect(String(page.json)).toMatch(/database is busy/);
    expect(String(page.json)).toMatch(/try again/i);
    expect(page.res.headers.get('content-type')).toMatch(/text\/html/);
    expect(Number(page.res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(noStack(String(page.json))).toBe(true);
    expect(call.status).toBe(503);
    expect(call.json.error.code).toBe('busy');
    expect(Number(call.res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await c.get('/members')).status).toBe(200);
    held();
  }, 2 * BUSY_WINDOW_MS + 30_000);
});

describe('the SMTP server is down', () => {
  let rig: Rig;
  let sink: MailSink | undefined;
  let smtpPort: number;
  beforeAll(async () => {
    smtpPort = await freePort(); // nothing listens here until the sink is started below
    rig = await startRig({ smtpPort });
  });
  afterAll(async () => {
    await sink?.stop();
    await rig?.dispose();
  });

  it('invitations and sign-ups answer without a 500, say the mail is delayed, and the kept mail arrives once the sink is up (across a restart)', async () => {
    const owner = await rig.as(DEMO.owner);
    const invitee = `invitee-${randomBytes(4).toString('hex')}@test.example`;
    const inv = await owner.post('/api/invitations', { email: invitee, role: 'consultant' });
    expect(inv.status, JSON.stringify(inv.json)).toBe(201);
    expect(inv.json.invitation.mail.status).toBe('delayed');
    expect(inv.json.invitation.mail.message).toMatch(/delayed/);
    const listed = (await owner.get('/api/invitations')).json.invitations.find((i: { id: string }) => i.id === inv.json.invitation.id);
    expect(listed.mail.status).toBe('delayed');
    const members = await owner.get('/members');
    expect(members.status).toBe(200);

    const newcomer = `newcomer-${randomBytes(4).toString('hex')}@test.example`;
    const anon = rig.anonymous();
    const up = await anon.post('/api/auth/sign-up/email', { name: 'Test Newcomer', email: newcomer, password: 'correct-horse-42', callbackURL: '/verify?verified=1' });
    expect(up.status, JSON.stringify(up.json)).toBe(200);
    expect(up.json.mail.status).toBe('delayed');
    expect(up.json.mail.message).toMatch(/will be late/);

    // Both mails are kept in the outbox, tried and waiting for another attempt.
    const sql = rig.sql();
    const kept = await waitFor('both mails tried once', async () => {
      const rs = await sql.execute({ sql: 'SELECT to_address, status, attempts, last_error FROM mail_outbox WHERE to_address IN (?, ?)', args: [invitee, newcomer] });
      return rs.rows.length === 2 && rs.rows.every((r) => r.last_error !== null) ? rs : undefined;
    });
    for (const row of kept.rows) {
      expect(row.status).toBe('pending');
      expect(Number(row.attempts)).toBeGreaterThanOrEqual(1);
      expect(String(row.last_error)).toMatch(/ECONNREFUSED|connect/i);
    }

    // The process dies with the mail unsent; a new one picks it up from the database.
    await rig.kill();
    await rig.start();
    const webPort = await freePort();
    sink = await startMailSink({ smtpPort, webPort, mailDirectory: join(rig.dataDir, 'mail') });
    const inbox = async () => (await (await fetch(`${sink!.url}/api/email`)).json()) as { subject: string; text: string; to: { address: string }[] }[];
    const mailTo = (address: string, subject: RegExp) => waitFor(`mail to ${address}`, async () => (await inbox()).find((m) => m.to.some((t) => t.address === address) && subject.test(m.subject)), 250);
    const invitation = await mailTo(invitee, /invited you/);
    const verification = await mailTo(newcomer, /Confirm your e-mail/);
    expect(invitation.text).toContain(`/invitations/${inv.json.invitation.id}`);

    // The kept verification link still works: the mail was delivered whole.
    const link = verification.text.match(new RegExp(`${rig.baseUrl.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`))![0];
    const verified = await anon.follow(link);
    expect(verified.status).toBe(302);
    const sent = await sql.execute({ sql: 'SELECT status, text_body FROM mail_outbox WHERE to_address IN (?, ?)', args: [invitee, newcomer] });
    expect(sent.rows.map((r) => r.status)).toEqual(['sent', 'sent']);
    expect(sent.rows.every((r) => r.text_body === '')).toBe(true);
    const owner2 = await rig.as(DEMO.owner);
    const after = (await owner2.get('/api/invitations')).json.invitations.find((i: { id: string }) => i.id === inv.json.invitation.id);
    expect(after.mail.status).toBe('sent');
    // Exactly one copy each.
    expect((await inbox()).filter((m) => m.to.some((t) => t.address === invitee || t.address === newcomer))).toHaveLength(2);
    held();
  }, 90_000);
});

describe('the payment service is down, or a webhook delivery fails', () => {
  let rig: Rig;
  let fake: PaymentFake | null = null;
  let fakePort: number;
  let owner: Client;
  let sql: SqlClient;
  const startFake = async () => {
    fake = await startPaymentFake({ port: fakePort, secretKey: TEST_PAYMENT_KEYS.secretKey, webhookSecret: TEST_PAYMENT_KEYS.webhookSecret, webhookUrl: `${rig.baseUrl}/api/payments/webhook`, quiet: true });
  };
  const stopFake = async () => {
    await fake?.stop();
    fake = null;
  };
  type FakeEvent = { id: string; type: string; sessionId: string; deliveries: { status: number | null; error: string | null }[] };
  const events = async (): Promise<FakeEvent[]> => ((await (await fetch(`http://127.0.0.1:${fakePort}/_fake/events`)).json()) as { data: FakeEvent[] }).data;
  const purchaseRows = async (siteId: string) => (await sql.execute({ sql: 'SELECT id, status, receipt_number FROM purchase WHERE site_ids LIKE ?', args: [`%${siteId}%`] })).rows;
  const paidEvents = async (purchaseId: string) => Number((await sql.execute({ sql: "SELECT count(*) AS n FROM audit_event WHERE action = 'purchase.paid' AND subject_id = ?", args: [purchaseId] })).rows[0]!.n);

  beforeAll(async () => {
    fakePort = await freePort(); // the fake is not started: the app's payment API address answers nothing
    rig = await startRig({ smtpPort: await freePort(), paymentApi: `http://127.0.0.1:${fakePort}` });
    owner = await rig.as(DEMO.owner);
    sql = rig.sql();
  });
  afterAll(async () => {
    await stopFake();
    await rig?.dispose();
  });

  it('with the fake stopped, buying answers 502 "nothing was charged" and leaves no purchase behind', async () => {
    const siteId = await newSite(owner, 'Cooper Street print works');
    const r = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(r.status).toBe(502);
    expect(r.json.error.code).toBe('payment_unavailable');
    expect(r.json.error.message).toMatch(/nothing was charged/i);
    expect(r.json.error.message).toMatch(/try again/i);
    expect(Number(r.res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(await purchaseRows(siteId)).toHaveLength(0);
    held();
  });

  it('with the fake stopped, the Purchases page renders and says the provider is unreachable', async () => {
    const page = await owner.get('/purchases');
    expect(page.status).toBe(200);
    expect(String(page.json)).toMatch(/payment service cannot be reached/);
    expect(noStack(String(page.json))).toBe(true);
    held();
  });

  it('with the fake up again, the same purchase goes through and the site is audited', async () => {
    await startFake();
    const siteId = ((await owner.get('/api/sites')).json.sites as { id: string; name: string }[]).find((s) => s.name === 'Cooper Street print works')!.id;
    const r = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    const paid = await payOnHostedPage(r.json.checkoutUrl);
    expect(paid.status).toBe(303);
    const state = await waitFor('audited', async () => ((await owner.get(`/api/sites/${siteId}`)).json.site.auditState === 'audited' ? true : undefined));
    expect(state).toBe(true);
    const rows = await purchaseRows(siteId);
    expect(rows.map((p) => p.status)).toEqual(['paid']);
    const page = await owner.get('/purchases');
    expect(String(page.json)).not.toMatch(/payment service cannot be reached/);
    held();
  });

  it('a webhook the app answers with 5xx (database locked) is delivered again and applied exactly once', async () => {
    const siteId = await newSite(owner, 'Cooper Street annex');
    const r = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(r.status).toBe(201);
    const purchaseId = r.json.purchase.id as string;
    const sessionId = new URL(r.json.checkoutUrl).pathname.split('/').pop()!;
    const lock = await holdWriteLock(sql);
    try {
      expect((await payOnHostedPage(r.json.checkoutUrl)).status).toBe(303);
      // The first delivery meets the lock for the whole busy window and is answered 503.
      await waitFor('a refused delivery', async () => ((await events()).find((e) => e.sessionId === sessionId && e.type === 'checkout.session.completed')?.deliveries.some((d) => d.status === 503) ? true : undefined));
    } finally {
      await lock.release();
    }
    const ev = await waitFor('a delivery answered 200', async () => (await events()).find((e) => e.sessionId === sessionId && e.type === 'checkout.session.completed' && e.deliveries.some((d) => d.status === 200)));
    expect(ev.deliveries[0]!.status).toBe(503);
    const rows = await purchaseRows(siteId);
    expect(rows.map((p) => p.status)).toEqual(['paid']);
    expect(await paidEvents(purchaseId)).toBe(1);
    // The provider sending it yet again changes nothing.
    const resend = await (await fetch(`http://127.0.0.1:${fakePort}/_fake/events/${ev.id}/resend`, { method: 'POST' })).json();
    expect(resend.delivery.status).toBe(200);
    expect(await paidEvents(purchaseId)).toBe(1);
    expect((await purchaseRows(siteId))[0]!.receipt_number).toBe(rows[0]!.receipt_number);
    const outcomes = await sql.execute({ sql: 'SELECT outcome FROM payment_event WHERE id = ?', args: [ev.id] });
    expect(outcomes.rows.map((o) => o.outcome)).toEqual(['granted']);
    held();
  }, BUSY_WINDOW_MS + 40_000);

  it('a webhook sent while the app is down is delivered again after it restarts and applied once', async () => {
    const siteId = await newSite(owner, 'Cooper Street store');
    const r = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(r.status).toBe(201);
    const purchaseId = r.json.purchase.id as string;
    const sessionId = new URL(r.json.checkoutUrl).pathname.split('/').pop()!;
    await rig.stop();
    expect((await payOnHostedPage(r.json.checkoutUrl)).status).toBe(303);
    await waitFor('a failed delivery', async () => ((await events()).find((e) => e.sessionId === sessionId && e.type === 'checkout.session.completed')?.deliveries.some((d) => d.error !== null) ? true : undefined));
    await rig.start();
    const ev = await waitFor('a delivery answered 200', async () => (await events()).find((e) => e.sessionId === sessionId && e.type === 'checkout.session.completed' && e.deliveries.some((d) => d.status === 200)));
    expect(ev.deliveries[0]!.error).not.toBeNull();
    expect((await purchaseRows(siteId)).map((p) => p.status)).toEqual(['paid']);
    expect(await paidEvents(purchaseId)).toBe(1);
    expect((await owner.get(`/api/sites/${siteId}`)).json.site.auditState).toBe('audited');
    held();
  }, 60_000);

  it('with the fake stopped while a checkout is open, the status read and the return page still render, and no second checkout is started blind', async () => {
    const siteId = await newSite(owner, 'Cooper Street yard');
    const r = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(r.status).toBe(201);
    const purchaseId = r.json.purchase.id as string;
    await stopFake();
    const read = await owner.get(`/api/purchases/${purchaseId}`);
    expect(read.status).toBe(200);
    expect(read.json.purchase.status).toBe('pending');
    const back = await owner.get(`/purchases?checkout=paid&purchase=${purchaseId}`);
    expect(back.status).toBe(200);
    expect(String(back.json)).toMatch(/payment service cannot be reached/);
    expect(noStack(String(back.json))).toBe(true);
    const again = await owner.post('/api/purchases', { siteIds: [siteId] });
    expect(again.status).toBe(502);
    expect(again.json.error.code).toBe('payment_unavailable');
    expect(again.json.error.message).toMatch(/nothing was charged/i);
    expect((await purchaseRows(siteId)).map((p) => p.status)).toEqual(['pending']);
    held();
  });
});
