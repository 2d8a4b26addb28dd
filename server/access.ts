import type { Request } from 'express';
import { fromNodeHeaders } from 'better-auth/node';

import type { Db } from '@/db';
import { isShopRole, managesTeam, roleAllows, type Permission, type ShopKind, type ShopRole } from '@/shared/roles';

import type { Auth } from './auth';
import { forbidden, HttpError } from './http';
import type { Actor } from './store/db';
import { liveSession, membershipIn } from './store/sessions';

export type Signed = {
  user: { id: string; name: string; email: string; emailVerified: boolean };
  sessionId: string;
  activeShopId: string | null;
};

export type InShop = Signed & {
  shop: { id: string; name: string; kind: ShopKind };
  role: ShopRole;
};

type KnownSession = { user: Signed['user']; sessionId: string; until: number };

/** How long a cookie's session lookup is reused; the session row itself is re-read on every request. */
const SESSION_REUSE_MS = 30_000;
const SESSION_CACHE_MAX = 5_000;
/** Per app (per auth instance): the exact Cookie header → the session better-auth verified for it. */
const knownSessions = new WeakMap<Auth, Map<string, KnownSession>>();

/**
 * Verifying a session cookie costs more than the rest of a typical read, so
 * the verified answer is reused for a short while for the exact same Cookie
 * header. Only the cookie → session mapping is reused: every request still
 * reads the session row, so a sign-out, an expired session or a shop switch
 * takes effect at once.
 */
async function verifiedSession(auth: Auth, req: Request): Promise<KnownSession | null> {
  const cookie = req.headers.cookie;
  let cache = knownSessions.get(auth);
  if (!cache) knownSessions.set(auth, (cache = new Map()));
  const now = Date.now();
  const hit = cookie ? cache.get(cookie) : undefined;
  if (hit && hit.until > now) return hit;
  const found = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
  if (!found) return null;
  const known = {
    user: { id: found.user.id, name: found.user.name, email: found.user.email, emailVerified: found.user.emailVerified },
    sessionId: found.session.id,
    until: Math.min(now + SESSION_REUSE_MS, new Date(found.session.expiresAt).getTime()),
  };
  if (cookie) {
    if (cache.size >= SESSION_CACHE_MAX) cache.delete(cache.keys().next().value!);
    cache.set(cookie, known);
  }
  return known;
}

/** Reads the session cookie; 401 when nobody is signed in (or the session has ended). */
export async function requireSignedIn(auth: Auth, db: Db, req: Request): Promise<Signed> {
  const known = await verifiedSession(auth, req);
  const live = known ? liveSession(db, known.sessionId) : undefined;
  if (!known || !live || live.expiresAt.getTime() <= Date.now()) throw new HttpError(401, 'unauthenticated', 'Sign in to continue');
  return {
    user: { id: known.user.id, name: live.name, email: live.email, emailVerified: live.emailVerified },
    sessionId: known.sessionId,
    activeShopId: live.activeShopId ?? null,
  };
}

/** The person's membership in their active shop, checked against `permission` (403 when the role lacks it). */
export async function requireShopRole(auth: Auth, db: Db, req: Request, permission: Permission): Promise<InShop> {
  const ctx = await requireMember(auth, db, req);
  if (!roleAllows(ctx.role, permission)) throw forbidden();
  return ctx;
}

/** The person's membership in their active shop, whatever the role (routes that decide by record, like orders). */
export async function requireMember(auth: Auth, db: Db, req: Request): Promise<InShop> {
  const signed = await requireSignedIn(auth, db, req);
  if (!signed.activeShopId) throw forbidden('Choose a shop first: you are not working in any shop');
  const row = membershipIn(db, signed.user.id, signed.activeShopId);
  if (!row || !isShopRole(row.role)) throw forbidden('You are no longer a member of this shop');
  return { ...signed, shop: { id: row.id, name: row.name, kind: row.kind }, role: row.role };
}

/** Whoever manages the shop's team and its mail: a builder of a repair shop, a grinder of a grinding shop. */
export async function requireTeamManager(auth: Auth, db: Db, req: Request): Promise<InShop> {
  const ctx = await requireMember(auth, db, req);
  if (!managesTeam(ctx.shop.kind, ctx.role)) throw forbidden();
  return ctx;
}

/** The person acting and their active shop, as the store takes them. */
export const actorOf = (ctx: InShop): Actor => ({ shopId: ctx.shop.id, userId: ctx.user.id });
