import { and, asc, eq, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { Photo } from '@/shared/measurements';

import { notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireJob } from './jobs';

export type PhotoRow = typeof schema.photos.$inferSelect;

export function toPhoto(row: PhotoRow): Photo {
  return {
    id: row.id,
    jobId: row.jobId,
    originalName: row.originalName,
    caption: row.caption,
    mimeType: row.mimeType,
    size: row.size,
    shareable: row.shareable,
    url: `/api/photos/${row.id}/file`,
    createdAt: row.createdAt.toISOString(),
  };
}

const inShop = (shopId: string, id: string) => and(eq(schema.photos.id, id), eq(schema.photos.shopId, shopId));

/** The job's photos in the order they were taken in; a 404 for another shop's job. */
export function jobPhotos(db: Reader, shopId: string, jobId: string): Photo[] {
  requireJob(db, shopId, jobId);
  return db
    .select()
    .from(schema.photos)
    .where(and(eq(schema.photos.jobId, jobId), eq(schema.photos.shopId, shopId)))
    .orderBy(asc(schema.photos.createdAt), asc(sql`${schema.photos}.rowid`))
    .all()
    .map(toPhoto);
}

/** The stored photo row in the shop (its file name included), or a 404. */
export function requirePhotoRow(db: Reader, shopId: string, id: string): PhotoRow {
  const row = db.select().from(schema.photos).where(inShop(shopId, id)).get();
  if (!row) throw notFound('Photo');
  return row;
}

/** A photo of the job the shop marked shareable (the owner's page shows only those), or a 404. */
export function requireShareablePhoto(db: Reader, link: { shopId: string; jobId: string }, id: string): PhotoRow {
  const row = db
    .select()
    .from(schema.photos)
    .where(and(eq(schema.photos.id, id), eq(schema.photos.jobId, link.jobId), eq(schema.photos.shopId, link.shopId), eq(schema.photos.shareable, true)))
    .get();
  if (!row) throw notFound('Photo');
  return row;
}

/** The job's shareable photos, oldest first, for the owner's page. */
export function shareablePhotos(db: Reader, link: { shopId: string; jobId: string }) {
  return db
    .select({ id: schema.photos.id, caption: schema.photos.caption })
    .from(schema.photos)
    .where(and(eq(schema.photos.jobId, link.jobId), eq(schema.photos.shopId, link.shopId), eq(schema.photos.shareable, true)))
    .orderBy(asc(schema.photos.createdAt))
    .all();
}

export type StoredPhoto = { id: string; storedName: string; originalName: string; mimeType: PhotoRow['mimeType']; size: number };

/** Records files already stored under the shop's folder, one row and audit row each. */
export function insertPhotos(db: Db, who: Actor, jobId: string, stored: StoredPhoto[], caption: string): Photo[] {
  const rows = db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const inserted = stored.map((s) =>
      tx
        .insert(schema.photos)
        .values({ ...s, shopId: who.shopId, jobId, caption, createdBy: who.userId })
        .returning()
        .get(),
    );
    for (const p of inserted) {
      audit(tx, {
        shopId: who.shopId,
        userId: who.userId,
        action: 'create',
        entity: 'photo',
        entityId: p.id,
        detail: { jobId, originalName: p.originalName, mimeType: p.mimeType, size: p.size },
      });
    }
    return inserted;
  });
  return rows.map(toPhoto);
}

export function updatePhoto(db: Db, who: Actor, id: string, body: { caption?: string; shareable?: boolean }): Photo {
  const row = db.transaction((tx) => {
    const current = tx.select({ id: schema.photos.id }).from(schema.photos).where(inShop(who.shopId, id)).get();
    if (!current) throw notFound('Photo');
    const updated =
      Object.keys(body).length === 0
        ? tx.select().from(schema.photos).where(inShop(who.shopId, id)).get()
        : tx.update(schema.photos).set(body).where(inShop(who.shopId, id)).returning().get();
    if (!updated) throw notFound('Photo');
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'update', entity: 'photo', entityId: id, detail: { fields: Object.keys(body) } });
    return updated;
  });
  return toPhoto(row);
}

/** Removes the photo's row (the caller removes its file after); returns the row as it was. */
export function deletePhoto(db: Db, who: Actor, id: string): PhotoRow {
  return db.transaction((tx) => {
    const current = tx.select().from(schema.photos).where(inShop(who.shopId, id)).get();
    if (!current) throw notFound('Photo');
    tx.delete(schema.photos).where(inShop(who.shopId, id)).run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'delete',
      entity: 'photo',
      entityId: id,
      detail: { jobId: current.jobId, originalName: current.originalName },
    });
    return current;
  });
}
