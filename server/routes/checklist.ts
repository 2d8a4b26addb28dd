import { Router } from 'express';
import { and, asc, eq, max } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { checklistAddSchema, checklistPatchSchema, defaultChecklistLabels, type ChecklistItem } from '@/shared/measurements';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { notFound, parse } from '../http';
import { requireJob } from '../scope';

type Tx = Pick<Db, 'select' | 'insert' | 'update'>;

const itemColumns = {
  id: schema.checklistItems.id,
  jobId: schema.checklistItems.jobId,
  label: schema.checklistItems.label,
  position: schema.checklistItems.position,
  doneAt: schema.checklistItems.doneAt,
  doneById: schema.checklistItems.doneBy,
  doneByName: schema.users.name,
};

type ItemRow = { id: string; jobId: string; label: string; position: number; doneAt: Date | null; doneById: string | null; doneByName: string | null };

function toItem(row: ItemRow): ChecklistItem {
  return {
    id: row.id,
    jobId: row.jobId,
    label: row.label,
    position: row.position,
    doneAt: row.doneAt ? row.doneAt.toISOString() : null,
    doneBy: row.doneAt && row.doneById ? { id: row.doneById, name: row.doneByName ?? '' } : null,
  };
}

function loadItem(db: Pick<Db, 'select'>, shopId: string, id: string) {
  const row = db
    .select(itemColumns)
    .from(schema.checklistItems)
    .leftJoin(schema.users, eq(schema.users.id, schema.checklistItems.doneBy))
    .where(and(eq(schema.checklistItems.id, id), eq(schema.checklistItems.shopId, shopId)))
    .get();
  if (!row) throw notFound('Checklist item');
  return toItem(row);
}

/**
 * Writes the default items on a job the first time its checklist is read,
 * and marks the job so items the shop removes stay removed.
 */
export function seedChecklist(
  tx: Tx,
  shopId: string,
  jobId: string,
  userId: string | null,
  idFor: (index: number) => string = () => crypto.randomUUID(),
) {
  const job = tx
    .select({ seededAt: schema.jobs.checklistSeededAt })
    .from(schema.jobs)
    .where(and(eq(schema.jobs.id, jobId), eq(schema.jobs.shopId, shopId)))
    .get();
  if (!job || job.seededAt) return false;
  tx.insert(schema.checklistItems)
    .values(defaultChecklistLabels.map((label, i) => ({ id: idFor(i), shopId, jobId, label, position: i + 1 })))
    .onConflictDoNothing()
    .run();
  // Not through the versioned job edit: seeding is not a change anyone could conflict with.
  tx.update(schema.jobs)
    .set({ checklistSeededAt: new Date() })
    .where(and(eq(schema.jobs.id, jobId), eq(schema.jobs.shopId, shopId)))
    .run();
  audit(tx, { shopId, userId, action: 'seed', entity: 'checklist', entityId: jobId, detail: { items: defaultChecklistLabels.length } });
  return true;
}

/** A job's checklist: builder and tech read, tick, add and remove items. */
export function checklistRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/checklist', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    const jobId = req.params.jobId;
    const items = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      seedChecklist(tx, ctx.shop.id, jobId, ctx.user.id);
      return tx
        .select(itemColumns)
        .from(schema.checklistItems)
        .leftJoin(schema.users, eq(schema.users.id, schema.checklistItems.doneBy))
        .where(and(eq(schema.checklistItems.shopId, ctx.shop.id), eq(schema.checklistItems.jobId, jobId)))
        .orderBy(asc(schema.checklistItems.position), asc(schema.checklistItems.id))
        .all();
    });
    res.json({ items: items.map(toItem) });
  });

  router.post('/jobs/:jobId/checklist', async (req, res) => {
    const body = parse(checklistAddSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const jobId = req.params.jobId;
    const item = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      // Adding first is still a first use: the defaults come before the new item.
      seedChecklist(tx, ctx.shop.id, jobId, ctx.user.id);
      const last = tx
        .select({ position: max(schema.checklistItems.position) })
        .from(schema.checklistItems)
        .where(and(eq(schema.checklistItems.jobId, jobId), eq(schema.checklistItems.shopId, ctx.shop.id)))
        .get();
      const id = crypto.randomUUID();
      tx.insert(schema.checklistItems)
        .values({ id, shopId: ctx.shop.id, jobId, label: body.label, position: (last?.position ?? 0) + 1 })
        .run();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'checklist-item', entityId: id, detail: { jobId, label: body.label } });
      return loadItem(tx, ctx.shop.id, id);
    });
    res.status(201).json({ item });
  });

  router.patch('/checklist/:id', async (req, res) => {
    const { done } = parse(checklistPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    const item = db.transaction((tx) => {
      const current = loadItem(tx, ctx.shop.id, id);
      // Ticking a ticked item keeps the first tick's who and when.
      if (done !== (current.doneAt !== null)) {
        tx.update(schema.checklistItems)
          .set(done ? { doneAt: new Date(), doneBy: ctx.user.id } : { doneAt: null, doneBy: null })
          .where(and(eq(schema.checklistItems.id, id), eq(schema.checklistItems.shopId, ctx.shop.id)))
          .run();
        audit(tx, {
          shopId: ctx.shop.id,
          userId: ctx.user.id,
          action: done ? 'tick' : 'untick',
          entity: 'checklist-item',
          entityId: id,
          detail: { jobId: current.jobId },
        });
      }
      return loadItem(tx, ctx.shop.id, id);
    });
    res.json({ item });
  });

  router.delete('/checklist/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const id = req.params.id;
    db.transaction((tx) => {
      const current = loadItem(tx, ctx.shop.id, id);
      tx.delete(schema.checklistItems)
        .where(and(eq(schema.checklistItems.id, id), eq(schema.checklistItems.shopId, ctx.shop.id)))
        .run();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'delete',
        entity: 'checklist-item',
        entityId: id,
        detail: { jobId: current.jobId, label: current.label },
      });
    });
    res.status(204).end();
  });

  return router;
}
