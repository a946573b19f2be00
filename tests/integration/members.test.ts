import { describe, expect, it } from 'vitest';
import { Client } from '../support/http';
import { linkIn, waitForMail } from '../support/mailbox';
import { ownerOfNewWorkspace, uniqueEmail } from '../support/accounts';

describe('invitations, roles and removal', () => {
  it('an Owner invites by e-mail; the invitee signs up, accepts from the link and gets the role', async () => {
    const o = await ownerOfNewWorkspace('inviter');
    const inviteeEmail = uniqueEmail('invitee');
    const inv = await o.client.post('/api/invitations', { email: inviteeEmail, role: 'finance' });
    expect(inv.status).toBe(201);
    expect(inv.json.invitation).toMatchObject({ email: inviteeEmail, role: 'finance', status: 'pending' });

    const mail = await waitForMail(inviteeEmail, /invited you to Workspace inviter/);
    const link = linkIn(mail, `${o.client.base}/invitations/`);
    const invitationId = link.split('/').pop()!;
    expect(invitationId).toBe(inv.json.invitation.id);

    // The invitee creates an account with the invited address and verifies it.
    const invitee = new Client();
    await invitee.post('/api/auth/sign-up/email', { name: 'Fin Ance', email: inviteeEmail, password: 'invitee-pass-1', callbackURL: '/verify?verified=1' });
    await invitee.follow(linkIn(await waitForMail(inviteeEmail, /Confirm your e-mail/), invitee.base));

    expect((await invitee.get(`/api/invitations/${invitationId}`)).json.invitation).toMatchObject({ workspaceName: 'Workspace inviter', role: 'finance' });
    const accepted = await invitee.post(`/api/invitations/${invitationId}/accept`);
    expect(accepted.status).toBe(200);
    const me = await invitee.get('/api/me');
    expect(me.json.workspace).toMatchObject({ id: o.workspaceId, role: 'finance' });
    expect(me.json.permissions).toEqual(['site:view', 'economics:view']);

    // Accepting twice is refused; another person cannot read or accept it.
    expect((await invitee.post(`/api/invitations/${invitationId}/accept`)).status).toBe(409);
    const stranger = (await ownerOfNewWorkspace('stranger')).client;
    expect((await stranger.get(`/api/invitations/${invitationId}`)).status).toBe(404);

    // The Owner changes the role, then removes the member.
    const members = (await o.client.get('/api/members')).json.members as { id: string; email: string; role: string }[];
    const m = members.find((x) => x.email === inviteeEmail)!;
    expect(m.role).toBe('finance');
    expect((await o.client.patch(`/api/members/${m.id}`, { role: 'consultant' })).status).toBe(200);
    expect((await invitee.get('/api/me')).json.workspace.role).toBe('consultant');
    expect((await o.client.patch(`/api/members/${m.id}`, { role: 'superuser' })).status).toBe(400);
    expect((await o.client.del(`/api/members/${m.id}`)).status).toBe(204);
    expect((await invitee.get('/api/me')).json.workspace).toBeNull();
    expect((await invitee.get('/api/sites')).status).toBe(409);
  });

  it('only Owners manage members, and the last Owner cannot be demoted or removed', async () => {
    const o = await ownerOfNewWorkspace('solo');
    const members = (await o.client.get('/api/members')).json.members;
    expect(members).toHaveLength(1);
    const self = members[0];
    expect((await o.client.patch(`/api/members/${self.id}`, { role: 'finance' })).status).toBe(409);
    expect((await o.client.del(`/api/members/${self.id}`)).status).toBe(409);
    expect((await o.client.post('/api/invitations', { email: 'not-an-email', role: 'finance' })).json.error.fields).toHaveProperty('email');
  });

  it('an Owner may cancel a pending invitation; another workspace cannot see it', async () => {
    const o = await ownerOfNewWorkspace('canceller');
    const inv = await o.client.post('/api/invitations', { email: uniqueEmail('cancelled'), role: 'energy_manager' });
    const id = inv.json.invitation.id;
    const other = await ownerOfNewWorkspace('intruder');
    expect((await other.client.del(`/api/invitations/${id}`)).status).toBe(404);
    expect((await o.client.get('/api/invitations')).json.invitations.map((i: { id: string }) => i.id)).toContain(id);
    expect((await o.client.del(`/api/invitations/${id}`)).status).toBe(204);
    expect((await o.client.get('/api/invitations')).json.invitations.map((i: { id: string }) => i.id)).not.toContain(id);
  });
});
