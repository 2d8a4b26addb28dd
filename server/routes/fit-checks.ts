import { Router } from 'express';

import { actorOf, requireShopRole } from '../access';
import { declareCalcFields, renamePrefixes } from '../calc-fields';
import type { AppDeps } from '../deps';
import { runFitChecks } from '../fit-checks';
import { recordFitCheck, sheetFitChecks } from '../store/fit-checks';

/**
 * Calc's field paths (as runFitChecks passes them on) renamed to the measurement or
 * sheet the tech would fix: the pushrod record, the sheet's spec, the degree readings.
 */
const fitCheckFields = renamePrefixes([
  ['regrind.regrindBaseCircle', 'spec.baseCircle'],
  ['regrind.pushrodLength', 'pushrod.currentLength'],
  ['regrind', 'pushrod'],
  ['profile', 'spec'],
  [/^ptv-baseline\.(intake|exhaust)\.(\d+)\.baseline(?=\.|$)/, 'ptv-baseline.$1.$2'],
  ['openingAngle', 'degree.openingAngle'],
  ['closingAngle', 'degree.closingAngle'],
  ['sheetIcl', 'spec.icl'],
  ['lobes', 'lobes.lobes'],
]);

/** Fit-check runs on a spec sheet: each runs against the sheet's current revision and stays bound to it. */
export function fitChecksRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/sheets/:id/fit-checks', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { measurement: ['read'] });
    res.json({ runs: sheetFitChecks(db, ctx.shop.id, req.params.id) });
  });

  router.post('/sheets/:id/fit-checks', async (req, res) => {
    declareCalcFields(res, fitCheckFields);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const run = recordFitCheck(db, actorOf(ctx), req.params.id, ({ revision, measured, limits }) =>
      runFitChecks({ engine: revision.engine, spec: revision.spec, measured, limits }),
    );
    res.status(201).json({ run });
  });

  return router;
}
