/**
 * better-auth on our Drizzle database: e-mail and password with verification and reset by
 * e-mail, sessions in cookies, workspaces as organizations with our four roles.
 */
import { CLIENT_IP_HEADER } from './client-ip';
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import { asc, eq } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { authSchema, member } from '../db/schema';
import { createAuthMiddleware } from 'better-auth/api';
import { mailServerReachable, sendMail, startMailOutbox } from '../mail/mailer';
import type { MailRef } from '../mail/outbox';
import { invitationMail, passwordResetMail, verificationMail } from '../mail/templates';
import { ac, orgRoles } from './org-roles';
import { ROLE_LABELS, isRole } from './permissions';

const cfg = getConfig();
const db = getDb();

/**
 * Mail goes through the durable outbox. Account mails are not awaited, so response times
 * do not reveal whether an account exists; the answer says instead whether the mail
 * server is taking mail at all (the same for every address).
 */
function deliver(to: string, message: Parameters<typeof sendMail>[1], ref: MailRef) {
  void sendMail(to, message, ref).catch((e) => console.error(`[mail] could not keep a ${ref.kind} mail for ${to}`, e));
}

/** Mail left from before a restart is picked up with the first request. */
startMailOutbox();

const MAIL_PATHS = new Set(['/sign-up/email', '/send-verification-email', '/request-password-reset']);
const DELAYED = 'Your account request is saved, but our mail server is not accepting mail right now, so the e-mail will be late. It is kept and sent automatically as soon as the server is back; you do not need to sign up again.';

export const auth = betterAuth({
  appName: 'Varledger',
  baseURL: cfg.baseUrl,
  secret: cfg.authSecret,
  trustedOrigins: [cfg.baseUrl],
  telemetry: { enabled: false },
  database: drizzleAdapter(db, { provider: 'sqlite', schema: authSchema }),
  emailAndPassword: {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: 10,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: 3600,
    revokeSessionsOnPasswordReset: true,
    sendResetPassword: async ({ user, url }) => deliver(user.email, passwordResetMail(user.name, url), { kind: 'password-reset' }),
  },
  emailVerification: {
    sendOnSignUp: true,
    sendOnSignIn: true,
    autoSignInAfterVerification: true,
    expiresIn: 3600,
    sendVerificationEmail: async ({ user, url }) => deliver(user.email, verificationMail(user.name, url), { kind: 'verification' }),
  },
  session: { expiresIn: 60 * 60 * 24 * 14, updateAge: 60 * 60 * 24 },
  rateLimit: {
    enabled: cfg.NODE_ENV === 'production',
    window: 60,
    max: 200,
    customRules: {
      '/sign-in/email': { window: 60, max: 10 },
      '/sign-up/email': { window: 60, max: 10 },
      '/request-password-reset': { window: 60, max: 5 },
    },
  },
  // The origin check stays on whatever the environment says (better-auth would skip it when TEST is set).
  advanced: { useSecureCookies: cfg.secureCookies, cookiePrefix: 'varledger', disableOriginCheck: false, ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] } },
  hooks: {
    // Answers that promise an e-mail say whether it will be late (mail: { status, message }).
    after: createAuthMiddleware(async (ctx) => {
      if (!MAIL_PATHS.has(ctx.path)) return;
      const returned = ctx.context.returned;
      if (!returned || typeof returned !== 'object' || returned instanceof Response || 'statusCode' in returned) return;
      const ok = await mailServerReachable();
      return ctx.json({ ...(returned as Record<string, unknown>), mail: ok ? { status: 'queued', message: 'The e-mail is on its way.' } : { status: 'delayed', message: DELAYED } });
    }),
  },
  databaseHooks: {
    session: {
      create: {
        // A new session opens on the person's first workspace, so pages have one to show.
        before: async (s) => {
          const first = await db.query.member.findFirst({ where: eq(member.userId, s.userId), orderBy: asc(member.createdAt) });
          return { data: { ...s, activeOrganizationId: first?.organizationId ?? null } };
        },
      },
    },
  },
  plugins: [
    organization({
      ac,
      roles: orgRoles,
      creatorRole: 'owner',
      invitationExpiresIn: 60 * 60 * 24 * 7,
      cancelPendingInvitationsOnReInvite: true,
      sendInvitationEmail: async (data) => {
        const role = isRole(data.role) ? ROLE_LABELS[data.role] : String(data.role);
        // The first attempt is awaited (at most 3 s) so the invitation answer can say whether the mail went out.
        const sending = sendMail(data.email, invitationMail(data.inviter.user.name, data.organization.name, role, `${cfg.baseUrl}/invitations/${data.id}`), { kind: 'invitation', organizationId: data.organization.id, refType: 'invitation', refId: data.id });
        sending.catch((e) => console.error(`[mail] could not keep the invitation mail for ${data.email}`, e));
        await Promise.race([sending.catch(() => undefined), new Promise((r) => setTimeout(r, 3000).unref())]);
      },
    }),
  ],
});

export type Auth = typeof auth;
export type SessionData = typeof auth.$Infer.Session;
