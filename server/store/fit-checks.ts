import { and, desc, eq, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { summarizeChecks } from '@/calc/checks';
import type { FitCheckRun } from '@/shared/measurements';

import { notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { latestMeasurements } from './measurements';
import { revisionToCheck } from './sheets';
import { loadShopLimits } from './shop-limits';

type RunRow = typeof schema.fitCheckRuns.$inferSelect;
type RevisionRow = typeof schema.sheetRevisions.$inferSelect;

export function toRun(row: RunRow, revisionNumber: number, createdByName: string | null): FitCheckRun {
  return {
    id: row.id,
    sheetId: row.sheetId,
    revisionId: row.revisionId,
    revisionNumber,
    createdAt: row.createdAt.toISOString(),
    createdBy: row.createdBy,
    createdByName,
    summary: summarizeChecks(row.results),
    results: row.results,
  };
}

/** The newest run against a revision, with who ran it; null when it has not been checked. */
export function latestRunOfRevision(db: Reader, shopId: string, revisionId: string): FitCheckRun | null {
  const row = db
    .select({ run: schema.fitCheckRuns, number: schema.sheetRevisions.number, name: schema.users.name })
    .from(schema.fitCheckRuns)
    .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.fitCheckRuns.revisionId))
    .leftJoin(schema.users, eq(schema.users.id, schema.fitCheckRuns.createdBy))
    .where(and(eq(schema.fitCheckRuns.revisionId, revisionId), eq(schema.fitCheckRuns.shopId, shopId)))
    .orderBy(desc(schema.fitCheckRuns.createdAt), desc(sql`${schema.fitCheckRuns}.rowid`))
    .get();
  return row ? toRun(row.run, row.number, row.name) : null;
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

/** The sheet's runs, newest first, each with the number of the revision it ran against; a 404 for another shop's sheet. */
export function sheetFitChecks(db: Reader, shopId: string, sheetId: string): FitCheckRun[] {
  const sheet = requireSheet(db, shopId, sheetId);
  return db
    .select({ run: schema.fitCheckRuns, number: schema.sheetRevisions.number, name: schema.users.name })
    .from(schema.fitCheckRuns)
    .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.fitCheckRuns.revisionId))
    .leftJoin(schema.users, eq(schema.users.id, schema.fitCheckRuns.createdBy))
    .where(and(eq(schema.fitCheckRuns.sheetId, sheet.id), eq(schema.fitCheckRuns.shopId, shopId)))
    .orderBy(desc(schema.fitCheckRuns.createdAt), desc(sql`${schema.fitCheckRuns}.rowid`))
    .all()
    .map((r) => toRun(r.run, r.number, r.name));
}

/** What a run is assembled from: the revision to check (revisionToCheck: the approved one, else the latest), the job's newest measurement of each kind, the shop's limits. */
export type FitCheckInputs = {
  revision: RevisionRow;
  measured: ReturnType<typeof latestMeasurements>;
  limits: ReturnType<typeof loadShopLimits>['limits'];
};

/**
 * In one transaction: loads the inputs, lets `assemble` (pure) make the results, and stores
 * the run bound to the revision with its audit row.
 */
export function recordFitCheck(db: Db, who: Actor, sheetId: string, assemble: (inputs: FitCheckInputs) => FitCheckRun['results']): FitCheckRun {
  return db.transaction((tx) => {
    const sheet = requireSheet(tx, who.shopId, sheetId);
    const revision = revisionToCheck(tx, sheet);
    const results = assemble({ revision, measured: latestMeasurements(tx, who.shopId, sheet.jobId), limits: loadShopLimits(tx, who.shopId).limits });
    const row = tx
      .insert(schema.fitCheckRuns)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, sheetId: sheet.id, revisionId: revision.id, results, createdBy: who.userId })
      .returning()
      .get();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'create',
      entity: 'fit-check',
      entityId: row.id,
      detail: { sheetId: sheet.id, revision: revision.number, status: results.status },
    });
    const name = tx.select({ name: schema.users.name }).from(schema.users).where(eq(schema.users.id, who.userId)).get()?.name ?? null;
    return toRun(row, revision.number, name);
  });
}
