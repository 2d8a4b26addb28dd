import { and, desc, eq, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { measurementKinds, type Measurement, type MeasurementData, type MeasurementKind } from '@/shared/measurements';

import { conflict, notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireJob } from './jobs';

type MeasurementRow = typeof schema.measurements.$inferSelect;

export function toMeasurement(row: MeasurementRow): Measurement {
  return {
    id: row.id,
    jobId: row.jobId,
    kind: row.kind,
    data: row.data,
    note: row.note,
    version: row.version,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Newest first; rowid breaks ties between rows written in the same millisecond. */
const newestMeasurementFirst = [desc(schema.measurements.createdAt), desc(sql`${schema.measurements}.rowid`)] as const;

const inShop = (shopId: string, id: string) => and(eq(schema.measurements.id, id), eq(schema.measurements.shopId, shopId));

/** The job's measurements, newest first, of one kind when asked; a 404 for another shop's job. */
export function jobMeasurements(db: Reader, shopId: string, jobId: string, kind?: MeasurementKind): Measurement[] {
  requireJob(db, shopId, jobId);
  return db
    .select()
    .from(schema.measurements)
    .where(and(eq(schema.measurements.jobId, jobId), eq(schema.measurements.shopId, shopId), kind ? eq(schema.measurements.kind, kind) : undefined))
    .orderBy(...newestMeasurementFirst)
    .all()
    .map(toMeasurement);
}

/** The job's latest measurement of each kind. */
export function latestMeasurements(db: Reader, shopId: string, jobId: string): Partial<MeasurementData> {
  const out: Partial<Record<MeasurementKind, unknown>> = {};
  for (const kind of measurementKinds) {
    const row = db
      .select({ data: schema.measurements.data })
      .from(schema.measurements)
      .where(and(eq(schema.measurements.jobId, jobId), eq(schema.measurements.shopId, shopId), eq(schema.measurements.kind, kind)))
      .orderBy(...newestMeasurementFirst)
      .limit(1)
      .get();
    if (row) out[kind] = row.data;
  }
  return out as Partial<MeasurementData>;
}

export function loadMeasurement(db: Reader, shopId: string, id: string): Measurement {
  const row = db.select().from(schema.measurements).where(inShop(shopId, id)).get();
  if (!row) throw notFound('Measurement');
  return toMeasurement(row);
}

type NewMeasurement = { [K in MeasurementKind]: { kind: K; data: MeasurementData[K] } }[MeasurementKind] & { note: string };

/** Records a measurement on the job; `detail` adds to the audit row (a lobe table's file and size). */
export function createMeasurement(db: Db, who: Actor, jobId: string, body: NewMeasurement, detail: Record<string, unknown> = {}): Measurement {
  const row = db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const created = tx
      .insert(schema.measurements)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, jobId, kind: body.kind, data: body.data, note: body.note, createdBy: who.userId })
      .returning()
      .get();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'create',
      entity: 'measurement',
      entityId: created.id,
      detail: { jobId, kind: body.kind, ...detail },
    });
    return created;
  });
  return toMeasurement(row);
}

/**
 * Saves a measurement at `version`. The stored kind decides how new data is read, so
 * `readData` gets the kind and returns the checked data (or throws the 400 naming `data.*`).
 */
export function updateMeasurement(
  db: Db,
  who: Actor,
  id: string,
  body: { version: number; note?: string; data?: unknown },
  readData: (kind: MeasurementKind) => MeasurementData[MeasurementKind],
  fields: string[],
): Measurement {
  const row = db.transaction((tx) => {
    const current = tx.select().from(schema.measurements).where(inShop(who.shopId, id)).get();
    if (!current) throw notFound('Measurement');
    const data = body.data === undefined ? current.data : readData(current.kind);
    if (current.version !== body.version) {
      throw conflict(
        `Someone saved this measurement after you opened it (version ${current.version}, yours ${body.version}). Reload to see their changes, then edit again.`,
      );
    }
    const updated = tx
      .update(schema.measurements)
      .set({ data, note: body.note ?? current.note, version: body.version + 1 })
      .where(and(inShop(who.shopId, id), eq(schema.measurements.version, body.version)))
      .returning()
      .get();
    if (!updated) throw conflict('This measurement changed while saving. Reload and try again.');
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'update',
      entity: 'measurement',
      entityId: id,
      detail: { kind: current.kind, version: updated.version, fields },
    });
    return updated;
  });
  return toMeasurement(row);
}

export function deleteMeasurement(db: Db, who: Actor, id: string) {
  db.transaction((tx) => {
    const current = tx
      .select({ kind: schema.measurements.kind, jobId: schema.measurements.jobId })
      .from(schema.measurements)
      .where(inShop(who.shopId, id))
      .get();
    if (!current) throw notFound('Measurement');
    tx.delete(schema.measurements).where(inShop(who.shopId, id)).run();
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'delete', entity: 'measurement', entityId: id, detail: current });
  });
}
