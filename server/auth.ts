import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import { and, asc, eq, gt, isNull } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { accessControl, shopRoles } from '@/shared/roles';

import { clientAddressHeader, type AuthRateLimit } from './security';

export type AuthOptions = {
  db: Db;
  /** Public origin of the app, for example http://localhost:8080. */
  baseURL: string;
  secret: string;
  /** Attempts per network address on sign-in, sign-up and the other auth routes; false turns the limit off. */
  rateLimit?: AuthRateLimit | false;
};

/** Builds better-auth on the given database: e-mail and password, sessions, and shops as organizations with our four roles. */
export function createAuth({ db, baseURL, secret, rateLimit = false }: AuthOptions) {
  const https = baseURL.startsWith('https://');
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
      },
    }),
    user: { modelName: 'users' },
    session: { modelName: 'sessions' },
    account: { modelName: 'accounts' },
    verification: { modelName: 'verifications' },
    emailAndPassword: { enabled: true, minPasswordLength: 10, autoSignIn: true },
    rateLimit: rateLimit
      ? {
          enabled: true,
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
          // An owner a shop sent a summary to becomes that shop's customer on signing up with the same address.
          after: async (user) => {
            db.transaction((tx) => {
              const pending = tx
                .select()
                .from(schema.invitations)
                .where(and(eq(schema.invitations.email, user.email.toLowerCase()), eq(schema.invitations.status, 'pending'), gt(schema.invitations.expiresAt, new Date())))
                .all();
              for (const invitation of pending) {
                tx.insert(schema.memberships)
                  .values({ id: crypto.randomUUID(), organizationId: invitation.organizationId, userId: user.id, role: invitation.role ?? 'customer' })
                  .onConflictDoNothing()
                  .run();
                tx.update(schema.invitations).set({ status: 'accepted' }).where(eq(schema.invitations.id, invitation.id)).run();
              }
              // The sign-up's session may already exist without a shop: open it in the first one.
              const first = pending[0];
              if (first) {
                tx.update(schema.sessions)
                  .set({ activeOrganizationId: first.organizationId })
                  .where(and(eq(schema.sessions.userId, user.id), isNull(schema.sessions.activeOrganizationId)))
                  .run();
              }
            });
          },
        },
      },
      session: {
        create: {
          // A new session opens in the person's first shop, so every screen has a shop to work in.
          before: async (session) => {
            const first = db
              .select({ shopId: schema.memberships.organizationId })
              .from(schema.memberships)
              .where(eq(schema.memberships.userId, session.userId))
              .orderBy(asc(schema.memberships.createdAt))
              .limit(1)
              .get();
            return { data: { ...session, activeOrganizationId: first?.shopId ?? null } };
          },
        },
      },
    },
    plugins: [
      organization({
        ac: accessControl,
        roles: shopRoles,
        creatorRole: 'builder',
        schema: {
          organization: {
            modelName: 'shops',
            additionalFields: {
              kind: { type: 'string', required: true, defaultValue: 'repair', input: true },
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
