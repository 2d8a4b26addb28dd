import { Router, type Request } from 'express';
import { isAPIError } from 'better-auth/api';
import { fromNodeHeaders } from 'better-auth/node';

import { isStaffRole, roleLabels, staffRoles, type ShopKind, type ShopRole } from '@/shared/roles';
import { inviteSchema, memberRoleSchema } from '@/shared/team';

import { requireSignedIn, requireTeamManager } from '../access';
import type { AppDeps } from '../deps';
import { forbidden, HttpError, parse } from '../http';
import { audit } from '../store/audit';
import { invitationView, loadOwnInvitation, loadTeam, recordAccepted, requireStaffInvitation, requireStaffMember } from '../store/team';

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
  if (isStaffRole(kind, role)) return;
  const names = staffRoles[kind].map((r) => roleLabels[r].toLowerCase()).join(' or ');
  throw new HttpError(400, 'invalid', `role: A ${kind === 'repair' ? 'repair' : 'grinding'} shop's staff are ${names}`, { role: `Choose ${names}` });
}

/**
 * A shop's team: builders (repair) and grinders (grinding) invite staff by e-mail, withdraw an
 * invitation, change a member's role and remove a member, through the sign-in library's own
 * invitation and member features. The invited person opens their invitation here too.
 */
export function teamRouter({ db, auth }: AppDeps) {
  const router = Router();
  const headersOf = (req: Request) => fromNodeHeaders(req.headers);
  const manager = (req: Request) => requireTeamManager(auth, db, req);

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
    audit(db, {
      shopId: ctx.shop.id,
      userId: ctx.user.id,
      action: 'invite',
      entity: 'invitation',
      entityId: invitation.id,
      detail: { email: body.email, role: body.role },
    });
    res.status(201).json(loadTeam(db, ctx));
  });

  router.delete('/shop/invitations/:id', async (req, res) => {
    const ctx = await manager(req);
    const row = requireStaffInvitation(db, ctx.shop, req.params.id);
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
      audit(db, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'change-role',
        entity: 'member',
        entityId: member.id,
        detail: { from: member.role, to: role },
      });
    }
    res.json(loadTeam(db, ctx));
  });

  router.delete('/shop/members/:id', async (req, res) => {
    const ctx = await manager(req);
    const member = requireStaffMember(db, ctx, req.params.id);
    await library(() => auth.api.removeMember({ headers: headersOf(req), body: { memberIdOrEmail: member.id, organizationId: ctx.shop.id } }));
    audit(db, {
      shopId: ctx.shop.id,
      userId: ctx.user.id,
      action: 'remove',
      entity: 'member',
      entityId: member.id,
      detail: { userId: member.userId, role: member.role },
    });
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
    recordAccepted(db, { userId: signed.user.id, sessionId: signed.sessionId }, found.invitation);
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
