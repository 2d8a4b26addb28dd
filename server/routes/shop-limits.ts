import { Router } from 'express';
import { DEFAULT_CHECK_LIMITS, resolveCheckLimits, type CheckLimitOverrides } from '@/calc/checks';
import { shopLimitsSaveSchema, type ShopLimitsResponse } from '@/shared/measurements';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { parse } from '../http';
import { loadShopLimits, saveShopLimits } from '../store/shop-limits';

function respond(limits: CheckLimitOverrides, version: number): ShopLimitsResponse {
  return { limits, version, resolved: resolveCheckLimits(limits), defaults: DEFAULT_CHECK_LIMITS };
}

/** The active shop's check limits: builder and tech read them; the builder changes them. */
export function shopLimitsRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/shop/limits', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    const { limits, version } = loadShopLimits(db, ctx.shop.id);
    res.json(respond(limits, version));
  });

  router.put('/shop/limits', async (req, res) => {
    const { version, limits } = parse(shopLimitsSaveSchema, req.body);
    // Merged with the defaults, a lone min or max must still make a sensible rule (e.g. a preload min under the default max).
    resolveCheckLimits(limits);
    // Grinders may update their own shop, but check limits belong to shops that measure engines.
    const ctx = await requireShopRole(auth, db, req, { shop: ['update'], measurement: ['read'] });
    const saved = saveShopLimits(db, actorOf(ctx), version, limits);
    res.json(respond(saved.limits, saved.version));
  });

  return router;
}
