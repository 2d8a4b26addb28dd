import { and, asc, eq, max } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { defaultChecklistLabels, type ChecklistItem } from '@/shared/measurements';

import { notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireJob } from './jobs';

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

export function loadItem(db: Reader, shopId: string, id: string) {
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
export function seedChecklist(tx: Tx, shopId: string, jobId: string, userId: string | null, idFor: (index: number) => string = () => crypto.randomUUID()) {
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

/** The job's checklist in order, seeded with the defaults on its first read; a 404 for another shop's job. */
export function jobChecklist(db: Db, who: Actor, jobId: string): ChecklistItem[] {
  const items = db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    seedChecklist(tx, who.shopId, jobId, who.userId);
    return tx
      .select(itemColumns)
      .from(schema.checklistItems)
      .leftJoin(schema.users, eq(schema.users.id, schema.checklistItems.doneBy))
      .where(and(eq(schema.checklistItems.shopId, who.shopId), eq(schema.checklistItems.jobId, jobId)))
      .orderBy(asc(schema.checklistItems.position), asc(schema.checklistItems.id))
      .all();
  });
  return items.map(toItem);
}

/** Adds an item at the end of the job's checklist (after the defaults, which a first use writes). */
export function addChecklistItem(db: Db, who: Actor, jobId: string, label: string): ChecklistItem {
  return db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    // Adding first is still a first use: the defaults come before the new item.
    seedChecklist(tx, who.shopId, jobId, who.userId);
    const last = tx
      .select({ position: max(schema.checklistItems.position) })
      .from(schema.checklistItems)
      .where(and(eq(schema.checklistItems.jobId, jobId), eq(schema.checklistItems.shopId, who.shopId)))
      .get();
    const id = crypto.randomUUID();
    tx.insert(schema.checklistItems)
      .values({ id, shopId: who.shopId, jobId, label, position: (last?.position ?? 0) + 1 })
      .run();
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'create', entity: 'checklist-item', entityId: id, detail: { jobId, label } });
    return loadItem(tx, who.shopId, id);
  });
}

/** Ticks or unticks an item; ticking a ticked item keeps the first tick's who and when. */
export function tickChecklistItem(db: Db, who: Actor, id: string, done: boolean): ChecklistItem {
  return db.transaction((tx) => {
    const current = loadItem(tx, who.shopId, id);
    if (done !== (current.doneAt !== null)) {
      tx.update(schema.checklistItems)
        .set(done ? { doneAt: new Date(), doneBy: who.userId } : { doneAt: null, doneBy: null })
        .where(and(eq(schema.checklistItems.id, id), eq(schema.checklistItems.shopId, who.shopId)))
        .run();
      audit(tx, {
        shopId: who.shopId,
        userId: who.userId,
        action: done ? 'tick' : 'untick',
        entity: 'checklist-item',
        entityId: id,
        detail: { jobId: current.jobId },
      });
    }
    return loadItem(tx, who.shopId, id);
  });
}

export function deleteChecklistItem(db: Db, who: Actor, id: string) {
  db.transaction((tx) => {
    const current = loadItem(tx, who.shopId, id);
    tx.delete(schema.checklistItems)
      .where(and(eq(schema.checklistItems.id, id), eq(schema.checklistItems.shopId, who.shopId)))
      .run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'delete',
      entity: 'checklist-item',
      entityId: id,
      detail: { jobId: current.jobId, label: current.label },
    });
  });
}
