import { Router } from 'express';

import { revisionPathSchema, sheetCreateSchema, sheetSaveSchema } from '@/shared/sheets';

import { actorOf, requireShopRole } from '../access';
import { declareCalcFields, renamePrefixes } from '../calc-fields';
import type { AppDeps } from '../deps';
import { parse } from '../http';
import { createSheet, jobSheets, loadRevision, loadSheet, saveSheet } from '../store/sheets';

/** A calc error on a revision names the sheet's own fields: `spec.*` for the profile, `engine.*` for the snapshot. */
const revisionFields = renamePrefixes([
  ['regrind.regrindBaseCircle', 'spec.baseCircle'],
  ['profile', 'spec'],
]);

/**
 * Spec sheets on a job. Each save edits the draft revision in place; once the
 * latest revision is issued (or the builder asks for a new revision), a save
 * writes the next revision instead and leaves the earlier one as it was.
 */
export function sheetsRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/sheets', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ sheets: jobSheets(db, ctx.shop.id, req.params.jobId) });
  });

  router.post('/jobs/:jobId/sheets', async (req, res) => {
    declareCalcFields(res, revisionFields);
    const body = parse(sheetCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    res.status(201).json({ sheet: createSheet(db, actorOf(ctx), req.params.jobId, body) });
  });

  router.get('/sheets/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ sheet: loadSheet(db, ctx.shop.id, req.params.id) });
  });

  router.get('/sheets/:id/revisions/:number', async (req, res) => {
    const { number } = parse(revisionPathSchema, { number: req.params.number });
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ revision: loadRevision(db, ctx.shop.id, req.params.id, number) });
  });

  router.patch('/sheets/:id', async (req, res) => {
    declareCalcFields(res, revisionFields);
    const body = parse(sheetSaveSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    res.json({ sheet: saveSheet(db, actorOf(ctx), req.params.id, body) });
  });

  return router;
}
