/**
 * better-auth on our Drizzle database: e-mail and password with verification and reset by
 * e-mail, sessions in cookies, workspaces as organizations with our four roles.
 */
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import { asc, eq } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { authSchema, member } from '../db/schema';
import { sendMail } from '../mail/mailer';
import { invitationMail, passwordResetMail, verificationMail } from '../mail/templates';
import { ac, orgRoles } from './org-roles';
import { ROLE_LABELS, isRole } from './permissions';

const cfg = getConfig();
const db = getDb();

/** Mail is sent in the background so response times do not reveal whether an account exists. */
function deliver(to: string, message: Parameters<typeof sendMail>[1]) {
  void sendMail(to, message);
}

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
    sendResetPassword: async ({ user, url }) => deliver(user.email, passwordResetMail(user.name, url)),
  },
  emailVerification: {
    sendOnSignUp: true,
    sendOnSignIn: true,
    autoSignInAfterVerification: true,
    expiresIn: 3600,
    sendVerificationEmail: async ({ user, url }) => deliver(user.email, verificationMail(user.name, url)),
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
  advanced: { useSecureCookies: cfg.secureCookies, cookiePrefix: 'varledger' },
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
        deliver(data.email, invitationMail(data.inviter.user.name, data.organization.name, role, `${cfg.baseUrl}/invitations/${data.id}`));
      },
    }),
  ],
});

export type Auth = typeof auth;
export type SessionData = typeof auth.$Infer.Session;
