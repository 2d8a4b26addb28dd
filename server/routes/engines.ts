import { Router } from 'express';
import { and, eq } from 'drizzle-orm';

import { schema } from '@/db';
import { engineSaveSchema, type EngineRecord } from '@/shared/engine';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, parse } from '../http';
import { requireJob } from '../scope';

type EngineRow = typeof schema.engines.$inferSelect;

export function toEngineRecord(row: EngineRow): EngineRecord {
  return { jobId: row.jobId, engine: row.spec, version: row.version, updatedAt: row.updatedAt.toISOString() };
}

/** The engine on a job: builder and tech read it, the builder saves it. Version 0 creates it. */
export function enginesRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/engine', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    const row = db
      .select()
      .from(schema.engines)
      .where(and(eq(schema.engines.jobId, req.params.jobId), eq(schema.engines.shopId, ctx.shop.id)))
      .get();
    res.json({ engine: row ? toEngineRecord(row) : null });
  });

  router.put('/jobs/:jobId/engine', async (req, res) => {
    const { version, engine } = parse(engineSaveSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const jobId = req.params.jobId;
    const { row, created } = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const current = tx
        .select({ version: schema.engines.version })
        .from(schema.engines)
        .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.shopId, ctx.shop.id)))
        .get();
      if (!current) {
        if (version !== 0) {
          throw conflict('This job has no engine saved yet, but your form was loaded from one. Reload and enter the engine again.');
        }
        const inserted = tx.insert(schema.engines).values({ jobId, shopId: ctx.shop.id, spec: engine }).returning().get();
        audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'engine', entityId: jobId });
        return { row: inserted, created: true };
      }
      if (current.version !== version) {
        throw conflict(
          `Someone saved this engine after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
        );
      }
      const updated = tx
        .update(schema.engines)
        .set({ spec: engine, version: version + 1 })
        .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.version, version)))
        .returning()
        .get();
      if (!updated) throw conflict('This engine changed while saving. Reload and try again.');
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'update',
        entity: 'engine',
        entityId: jobId,
        detail: { version: updated.version },
      });
      return { row: updated, created: false };
    });
    res.status(created ? 201 : 200).json({ engine: toEngineRecord(row) });
  });

  return router;
}
