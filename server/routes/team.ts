import { Router, type Request } from 'express';
import { and, asc, eq, inArray } from 'drizzle-orm';
import { isAPIError } from 'better-auth/api';
import { fromNodeHeaders } from 'better-auth/node';

import type { Db } from '@/db';
import { schema } from '@/db';
import { isShopRole, managesTeam, roleLabels, staffRoles, type ShopKind, type ShopRole } from '@/shared/roles';
import { inviteSchema, memberRoleSchema, type InvitationView, type Team } from '@/shared/team';

import { requireMember, requireSignedIn, type InShop } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { forbidden, HttpError, notFound, parse } from '../http';

/**
 * A call into the sign-in library's organization feature (its invitations and members), with its
 * refusals turned into our error shape. The library runs its own checks (the inviter's permission,
 * an address already in the shop or already invited, the last builder) after ours.
 */
async function library<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (error) {
    if (!isAPIError(error)) throw error;
    const body = (error.body ?? {}) as { code?: string; message?: string };
    const status = error.statusCode >= 400 && error.statusCode < 500 ? error.statusCode : 400;
    throw new HttpError(status === 401 ? 403 : status, (body.code ?? 'refused').toLowerCase(), body.message ?? 'The sign-in service refused this change');
  }
}

/** A staff role this kind of shop gives, or a 400 naming the field. */
function requireStaffRole(kind: ShopKind, role: ShopRole) {
  const allowed: readonly ShopRole[] = staffRoles[kind];
  if (allowed.includes(role)) return;
  const names = allowed.map((r) => roleLabels[r].toLowerCase()).join(' or ');
  throw new HttpError(400, 'invalid', `role: A ${kind === 'repair' ? 'repair' : 'grinding'} shop's staff are ${names}`, { role: `Choose ${names}` });
}

/** The shop's staff (vehicle owners are not the team) and its open invitations. */
function loadTeam(db: Pick<Db, 'select'>, ctx: InShop): Team {
  const roles = [...staffRoles[ctx.shop.kind]];
  const members = db
    .select({ id: schema.memberships.id, userId: schema.users.id, name: schema.users.name, email: schema.users.email, role: schema.memberships.role, joinedAt: schema.memberships.createdAt })
    .from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.userId))
    .where(and(eq(schema.memberships.organizationId, ctx.shop.id), inArray(schema.memberships.role, roles)))
    .orderBy(asc(schema.users.name), asc(schema.memberships.id))
    .all();
  const now = Date.now();
  const invitations = db
    .select({ id: schema.invitations.id, email: schema.invitations.email, role: schema.invitations.role, expiresAt: schema.invitations.expiresAt, invitedBy: schema.users.name })
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
  };
}

/** A staff member of the shop by membership id; another shop's member, or a vehicle owner, is a 404. */
function requireStaffMember(db: Pick<Db, 'select'>, ctx: InShop, memberId: string) {
  const row = db
    .select({ id: schema.memberships.id, userId: schema.memberships.userId, role: schema.memberships.role })
    .from(schema.memberships)
    .where(and(eq(schema.memberships.id, memberId), eq(schema.memberships.organizationId, ctx.shop.id)))
    .get();
  const staff: readonly string[] = staffRoles[ctx.shop.kind];
  if (!row || !staff.includes(row.role)) throw notFound('Team member');
  // The one acting stays a manager, so a shop always keeps someone who can manage its team.
  if (row.userId === ctx.user.id) throw forbidden('Ask another member of the team to change or remove your own place in it');
  return row;
}

/** The invitation with `id` sent to the signed-in person's address; anyone else's is a 404. */
function loadOwnInvitation(db: Pick<Db, 'select'>, id: string, email: string) {
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

function invitationView(found: ReturnType<typeof loadOwnInvitation>, verified: boolean): InvitationView {
  const { invitation } = found;
  const expired = invitation.status === 'pending' && invitation.expiresAt.getTime() <= Date.now();
  const status = expired ? 'expired' : (invitation.status as InvitationView['status']);
  return { id: invitation.id, shopName: found.shopName, role: found.role, status, expiresAt: invitation.expiresAt.toISOString(), verified };
}

/**
 * A shop's team: builders (repair) and grinders (grinding) invite staff by e-mail, withdraw an
 * invitation, change a member's role and remove a member, through the sign-in library's own
 * invitation and member features. The invited person opens their invitation here too.
 */
export function teamRouter({ db, auth }: AppDeps) {
  const router = Router();
  const headersOf = (req: Request) => fromNodeHeaders(req.headers);
  /** A builder of a repair shop or a grinder of a grinding shop: whoever manages the team. */
  const manager = async (req: Request) => {
    const ctx = await requireMember(auth, db, req);
    if (!managesTeam(ctx.shop.kind, ctx.role)) throw forbidden();
    return ctx;
  };

  router.get('/shop/team', async (req, res) => {
    const ctx = await manager(req);
    res.json(loadTeam(db, ctx));
  });

  router.post('/shop/invitations', async (req, res) => {
    const body = parse(inviteSchema, req.body);
    const ctx = await manager(req);
    requireStaffRole(ctx.shop.kind, body.role);
    const invitation = await library(() =>
      auth.api.createInvitation({ headers: headersOf(req), body: { email: body.email, role: body.role, organizationId: ctx.shop.id } }),
    );
    audit(db, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'invite', entity: 'invitation', entityId: invitation.id, detail: { email: body.email, role: body.role } });
    res.status(201).json(loadTeam(db, ctx));
  });

  router.delete('/shop/invitations/:id', async (req, res) => {
    const ctx = await manager(req);
    const row = db
      .select({ id: schema.invitations.id, status: schema.invitations.status, role: schema.invitations.role })
      .from(schema.invitations)
      .where(and(eq(schema.invitations.id, req.params.id), eq(schema.invitations.organizationId, ctx.shop.id)))
      .get();
    const staff: readonly (string | null)[] = staffRoles[ctx.shop.kind];
    if (!row || !staff.includes(row.role)) throw notFound('Invitation');
    if (row.status !== 'pending') throw new HttpError(409, 'conflict', 'This invitation is no longer open');
    await library(() => auth.api.cancelInvitation({ headers: headersOf(req), body: { invitationId: row.id } }));
    audit(db, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'withdraw', entity: 'invitation', entityId: row.id });
    res.json(loadTeam(db, ctx));
  });

  router.patch('/shop/members/:id', async (req, res) => {
    const { role } = parse(memberRoleSchema, req.body);
    const ctx = await manager(req);
    const member = requireStaffMember(db, ctx, req.params.id);
    requireStaffRole(ctx.shop.kind, role);
    if (member.role !== role) {
      await library(() => auth.api.updateMemberRole({ headers: headersOf(req), body: { memberId: member.id, role, organizationId: ctx.shop.id } }));
      audit(db, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'change-role', entity: 'member', entityId: member.id, detail: { from: member.role, to: role } });
    }
    res.json(loadTeam(db, ctx));
  });

  router.delete('/shop/members/:id', async (req, res) => {
    const ctx = await manager(req);
    const member = requireStaffMember(db, ctx, req.params.id);
    await library(() => auth.api.removeMember({ headers: headersOf(req), body: { memberIdOrEmail: member.id, organizationId: ctx.shop.id } }));
    audit(db, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'remove', entity: 'member', entityId: member.id, detail: { userId: member.userId, role: member.role } });
    res.json(loadTeam(db, ctx));
  });

  router.get('/invitations/:id', async (req, res) => {
    const signed = await requireSignedIn(auth, db, req);
    res.json(invitationView(loadOwnInvitation(db, req.params.id, signed.user.email), signed.user.emailVerified));
  });

  router.post('/invitations/:id/accept', async (req, res) => {
    const signed = await requireSignedIn(auth, db, req);
    const found = loadOwnInvitation(db, req.params.id, signed.user.email);
    if (!signed.user.emailVerified) throw forbidden('Verify your e-mail address first: the mail we sent you has the link');
    await library(() => auth.api.acceptInvitation({ headers: headersOf(req), body: { invitationId: found.invitation.id } }));
    db.transaction((tx) => {
      tx.update(schema.sessions).set({ activeOrganizationId: found.invitation.organizationId }).where(eq(schema.sessions.id, signed.sessionId)).run();
      audit(tx, { shopId: found.invitation.organizationId, userId: signed.user.id, action: 'accept', entity: 'invitation', entityId: found.invitation.id });
    });
    res.json(invitationView(loadOwnInvitation(db, req.params.id, signed.user.email), true));
  });

  router.post('/invitations/:id/decline', async (req, res) => {
    const signed = await requireSignedIn(auth, db, req);
    const found = loadOwnInvitation(db, req.params.id, signed.user.email);
    if (!signed.user.emailVerified) throw forbidden('Verify your e-mail address first: the mail we sent you has the link');
    await library(() => auth.api.rejectInvitation({ headers: headersOf(req), body: { invitationId: found.invitation.id } }));
    audit(db, { shopId: found.invitation.organizationId, userId: signed.user.id, action: 'decline', entity: 'invitation', entityId: found.invitation.id });
    res.json(invitationView(loadOwnInvitation(db, req.params.id, signed.user.email), true));
  });

  return router;
}
