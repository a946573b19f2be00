import { describe, expect, it } from 'vitest';
import { Client } from '../support/http';
import { linkIn, listMail, waitForMail } from '../support/mailbox';
import { uniqueEmail, verifiedUser } from '../support/accounts';

describe('sign-up, verification and sign-in through the real server and SMTP sink', () => {
  it('refuses sign-in until the address is verified, then signs in after the link', async () => {
    const c = new Client();
    const email = uniqueEmail('verify');
    const up = await c.post('/api/auth/sign-up/email', { name: 'Vera Fy', email, password: 'long-enough-pw', callbackURL: '/verify?verified=1' });
    expect(up.status).toBe(200);

    await waitForMail(email, /Confirm your e-mail address/);
    const early = await new Client().post('/api/auth/sign-in/email', { email, password: 'long-enough-pw', callbackURL: '/verify?verified=1' });
    expect(early.status).toBe(403);
    expect(early.json.code).toBe('EMAIL_NOT_VERIFIED');
    // Signing in unverified sends a fresh link: two confirmation mails are now in the sink.
    await expect.poll(async () => (await listMail()).filter((m) => m.to.some((t) => t.address === email)).length, { timeout: 10_000 }).toBe(2);

    const mail = await waitForMail(email, /Confirm your e-mail address/);
    expect(mail.html).toContain('Confirm my address');
    const link = linkIn(mail, c.base);
    expect(link).toContain('/api/auth/verify-email?token=');
    const res = await c.follow(link);
    expect(res.status).toBe(302);
    expect(res.headers.get('location')).toContain('/verify?verified=1');

    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.json.user).toMatchObject({ email, emailVerified: true });
    expect(me.json.workspace).toBeNull();

    const again = await new Client().post('/api/auth/sign-in/email', { email, password: 'long-enough-pw' });
    expect(again.status).toBe(200);
  });

  it('rejects a wrong password and a short password at sign-up', async () => {
    const bad = await new Client().post('/api/auth/sign-in/email', { email: 'owner@northgate.example', password: 'not-the-password' });
    expect(bad.status).toBe(401);
    const short = await new Client().post('/api/auth/sign-up/email', { name: 'Shorty', email: uniqueEmail('short'), password: 'abc' });
    expect(short.status).toBe(400);
  });

  it('resets a password from the e-mailed link; the old password stops working', async () => {
    const u = await verifiedUser('reset');
    const c = new Client();
    const r = await c.post('/api/auth/request-password-reset', { email: u.email, redirectTo: '/reset-password' });
    expect(r.status).toBe(200);
    const mail = await waitForMail(u.email, /Choose a new Varledger password/);
    const res = await c.follow(linkIn(mail, c.base));
    expect(res.status).toBe(302);
    const location = new URL(res.headers.get('location')!, c.base);
    expect(location.pathname).toBe('/reset-password');
    const token = location.searchParams.get('token');
    expect(token).toBeTruthy();
    const set = await c.post('/api/auth/reset-password', { newPassword: 'a-brand-new-secret', token });
    expect(set.status).toBe(200);
    expect((await new Client().post('/api/auth/sign-in/email', { email: u.email, password: u.password })).status).toBe(401);
    expect((await new Client().post('/api/auth/sign-in/email', { email: u.email, password: 'a-brand-new-secret' })).status).toBe(200);
  });

  it('lets a person create a workspace, become its Owner and switch between workspaces', async () => {
    const u = await verifiedUser('switch');
    const a = await u.client.post('/api/workspaces', { name: 'Alpha Foods' });
    const b = await u.client.post('/api/workspaces', { name: 'Beta Metals' });
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    let me = await u.client.get('/api/me');
    expect(me.json.workspace).toMatchObject({ id: b.json.workspace.id, role: 'owner' });
    expect(me.json.workspaces.map((w: { name: string }) => w.name)).toEqual(['Alpha Foods', 'Beta Metals']);
    expect((await u.client.put('/api/workspaces/active', { workspaceId: a.json.workspace.id })).status).toBe(200);
    me = await u.client.get('/api/me');
    expect(me.json.workspace.name).toBe('Alpha Foods');
    const foreign = await u.client.put('/api/workspaces/active', { workspaceId: 'org_not_mine' });
    expect(foreign.status).toBe(404);
  });
});
