import { Router } from 'express';

import { jobCreateSchema, jobPatchSchema } from '@/shared/jobs';

import { actorOf, requireShopRole } from '../access';
import { loadLifecycle } from '../store/lifecycle';
import type { AppDeps } from '../deps';
import { notFound, parse } from '../http';
import { pageRequest, toPage } from '../paging';
import { createJob, findJob, jobPageRows, toJob, updateJob, type JobCreateRateLimit } from '../store/jobs';

export type { JobCreateRateLimit } from '../store/jobs';

/** Far above what a shop types in by hand; a script filling the database hits it. */
export const defaultJobCreateRateLimit: JobCreateRateLimit = { limit: 30, windowMs: 60_000 };

/** Jobs of the active repair shop: builder and tech read, builder creates and edits. */
export function jobsRouter({ db, auth }: AppDeps, rate: JobCreateRateLimit = defaultJobCreateRateLimit) {
  const router = Router();

  router.get('/', async (req, res) => {
    const request = pageRequest(req);
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const page = toPage(jobPageRows(db, ctx.shop.id, request), request.limit, (row) => ({ at: row.updatedAt.getTime(), id: row.id }));
    res.json({ jobs: page.rows.map(toJob), nextCursor: page.nextCursor });
  });

  router.post('/', async (req, res) => {
    const body = parse(jobCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['create'] });
    res.status(201).json({ job: createJob(db, actorOf(ctx), body, rate) });
  });

  router.get('/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const job = findJob(db, ctx.shop.id, req.params.id);
    if (!job) throw notFound('Job');
    res.json({ job });
  });

  router.get('/:id/lifecycle', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ lifecycle: loadLifecycle(db, ctx.shop.id, req.params.id) });
  });

  router.patch('/:id', async (req, res) => {
    const body = parse(jobPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.json({ job: updateJob(db, actorOf(ctx), req.params.id, body) });
  });

  return router;
}
