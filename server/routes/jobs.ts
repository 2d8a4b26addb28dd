import { Router } from 'express';
import { and, desc, eq } from 'drizzle-orm';

import { schema } from '@/db';
import { jobCreateSchema, jobPatchSchema, type Job } from '@/shared/jobs';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, notFound, parse } from '../http';

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

/** Jobs of the active repair shop: builder and tech read, builder creates and edits. */
export function jobsRouter({ db, auth }: AppDeps) {
  const router = Router();

  const findJob = (shopId: string, id: string) =>
    db
      .select()
      .from(schema.jobs)
      .where(and(eq(schema.jobs.id, id), eq(schema.jobs.shopId, shopId)))
      .get();

  router.get('/', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const rows = db
      .select()
      .from(schema.jobs)
      .where(eq(schema.jobs.shopId, ctx.shop.id))
      .orderBy(desc(schema.jobs.updatedAt))
      .all();
    res.json({ jobs: rows.map(toJob) });
  });

  router.post('/', async (req, res) => {
    const body = parse(jobCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['create'] });
    const row = db.transaction((tx) => {
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
