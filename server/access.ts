import type { Request } from 'express';
import { and, eq } from 'drizzle-orm';
import { fromNodeHeaders } from 'better-auth/node';

import type { Db } from '@/db';
import { schema } from '@/db';
import { isShopRole, roleAllows, type Permission, type ShopKind, type ShopRole } from '@/shared/roles';

import type { Auth } from './auth';
import { forbidden, HttpError } from './http';

export type Signed = {
  user: { id: string; name: string; email: string };
  sessionId: string;
  activeShopId: string | null;
};

export type InShop = Signed & {
  shop: { id: string; name: string; kind: ShopKind };
  role: ShopRole;
};

/** Reads the session cookie; 401 when nobody is signed in. */
export async function requireSignedIn(auth: Auth, req: Request): Promise<Signed> {
  const found = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
  if (!found) throw new HttpError(401, 'unauthenticated', 'Sign in to continue');
  return {
    user: { id: found.user.id, name: found.user.name, email: found.user.email },
    sessionId: found.session.id,
    activeShopId: found.session.activeOrganizationId ?? null,
  };
}

/** The person's membership in their active shop, checked against `permission` (403 when the role lacks it). */
export async function requireShopRole(
  auth: Auth,
  db: Db,
  req: Request,
  permission: Permission,
): Promise<InShop> {
  const ctx = await requireMember(auth, db, req);
  if (!roleAllows(ctx.role, permission)) throw forbidden();
  return ctx;
}

/** The person's membership in their active shop, whatever the role (routes that decide by record, like orders). */
export async function requireMember(auth: Auth, db: Db, req: Request): Promise<InShop> {
  const signed = await requireSignedIn(auth, req);
  if (!signed.activeShopId) throw forbidden('Choose a shop first: you are not working in any shop');
  const row = db
    .select({
      role: schema.memberships.role,
      id: schema.shops.id,
      name: schema.shops.name,
      kind: schema.shops.kind,
    })
    .from(schema.memberships)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.memberships.organizationId))
    .where(
      and(eq(schema.memberships.userId, signed.user.id), eq(schema.memberships.organizationId, signed.activeShopId)),
    )
    .get();
  if (!row || !isShopRole(row.role)) throw forbidden('You are no longer a member of this shop');
  return { ...signed, shop: { id: row.id, name: row.name, kind: row.kind }, role: row.role };
}
