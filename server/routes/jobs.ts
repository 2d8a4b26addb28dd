import { Router } from 'express';
import { and, count, desc, eq, gt, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { jobCreateSchema, jobPatchSchema, type Job } from '@/shared/jobs';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound, parse } from '../http';
import { pageRequest, toPage } from '../paging';
import { prepared } from '../prepared';

type JobRow = typeof schema.jobs.$inferSelect;

// Keyset paging, newest change first, on the (shop_id, updated_at, id) index; built once (the list is the busiest read).
// `at` is the cursor's updated_at in milliseconds, as the column stores it.
const jobsFirstPage = (db: Pick<Db, 'select'>) =>
  prepared(db, 'jobs.first-page', (d) =>
    d
      .select()
      .from(schema.jobs)
      .where(eq(schema.jobs.shopId, sql.placeholder('shopId')))
      .orderBy(desc(schema.jobs.updatedAt), desc(schema.jobs.id))
      .limit(sql.placeholder('limit'))
      .prepare(),
  );

const jobsPageAfter = (db: Pick<Db, 'select'>) =>
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

export type JobCreateRateLimit = {
  /** Jobs one shop may create per window. */
  limit: number;
  /** Window length, milliseconds. */
  windowMs: number;
};

/** Far above what a shop types in by hand; a script filling the database hits it. */
export const defaultJobCreateRateLimit: JobCreateRateLimit = { limit: 30, windowMs: 60_000 };

/** Jobs of the active repair shop: builder and tech read, builder creates and edits. */
export function jobsRouter({ db, auth }: AppDeps, rate: JobCreateRateLimit = defaultJobCreateRateLimit) {
  const router = Router();

  const findJob = (shopId: string, id: string) =>
    db
      .select()
      .from(schema.jobs)
      .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, shopId)))
      .get();

  router.get('/', async (req, res) => {
    const { limit, after } = pageRequest(req);
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const rows = after
      ? jobsPageAfter(db).all({ shopId: ctx.shop.id, limit: limit + 1, at: after.at, id: after.id })
      : jobsFirstPage(db).all({ shopId: ctx.shop.id, limit: limit + 1 });
    const page = toPage(rows, limit, (row) => ({ at: row.updatedAt.getTime(), id: row.id }));
    res.json({ jobs: page.rows.map(toJob), nextCursor: page.nextCursor });
  });

  router.post('/', async (req, res) => {
    const body = parse(jobCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['create'] });
    const row = db.transaction((tx) => {
      const [recent] = tx
        .select({ n: count() })
        .from(schema.jobs)
        .where(and(eq(schema.jobs.shopId, ctx.shop.id), gt(schema.jobs.createdAt, new Date(Date.now() - rate.windowMs))))
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
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, createdBy: ctx.user.id, ...body })
        .returning()
        .get();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'job', entityId: created.id });
      return created;
    });
    res.status(201).json({ job: toJob(row) });
  });

  router.get('/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const row = findJob(ctx.shop.id, req.params.id);
    if (!row) throw notFound('Job');
    res.json({ job: toJob(row) });
  });

  router.patch('/:id', async (req, res) => {
    const { version, ...changes } = parse(jobPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const row = db.transaction((tx) => {
      const current = tx
        .select({ version: schema.jobs.version })
        .from(schema.jobs)
        .where(and(eq(schema.jobs.id, req.params.id), eq(schema.jobs.shopId, ctx.shop.id)))
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
        .where(and(eq(schema.jobs.id, req.params.id), eq(schema.jobs.version, version)))
        .returning()
        .get();
      if (!updated) throw conflict('This job changed while saving. Reload and try again.');
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'update',
        entity: 'job',
        entityId: updated.id,
        detail: { fields: Object.keys(changes), version: updated.version },
      });
      return updated;
    });
    res.json({ job: toJob(row) });
  });

  return router;
}
