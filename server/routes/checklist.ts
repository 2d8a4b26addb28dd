import { Router } from 'express';

import { checklistAddSchema, checklistPatchSchema } from '@/shared/measurements';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { parse } from '../http';
import { addChecklistItem, deleteChecklistItem, jobChecklist, tickChecklistItem } from '../store/checklist';

/** A job's checklist: builder and tech read, tick, add and remove items. */
export function checklistRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/checklist', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    res.json({ items: jobChecklist(db, actorOf(ctx), req.params.jobId) });
  });

  router.post('/jobs/:jobId/checklist', async (req, res) => {
    const body = parse(checklistAddSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    res.status(201).json({ item: addChecklistItem(db, actorOf(ctx), req.params.jobId, body.label) });
  });

  router.patch('/checklist/:id', async (req, res) => {
    const { done } = parse(checklistPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    res.json({ item: tickChecklistItem(db, actorOf(ctx), req.params.id, done) });
  });

  router.delete('/checklist/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    deleteChecklistItem(db, actorOf(ctx), req.params.id);
    res.status(204).end();
  });

  return router;
}
