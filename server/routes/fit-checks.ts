import { Router } from 'express';
import { and, desc, eq, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { measurementKinds, type FitCheckRun, type MeasurementData, type MeasurementKind } from '@/shared/measurements';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { declareCalcFields, renamePrefixes } from '../calc-fields';
import { runFitChecks } from '../fit-checks';
import { notFound } from '../http';
import { newestMeasurementFirst } from './measurements';
import { loadShopLimits } from './shop-limits';

type Reader = Pick<Db, 'select'>;
type RunRow = typeof schema.fitCheckRuns.$inferSelect;

function toRun(row: RunRow, revisionNumber: number): FitCheckRun {
  return {
    id: row.id,
    sheetId: row.sheetId,
    revisionId: row.revisionId,
    revisionNumber,
    createdAt: row.createdAt.toISOString(),
    createdBy: row.createdBy,
    results: row.results,
  };
}

function requireSheet(db: Reader, shopId: string, id: string) {
  const sheet = db
    .select({ id: schema.specSheets.id, jobId: schema.specSheets.jobId })
    .from(schema.specSheets)
    .where(and(eq(schema.specSheets.id, id), eq(schema.specSheets.shopId, shopId)))
    .get();
  if (!sheet) throw notFound('Spec sheet');
  return sheet;
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
    const sheet = requireSheet(db, ctx.shop.id, req.params.id);
    const rows = db
      .select({ run: schema.fitCheckRuns, number: schema.sheetRevisions.number })
      .from(schema.fitCheckRuns)
      .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.fitCheckRuns.revisionId))
      .where(and(eq(schema.fitCheckRuns.sheetId, sheet.id), eq(schema.fitCheckRuns.shopId, ctx.shop.id)))
      .orderBy(desc(schema.fitCheckRuns.createdAt), desc(sql`${schema.fitCheckRuns}.rowid`))
      .all();
    res.json({ runs: rows.map((r) => toRun(r.run, r.number)) });
  });

  router.post('/sheets/:id/fit-checks', async (req, res) => {
    declareCalcFields(res, fitCheckFields);
    const ctx = await requireShopRole(auth, db, req, { measurement: ['write'] });
    const run = db.transaction((tx) => {
      const sheet = requireSheet(tx, ctx.shop.id, req.params.id);
      const revision = tx
        .select()
        .from(schema.sheetRevisions)
        .where(eq(schema.sheetRevisions.sheetId, sheet.id))
        .orderBy(desc(schema.sheetRevisions.number))
        .limit(1)
        .get();
      if (!revision) throw new Error(`Sheet ${sheet.id} has no revisions`);
      const results = runFitChecks({
        engine: revision.engine,
        spec: revision.spec,
        measured: latestMeasurements(tx, ctx.shop.id, sheet.jobId),
        limits: loadShopLimits(tx, ctx.shop.id).limits,
      });
      const row = tx
        .insert(schema.fitCheckRuns)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, sheetId: sheet.id, revisionId: revision.id, results, createdBy: ctx.user.id })
        .returning()
        .get();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'create',
        entity: 'fit-check',
        entityId: row.id,
        detail: { sheetId: sheet.id, revision: revision.number, status: results.status },
      });
      return toRun(row, revision.number);
    });
    res.status(201).json({ run });
  });

  return router;
}
