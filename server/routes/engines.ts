import { Router } from 'express';

import { engineSaveSchema } from '@/shared/engine';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { parse } from '../http';
import { loadEngine, saveEngine } from '../store/engines';

/** The engine on a job: builder and tech read it, the builder saves it. Version 0 creates it. */
export function enginesRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/engine', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ engine: loadEngine(db, ctx.shop.id, req.params.jobId) });
  });

  router.put('/jobs/:jobId/engine', async (req, res) => {
    const { version, engine } = parse(engineSaveSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const saved = saveEngine(db, actorOf(ctx), req.params.jobId, version, engine);
    res.status(saved.created ? 201 : 200).json({ engine: saved.engine });
  });

  return router;
}
