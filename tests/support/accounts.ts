/** Creates real accounts through the HTTP API and the mailbox, as a person would. */
import { randomBytes } from 'node:crypto';
import { Client } from './http';
import { linkIn, waitForMail } from './mailbox';

export const uniqueEmail = (tag: string) => `${tag}-${randomBytes(4).toString('hex')}@test.example`;

/** Signs up, opens the verification link from the sink, and returns the signed-in client. */
export async function verifiedUser(tag: string, password = 'correct-horse-42') {
  const c = new Client();
  const email = uniqueEmail(tag);
  const r = await c.post('/api/auth/sign-up/email', { name: `Test ${tag}`, email, password, callbackURL: '/verify?verified=1' });
  if (r.status !== 200) throw new Error(`sign-up failed: ${r.status} ${JSON.stringify(r.json)}`);
  const mail = await waitForMail(email, /Confirm your e-mail/);
  const res = await c.follow(linkIn(mail, c.base));
  if (res.status !== 302) throw new Error(`verification link answered ${res.status}`);
  return { client: c, email, password };
}

/** A verified user who owns a fresh workspace. */
export async function ownerOfNewWorkspace(tag: string) {
  const u = await verifiedUser(tag);
  const r = await u.client.post('/api/workspaces', { name: `Workspace ${tag}` });
  if (r.status !== 201) throw new Error(`workspace creation failed: ${r.status} ${JSON.stringify(r.json)}`);
  return { ...u, workspaceId: r.json.workspace.id as string };
}
