import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { APIError, createAuthMiddleware } from 'better-auth/api';
import { organization } from 'better-auth/plugins';

import type { Db } from '@/db';
import { schema } from '@/db';
import { accessControl, isShopRole, roleLabels, shopRoles } from '@/shared/roles';

import { composeMail, type MailContent } from './mail/compose';
import type { Mailer } from './mail';
import { maxPasswordLength, minPasswordLength, passwordSchema } from './passwords';
import { clientAddressHeader, type AuthRateLimit } from './security';
import { firstShopId, joinInvitedShops } from './store/sessions';

/** Where the links in verification mail land: a page of ours that says the address is verified. */
export const verifiedPath = '/verified';
/** The set-new-password screen the reset link opens (with ?token=). */
export const resetPasswordPath = '/reset-password';

/** The page an invitation mail links to: the person accepts or declines there once signed in with the invited address. */
export const invitationPath = (id: string) => `/invitations/${encodeURIComponent(id)}`;

/** How long a team invitation stays open. */
export const invitationDays = 7;

/** Organization endpoints of better-auth we do not use: shops, members and invitations go through our own routes. */
export const disabledOrganizationPaths = [
  'accept-invitation',
  'add-team-member',
  'cancel-invitation',
  'check-slug',
  'create',
  'create-role',
  'create-team',
  'delete',
  'delete-role',
  'get-active-member',
  'get-active-member-role',
  'get-full-organization',
  'get-invitation',
  'get-organization',
  'get-role',
  'has-permission',
  'invite-member',
  'leave',
  'list',
  'list-invitations',
  'list-members',
  'list-roles',
  'list-team-members',
  'list-teams',
  'list-user-invitations',
  'list-user-teams',
  'reject-invitation',
  'remove-member',
  'remove-team',
  'remove-team-member',
  'set-active',
  'set-active-team',
  'update',
  'update-member-role',
  'update-role',
  'update-team',
].map((name) => `/organization/${name}`);

/** better-auth's own account endpoints we do not offer (no social sign-in, no e-mail change or account deletion yet). */
export const disabledAccountPaths = [
  '/account-info',
  '/change-email',
  '/delete-user',
  '/delete-user/callback',
  '/get-access-token',
  '/link-social',
  '/list-accounts',
  '/refresh-token',
  '/sign-in/social',
  '/unlink-account',
  '/update-session',
  '/update-user',
  '/verify-password',
];

/** Where each auth route that sets a password carries it. */
const passwordFields: Record<string, string> = { '/sign-up/email': 'password', '/reset-password': 'newPassword', '/change-password': 'newPassword' };

/** Swaps the link's callback for our own page, so the link never lands anywhere a sign-up body asked for. */
function withCallback(url: string, callback: string) {
  const link = new URL(url);
  link.searchParams.set('callbackURL', callback);
  return link.toString();
}

export type AuthOptions = {
  db: Db;
  /** Public origin of the app, for example http://localhost:8080. */
  baseURL: string;
  secret: string;
  /** Attempts per network address on sign-in, sign-up and the other auth routes; false turns the limit off. */
  rateLimit?: AuthRateLimit | false;
  /** Sends verification and password-reset mail. */
  mailer: Mailer;
};

/** Builds better-auth on the given database: e-mail and password, sessions, and shops as organizations with our four roles. */
export function createAuth({ db, baseURL, secret, rateLimit = false, mailer }: AuthOptions) {
  const https = baseURL.startsWith('https://');
  /** A mail with one link from the sign-in library, which lands on our page at `landing` once the library has checked it. */
  const sendLinkMail = (
    user: { email: string; name: string },
    url: string,
    landing: string,
    words: Pick<MailContent, 'subject' | 'lines' | 'action' | 'footer'>,
  ) => mailer.send(composeMail({ to: { email: user.email, name: user.name }, ...words, link: withCallback(url, new URL(landing, baseURL).toString()) }));
  return betterAuth({
    baseURL,
    secret,
    trustedOrigins: [baseURL],
    database: drizzleAdapter(db, {
      provider: 'sqlite',
      schema: {
        users: schema.users,
        sessions: schema.sessions,
        accounts: schema.accounts,
        verifications: schema.verifications,
        shops: schema.shops,
        memberships: schema.memberships,
        invitations: schema.invitations,
        authRateLimits: schema.authRateLimits,
      },
    }),
    user: { modelName: 'users' },
    session: { modelName: 'sessions' },
    account: { modelName: 'accounts' },
    verification: { modelName: 'verifications' },
    disabledPaths: [...disabledAccountPaths, ...disabledOrganizationPaths],
    emailAndPassword: {
      enabled: true,
      minPasswordLength,
      maxPasswordLength,
      autoSignIn: true,
      resetPasswordTokenExpiresIn: 60 * 60,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: ({ user, url }) =>
        sendLinkMail(user, url, resetPasswordPath, {
          subject: 'Set a new Lobewright password',
          lines: ['Someone asked to set a new password for your Lobewright account. The link works for one hour.'],
          action: 'Set a new password',
          footer: 'If you did not ask for this, ignore this mail: your password stays as it is.',
        }),
    },
    emailVerification: {
      sendOnSignUp: true,
      autoSignInAfterVerification: true,
      expiresIn: 24 * 60 * 60,
      sendVerificationEmail: ({ user, url }) =>
        sendLinkMail(user, url, verifiedPath, {
          subject: 'Verify your e-mail for Lobewright',
          lines: ['Please confirm this is your address. Until you do, invitations to shops and vehicle summaries stay closed.'],
          action: 'Verify my e-mail',
          footer: 'If you did not sign up for Lobewright, ignore this mail.',
        }),
    },
    hooks: {
      // Every route that sets a password checks it against our rules first, with a 400 naming the field.
      before: createAuthMiddleware(async (ctx) => {
        const field = passwordFields[ctx.path];
        if (!field) return;
        const body: unknown = ctx.body;
        const value = body && typeof body === 'object' ? (body as Record<string, unknown>)[field] : undefined;
        const result = passwordSchema.safeParse(value);
        if (!result.success) {
          const message = result.error.issues[0]?.message ?? 'Invalid password';
          throw new APIError('BAD_REQUEST', { code: 'invalid', message: `${field}: ${message}`, fields: { [field]: message } });
        }
      }),
    },
    rateLimit: rateLimit
      ? {
          enabled: true,
          // Counted in the database, so every server process sees one address's attempts together.
          storage: 'database' as const,
          modelName: 'authRateLimits',
          ...rateLimit.other,
          customRules: { '/sign-in/email': rateLimit.signIn, '/sign-up/email': rateLimit.signUp },
        }
      : { enabled: false },
    advanced: {
      // Secure (and the __Secure- prefix) whenever people reach us over HTTPS; never readable from scripts.
      useSecureCookies: https,
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax', secure: https },
      ipAddress: { ipAddressHeaders: [clientAddressHeader] },
      database: { generateId: () => crypto.randomUUID() },
    },
    telemetry: { enabled: false },
    databaseHooks: {
      user: {
        create: {
          // An invited address joins its shops only once verified (a verified sign-up is one made by the seed or an admin).
          after: async (user) => {
            if (user.emailVerified) joinInvitedShops(db, user);
          },
        },
        update: {
          // An owner a shop sent a summary to, or a person a shop invited, joins that shop when the address is verified.
          after: async (user) => {
            if (user.emailVerified) joinInvitedShops(db, user);
          },
        },
      },
      session: {
        create: {
          // A new session opens in the person's first shop, so every screen has a shop to work in.
          before: async (session) => {
            return { data: { ...session, activeOrganizationId: firstShopId(db, session.userId) } };
          },
        },
      },
    },
    plugins: [
      organization({
        ac: accessControl,
        roles: shopRoles,
        creatorRole: 'builder',
        // Shops are made only through POST /api/shops, which sets the kind and the founder's role.
        allowUserToCreateOrganization: false,
        // Only the person who owns the address may take up an invitation to it.
        requireEmailVerificationOnInvitation: true,
        invitationExpiresIn: invitationDays * 24 * 60 * 60,
        sendInvitationEmail: ({ id, email, role, organization: shop, inviter }) =>
          mailer.send(
            composeMail({
              to: { email, name: email },
              subject: `${inviter.user.name} invited you to ${shop.name} on Lobewright`,
              lines: [
                `${inviter.user.name} invited you to work at ${shop.name} as ${isShopRole(role) ? roleLabels[role].toLowerCase() : role}.`,
                `Sign in or create an account with this address (${email}), verify it, and the invitation opens. It lasts ${invitationDays} days.`,
              ],
              action: 'Open the invitation',
              link: new URL(invitationPath(id), baseURL).toString(),
              footer: 'If you were not expecting this, ignore this mail: nothing happens unless you accept.',
            }),
          ),
        schema: {
          organization: {
            modelName: 'shops',
            additionalFields: {
              kind: { type: 'string', required: true, defaultValue: 'repair', input: false },
            },
          },
          member: { modelName: 'memberships' },
          invitation: { modelName: 'invitations' },
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
