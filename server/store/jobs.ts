import { and, count, desc, eq, gt, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { z } from 'zod';

import type { Job, jobCreateSchema, jobPatchSchema } from '@/shared/jobs';

import { conflict, HttpError, notFound } from '../http';
import type { PageRequest } from '../paging';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { prepared } from './prepared';

type JobRow = typeof schema.jobs.$inferSelect;

export function toJob(row: JobRow): Job {
  return {
    id: row.id,
    shopId: row.shopId,
    vehicle: row.vehicle,
    customerName: row.customerName,
    complaint: row.complaint,
    findings: row.findings,
    mileage: row.mileage,
    status: row.status,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The job with `id` in `shopId`, or a 404 (another shop's job looks the same as a missing one). */
export function requireJob(db: Reader, shopId: string, id: string) {
  const job = db
    .select({ id: schema.jobs.id, shopId: schema.jobs.shopId })
    .from(schema.jobs)
    .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, shopId)))
    .get();
  if (!job) throw notFound('Job');
  return job;
}

// Keyset paging, newest change first, on the (shop_id, updated_at, id) index; built once (the list is the busiest read).
// `at` is the cursor's updated_at in milliseconds, as the column stores it.
const jobsFirstPage = (db: Reader) =>
  prepared(db, 'jobs.first-page', (d) =>
    d
      .select()
      .from(schema.jobs)
      .where(eq(schema.jobs.shopId, sql.placeholder('shopId')))
      .orderBy(desc(schema.jobs.updatedAt), desc(schema.jobs.id))
      .limit(sql.placeholder('limit'))
      .prepare(),
  );

const jobsPageAfter = (db: Reader) =>
  prepared(db, 'jobs.page-after', (d) =>
    d
      .select()
      .from(schema.jobs)
      .where(
        and(
          eq(schema.jobs.shopId, sql.placeholder('shopId')),
          // A row-value comparison, so SQLite starts the index range at the cursor instead of filtering from the top.
          sql`(${schema.jobs.updatedAt}, ${schema.jobs.id}) < (${sql.placeholder('at')}, ${sql.placeholder('id')})`,
        ),
      )
      .orderBy(desc(schema.jobs.updatedAt), desc(schema.jobs.id))
      .limit(sql.placeholder('limit'))
      .prepare(),
  );

/** One page of the shop's jobs, newest change first, with one row more than the limit when there are more. */
export function jobPageRows(db: Reader, shopId: string, { limit, after }: PageRequest): JobRow[] {
  return after ? jobsPageAfter(db).all({ shopId, limit: limit + 1, at: after.at, id: after.id }) : jobsFirstPage(db).all({ shopId, limit: limit + 1 });
}

export function findJob(db: Reader, shopId: string, id: string): Job | undefined {
  const row = db
    .select()
    .from(schema.jobs)
    .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, shopId)))
    .get();
  return row ? toJob(row) : undefined;
}

/** The vehicle line of a job, for mail and the owner's list ('' when the job is gone). */
export function jobVehicle(db: Reader, jobId: string): string | undefined {
  return db.select({ vehicle: schema.jobs.vehicle }).from(schema.jobs).where(eq(schema.jobs.id, jobId)).get()?.vehicle;
}

export type JobCreateRateLimit = {
  /** Jobs one shop may create per window. */
  limit: number;
  /** Window length, milliseconds. */
  windowMs: number;
};

/** Creates a job, counted against the shop's rate in the same transaction (a 429 past it). */
export function createJob(db: Db, who: Actor, body: z.output<typeof jobCreateSchema>, rate: JobCreateRateLimit): Job {
  const row = db.transaction((tx) => {
    const [recent] = tx
      .select({ n: count() })
      .from(schema.jobs)
      .where(and(eq(schema.jobs.shopId, who.shopId), gt(schema.jobs.createdAt, new Date(Date.now() - rate.windowMs))))
      .all();
    if ((recent?.n ?? 0) >= rate.limit) {
      const minutes = Math.max(1, Math.round(rate.windowMs / 60_000));
      throw new HttpError(
        429,
        'rate_limited',
        `This shop has created ${rate.limit} jobs in the last ${minutes === 1 ? 'minute' : `${minutes} minutes`}. Wait a minute, then create the next one.`,
      );
    }
    const created = tx
      .insert(schema.jobs)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, createdBy: who.userId, ...body })
      .returning()
      .get();
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'create', entity: 'job', entityId: created.id });
    return created;
  });
  return toJob(row);
}

/** Saves a job's changes at `version` (a 409 when someone saved first). */
export function updateJob(db: Db, who: Actor, id: string, { version, ...changes }: z.output<typeof jobPatchSchema>): Job {
  const row = db.transaction((tx) => {
    const current = tx
      .select({ version: schema.jobs.version })
      .from(schema.jobs)
      .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, who.shopId)))
      .get();
    if (!current) throw notFound('Job');
    if (current.version !== version) {
      throw conflict(
        `Someone saved this job after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
      );
    }
    const updated = tx
      .update(schema.jobs)
      .set({ ...changes, version: version + 1 })
      .where(and(eq(schema.jobs.id, id), eq(schema.jobs.version, version)))
      .returning()
      .get();
    if (!updated) throw conflict('This job changed while saving. Reload and try again.');
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'update',
      entity: 'job',
      entityId: updated.id,
      detail: { fields: Object.keys(changes), version: updated.version },
    });
    return updated;
  });
  return toJob(row);
}
