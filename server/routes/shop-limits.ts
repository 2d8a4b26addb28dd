import { Router } from 'express';
import { and, eq } from 'drizzle-orm';

import { DEFAULT_CHECK_LIMITS, resolveCheckLimits, type CheckLimitOverrides } from '@/calc/checks';
import type { Db } from '@/db';
import { schema } from '@/db';
import { shopLimitsSaveSchema, type ShopLimitsResponse } from '@/shared/measurements';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, parse } from '../http';

/** The shop's overrides and version (version 0 and `{}` when the shop never saved any). */
export function loadShopLimits(db: Pick<Db, 'select'>, shopId: string): { limits: CheckLimitOverrides; version: number } {
  const row = db.select().from(schema.shopSettings).where(eq(schema.shopSettings.shopId, shopId)).get();
  return row ? { limits: row.limits, version: row.version } : { limits: {}, version: 0 };
}

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
    const saved = db.transaction((tx) => {
      const current = loadShopLimits(tx, ctx.shop.id);
      if (current.version !== version) {
        throw conflict(
          `Someone saved this shop's limits after you opened them (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
        );
      }
      const row =
        version === 0
          ? tx.insert(schema.shopSettings).values({ shopId: ctx.shop.id, limits, version: 1 }).onConflictDoNothing().returning().get()
          : tx
              .update(schema.shopSettings)
              .set({ limits, version: version + 1 })
              .where(and(eq(schema.shopSettings.shopId, ctx.shop.id), eq(schema.shopSettings.version, version)))
              .returning()
              .get();
      if (!row) throw conflict("The shop's limits changed while saving. Reload and try again.");
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: version === 0 ? 'create' : 'update',
        entity: 'shop-limits',
        entityId: ctx.shop.id,
        detail: { version: row.version, rules: Object.keys(limits) },
      });
      return row;
    });
    res.json(respond(saved.limits, saved.version));
  });

  return router;
}
