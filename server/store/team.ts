import { and, asc, eq, inArray } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { defaultStaffRole, isShopRole, isStaffRole, staffRoles, type ShopKind } from '@/shared/roles';
import type { InvitationView, Team } from '@/shared/team';

import { forbidden, notFound } from '../http';
import { audit } from './audit';
import type { Reader } from './db';
import { setActiveShop } from './sessions';

/** Whose team: the shop (and its kind, which decides the staff roles) and the person looking. */
export type TeamViewer = { shop: { id: string; kind: ShopKind }; user: { id: string } };

/** Members of `shopId` with `role`, for mail. */
export function recipients(db: Reader, shopId: string, role: 'builder' | 'grinder') {
  return db
    .select({ email: schema.users.email, name: schema.users.name })
    .from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.userId))
    .where(and(eq(schema.memberships.organizationId, shopId), eq(schema.memberships.role, role)))
    .orderBy(asc(schema.users.email))
    .all();
}

/** The shop's staff (vehicle owners are not the team) and its open invitations. */
export function loadTeam(db: Reader, ctx: TeamViewer): Team {
  const roles = [...staffRoles[ctx.shop.kind]];
  const members = db
    .select({
      id: schema.memberships.id,
      userId: schema.users.id,
      name: schema.users.name,
      email: schema.users.email,
      role: schema.memberships.role,
      joinedAt: schema.memberships.createdAt,
    })
    .from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.userId))
    .where(and(eq(schema.memberships.organizationId, ctx.shop.id), inArray(schema.memberships.role, roles)))
    .orderBy(asc(schema.users.name), asc(schema.memberships.id))
    .all();
  const now = Date.now();
  const invitations = db
    .select({
      id: schema.invitations.id,
      email: schema.invitations.email,
      role: schema.invitations.role,
      expiresAt: schema.invitations.expiresAt,
      invitedBy: schema.users.name,
    })
    .from(schema.invitations)
    .leftJoin(schema.users, eq(schema.users.id, schema.invitations.inviterId))
    .where(and(eq(schema.invitations.organizationId, ctx.shop.id), eq(schema.invitations.status, 'pending'), inArray(schema.invitations.role, roles)))
    .orderBy(asc(schema.invitations.email))
    .all()
    .filter((i) => i.expiresAt.getTime() > now);
  return {
    members: members.flatMap((m) => (isShopRole(m.role) ? [{ ...m, role: m.role, joinedAt: m.joinedAt.toISOString(), you: m.userId === ctx.user.id }] : [])),
    invitations: invitations.flatMap((i) => (i.role && isShopRole(i.role) ? [{ ...i, role: i.role, expiresAt: i.expiresAt.toISOString() }] : [])),
    roles,
    defaultRole: defaultStaffRole[ctx.shop.kind],
  };
}

/** A staff member of the shop by membership id; another shop's member, or a vehicle owner, is a 404. */
export function requireStaffMember(db: Reader, ctx: TeamViewer, memberId: string) {
  const row = db
    .select({ id: schema.memberships.id, userId: schema.memberships.userId, role: schema.memberships.role })
    .from(schema.memberships)
    .where(and(eq(schema.memberships.id, memberId), eq(schema.memberships.organizationId, ctx.shop.id)))
    .get();
  if (!row || !isStaffRole(ctx.shop.kind, row.role)) throw notFound('Team member');
  // The one acting stays a manager, so a shop always keeps someone who can manage its team.
  if (row.userId === ctx.user.id) throw forbidden('Ask another member of the team to change or remove your own place in it');
  return row;
}

/** The invitation with `id` sent to the signed-in person's address; anyone else's is a 404. */
export function loadOwnInvitation(db: Reader, id: string, email: string) {
  const row = db
    .select({ invitation: schema.invitations, shopName: schema.shops.name })
    .from(schema.invitations)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.invitations.organizationId))
    .where(eq(schema.invitations.id, id))
    .get();
  if (!row || row.invitation.email.toLowerCase() !== email.toLowerCase()) throw notFound('Invitation');
  const { invitation } = row;
  if (!invitation.role || !isShopRole(invitation.role)) throw notFound('Invitation');
  return { invitation, shopName: row.shopName, role: invitation.role };
}

export function invitationView(found: ReturnType<typeof loadOwnInvitation>, verified: boolean): InvitationView {
  const { invitation } = found;
  const expired = invitation.status === 'pending' && invitation.expiresAt.getTime() <= Date.now();
  const status = expired ? 'expired' : (invitation.status as InvitationView['status']);
  return { id: invitation.id, shopName: found.shopName, role: found.role, status, expiresAt: invitation.expiresAt.toISOString(), verified };
}

/** The shop's open-or-not staff invitation by id; another shop's, or a vehicle owner's, is a 404. */
export function requireStaffInvitation(db: Reader, shop: TeamViewer['shop'], id: string) {
  const row = db
    .select({ id: schema.invitations.id, status: schema.invitations.status, role: schema.invitations.role })
    .from(schema.invitations)
    .where(and(eq(schema.invitations.id, id), eq(schema.invitations.organizationId, shop.id)))
    .get();
  if (!row || !isStaffRole(shop.kind, row.role)) throw notFound('Invitation');
  return row;
}

/** After the sign-in library accepted it: the invited shop becomes the session's active shop, audited. */
export function recordAccepted(db: Db, who: { userId: string; sessionId: string }, invitation: { id: string; organizationId: string }) {
  db.transaction((tx) => {
    setActiveShop(tx, who.sessionId, invitation.organizationId);
    audit(tx, { shopId: invitation.organizationId, userId: who.userId, action: 'accept', entity: 'invitation', entityId: invitation.id });
  });
}
