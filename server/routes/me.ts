import { Router } from 'express';

import { activeShopSchema, shopCreateSchema, type Me } from '@/shared/me';

import { requireSignedIn } from '../access';
import type { AppDeps } from '../deps';
import { forbidden, parse } from '../http';
import { createShop, setActiveShop, shopsOf } from '../store/sessions';

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
    setActiveShop(db, signed.sessionId, shopId);
    res.json(describe(signed.user, shopId));
  });

  /** A new account's first shop: the creator becomes its builder (repair) or grinder (grinding). */
  router.post('/shops', async (req, res) => {
    const body = parse(shopCreateSchema, req.body);
    const signed = await requireSignedIn(auth, db, req);
    const role = body.kind === 'repair' ? 'builder' : 'grinder';
    const shopId = createShop(db, { userId: signed.user.id, sessionId: signed.sessionId }, body, role);
    res.status(201).json(describe(signed.user, shopId));
  });

  return router;
}
