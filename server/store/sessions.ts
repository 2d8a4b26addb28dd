import { and, asc, eq, gt, inArray, isNull, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { MeShop } from '@/shared/me';
import { isShopRole, type ShopKind } from '@/shared/roles';

import { audit } from './audit';
import type { Reader } from './db';
import { prepared } from './prepared';

const liveSessionStatement = (db: Reader) =>
  prepared(db, 'access.live-session', (d) =>
    d
      .select({
        activeShopId: schema.sessions.activeOrganizationId,
        expiresAt: schema.sessions.expiresAt,
        name: schema.users.name,
        email: schema.users.email,
        emailVerified: schema.users.emailVerified,
      })
      .from(schema.sessions)
      .innerJoin(schema.users, eq(schema.users.id, schema.sessions.userId))
      .where(eq(schema.sessions.id, sql.placeholder('sessionId')))
      .prepare(),
  );

const membershipStatement = (db: Reader) =>
  prepared(db, 'access.membership', (d) =>
    d
      .select({ role: schema.memberships.role, id: schema.shops.id, name: schema.shops.name, kind: schema.shops.kind })
      .from(schema.memberships)
      .innerJoin(schema.shops, eq(schema.shops.id, schema.memberships.organizationId))
      .where(and(eq(schema.memberships.userId, sql.placeholder('userId')), eq(schema.memberships.organizationId, sql.placeholder('shopId'))))
      .prepare(),
  );

/** The session row as it is now (sign-out, expiry and shop switches show at once), with its person. */
export function liveSession(db: Reader, sessionId: string) {
  return liveSessionStatement(db).get({ sessionId });
}

/** The person's role in the shop, with the shop; undefined when they are not a member. */
export function membershipIn(db: Reader, userId: string, shopId: string) {
  return membershipStatement(db).get({ userId, shopId });
}

/** Every shop the person belongs to, by name, with their role there. */
export function shopsOf(db: Reader, userId: string): MeShop[] {
  return db
    .select({
      id: schema.shops.id,
      name: schema.shops.name,
      kind: schema.shops.kind,
      role: schema.memberships.role,
    })
    .from(schema.memberships)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.memberships.organizationId))
    .where(eq(schema.memberships.userId, userId))
    .orderBy(asc(schema.shops.name))
    .all()
    .flatMap((row) => (isShopRole(row.role) ? [{ ...row, role: row.role }] : []));
}

/** Makes `shopId` the session's active shop. */
export function setActiveShop(db: Pick<Db, 'update'>, sessionId: string, shopId: string) {
  db.update(schema.sessions).set({ activeOrganizationId: shopId }).where(eq(schema.sessions.id, sessionId)).run();
}

/** A new shop with its creator as a member in `role`, made the session's active shop; returns the shop's id. */
export function createShop(db: Db, who: { userId: string; sessionId: string }, body: { name: string; kind: ShopKind }, role: 'builder' | 'grinder'): string {
  return db.transaction((tx) => {
    const id = crypto.randomUUID();
    const slug = `${body.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')}-${id.slice(0, 8)}`;
    tx.insert(schema.shops).values({ id, name: body.name, slug, kind: body.kind }).run();
    tx.insert(schema.memberships).values({ id: crypto.randomUUID(), organizationId: id, userId: who.userId, role }).run();
    setActiveShop(tx, who.sessionId, id);
    audit(tx, { shopId: id, userId: who.userId, action: 'create', entity: 'shop', entityId: id });
    return id;
  });
}

/** Turns pending invitations for the address into memberships, once the address is verified. */
export function joinInvitedShops(db: Db, user: { id: string; email: string }) {
  db.transaction((tx) => {
    const pending = tx
      .select()
      .from(schema.invitations)
      .where(
        and(eq(schema.invitations.email, user.email.toLowerCase()), eq(schema.invitations.status, 'pending'), gt(schema.invitations.expiresAt, new Date())),
      )
      .all();
    for (const invitation of pending) {
      tx.insert(schema.memberships)
        .values({ id: crypto.randomUUID(), organizationId: invitation.organizationId, userId: user.id, role: invitation.role ?? 'customer' })
        .onConflictDoNothing()
        .run();
      tx.update(schema.invitations).set({ status: 'accepted' }).where(eq(schema.invitations.id, invitation.id)).run();
    }
    // Sessions opened before verification have no shop yet: open them in the first one.
    const first = pending[0];
    if (first) {
      tx.update(schema.sessions)
        .set({ activeOrganizationId: first.organizationId })
        .where(and(eq(schema.sessions.userId, user.id), isNull(schema.sessions.activeOrganizationId)))
        .run();
    }
  });
}

/** The person's first shop (by when they joined), where a new session opens; null when they have none. */
export function firstShopId(db: Reader, userId: string): string | null {
  const first = db
    .select({ shopId: schema.memberships.organizationId })
    .from(schema.memberships)
    .where(eq(schema.memberships.userId, userId))
    .orderBy(asc(schema.memberships.createdAt))
    .limit(1)
    .get();
  return first?.shopId ?? null;
}

/** The e-mail/password sign-ins of these addresses, with their password hashes. */
export function passwordHashesOf(db: Reader, emails: string[]) {
  return db
    .select({ email: schema.users.email, hash: schema.accounts.password })
    .from(schema.accounts)
    .innerJoin(schema.users, eq(schema.users.id, schema.accounts.userId))
    .where(and(eq(schema.accounts.providerId, 'credential'), inArray(schema.users.email, emails)))
    .all();
}

/** Whether anyone has signed up with one of these addresses. */
export function anyUserWithEmail(db: Reader, emails: string[]): boolean {
  return db.select({ id: schema.users.id }).from(schema.users).where(inArray(schema.users.email, emails)).limit(1).get() !== undefined;
}
