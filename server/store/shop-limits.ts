import { and, eq } from 'drizzle-orm';

import type { CheckLimitOverrides } from '@/calc/checks';
import type { Db } from '@/db';
import { schema } from '@/db';

import { conflict } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';

/** The shop's overrides and version (version 0 and `{}` when the shop never saved any). */
export function loadShopLimits(db: Reader, shopId: string): { limits: CheckLimitOverrides; version: number } {
  const row = db.select().from(schema.shopSettings).where(eq(schema.shopSettings.shopId, shopId)).get();
  return row ? { limits: row.limits, version: row.version } : { limits: {}, version: 0 };
}

/** Saves the shop's overrides at `version` (0 writes the first). */
export function saveShopLimits(db: Db, who: Actor, version: number, limits: CheckLimitOverrides): { limits: CheckLimitOverrides; version: number } {
  const row = db.transaction((tx) => {
    const current = loadShopLimits(tx, who.shopId);
    if (current.version !== version) {
      throw conflict(
        `Someone saved this shop's limits after you opened them (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
      );
    }
    const saved =
      version === 0
        ? tx.insert(schema.shopSettings).values({ shopId: who.shopId, limits, version: 1 }).onConflictDoNothing().returning().get()
        : tx
            .update(schema.shopSettings)
            .set({ limits, version: version + 1 })
            .where(and(eq(schema.shopSettings.shopId, who.shopId), eq(schema.shopSettings.version, version)))
            .returning()
            .get();
    if (!saved) throw conflict("The shop's limits changed while saving. Reload and try again.");
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: version === 0 ? 'create' : 'update',
      entity: 'shop-limits',
      entityId: who.shopId,
      detail: { version: saved.version, rules: Object.keys(limits) },
    });
    return saved;
  });
  return { limits: row.limits, version: row.version };
}
