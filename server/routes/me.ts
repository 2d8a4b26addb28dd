import { Router } from 'express';
import { asc, eq } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { activeShopSchema, shopCreateSchema, type Me, type MeShop } from '@/shared/me';
import { isShopRole } from '@/shared/roles';

import { requireSignedIn } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { forbidden, parse } from '../http';

function shopsOf(db: Db, userId: string): MeShop[] {
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

/** Who is signed in, their shops and roles, and which shop they are working in. */
export function meRouter({ db, auth }: AppDeps) {
  const router = Router();

  const describe = (user: Me['user'], activeShopId: string | null): Me => {
    const shops = shopsOf(db, user.id);
    return { user, shops, activeShop: shops.find((s) => s.id === activeShopId) ?? null };
  };

  router.get('/me', async (req, res) => {
    const signed = await requireSignedIn(auth, db, req);
    res.json(describe(signed.user, signed.activeShopId));
  });

  router.post('/me/active-shop', async (req, res) => {
    const { shopId } = parse(activeShopSchema, req.body);
    const signed = await requireSignedIn(auth, db, req);
    if (!shopsOf(db, signed.user.id).some((s) => s.id === shopId)) {
      throw forbidden('You are not a member of that shop');
    }
    db.update(schema.sessions)
      .set({ activeOrganizationId: shopId })
      .where(eq(schema.sessions.id, signed.sessionId))
      .run();
    res.json(describe(signed.user, shopId));
  });

  /** A new account's first shop: the creator becomes its builder (repair) or grinder (grinding). */
  router.post('/shops', async (req, res) => {
    const body = parse(shopCreateSchema, req.body);
    const signed = await requireSignedIn(auth, db, req);
    const role = body.kind === 'repair' ? 'builder' : 'grinder';
    const shopId = db.transaction((tx) => {
      const id = crypto.randomUUID();
      const slug = `${body.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')}-${id.slice(0, 8)}`;
      tx.insert(schema.shops).values({ id, name: body.name, slug, kind: body.kind }).run();
      tx.insert(schema.memberships)
        .values({ id: crypto.randomUUID(), organizationId: id, userId: signed.user.id, role })
        .run();
      tx.update(schema.sessions)
        .set({ activeOrganizationId: id })
        .where(eq(schema.sessions.id, signed.sessionId))
        .run();
      audit(tx, { shopId: id, userId: signed.user.id, action: 'create', entity: 'shop', entityId: id });
      return id;
    });
    res.status(201).json(describe(signed.user, shopId));
  });

  return router;
}

