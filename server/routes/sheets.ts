import { Router } from 'express';
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { analyzeRecords, revisionResults } from '@/shared/analysis';
import type { EngineSpec } from '@/shared/engine';
import type { ProfileSpec } from '@/shared/profile';
import { sheetCreateSchema, sheetSaveSchema, type Revision, type RevisionResults, type Sheet, type SheetWithHistory } from '@/shared/sheets';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import { declareCalcFields, renamePrefixes } from '../calc-fields';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound, parse } from '../http';
import { prepared } from '../prepared';
import { requireJob } from '../scope';

type SheetRow = typeof schema.specSheets.$inferSelect;
type RevisionRow = typeof schema.sheetRevisions.$inferSelect;
type Reader = Pick<Db, 'select'>;

export function toRevision(row: RevisionRow): Revision {
  return {
    id: row.id,
    sheetId: row.sheetId,
    number: row.number,
    state: row.state,
    label: row.label,
    spec: row.spec,
    engine: row.engine,
    results: row.results,
    note: row.note,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    issuedAt: row.issuedAt ? row.issuedAt.toISOString() : null,
  };
}

function toSheet(row: SheetRow, current: RevisionRow): Sheet {
  return {
    id: row.id,
    shopId: row.shopId,
    jobId: row.jobId,
    title: row.title,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    current: toRevision(current),
  };
}

function withHistory(row: SheetRow, revisions: RevisionRow[]): SheetWithHistory {
  const latest = revisions[revisions.length - 1];
  if (!latest) throw new Error(`Sheet ${row.id} has no revisions`);
  return { ...toSheet(row, latest), revisions: revisions.map(toRevision) };
}

/** A calc error on a revision names the sheet's own fields: `spec.*` for the profile, `engine.*` for the snapshot. */
const revisionFields = renamePrefixes([
  ['regrind.regrindBaseCircle', 'spec.baseCircle'],
  ['profile', 'spec'],
]);

/** The numbers a revision keeps, computed from its profile values and engine snapshot (calc errors named by `revisionFields`). */
function computeResults(engine: EngineSpec, spec: ProfileSpec): RevisionResults {
  return revisionResults(analyzeRecords(engine, spec));
}

const sheetStatements = (db: Reader) =>
  prepared(db, 'sheets.load', (d) => ({
    sheet: d
      .select()
      .from(schema.specSheets)
      .where(and(eq(schema.specSheets.id, sql.placeholder('id')), eq(schema.specSheets.shopId, sql.placeholder('shopId'))))
      .prepare(),
    revisions: d
      .select()
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.sheetId, sql.placeholder('id')))
      .orderBy(asc(schema.sheetRevisions.number))
      .prepare(),
  }));

function loadSheet(db: Reader, shopId: string, id: string): SheetWithHistory {
  const statements = sheetStatements(db);
  const sheet = statements.sheet.get({ id, shopId });
  if (!sheet) throw notFound('Spec sheet');
  return withHistory(sheet, statements.revisions.all({ id }));
}

function requireEngine(db: Reader, shopId: string, jobId: string): EngineSpec {
  const row = db
    .select({ spec: schema.engines.spec })
    .from(schema.engines)
    .where(and(eq(schema.engines.jobId, jobId), eq(schema.engines.shopId, shopId)))
    .get();
  if (!row) throw new HttpError(409, 'engine_missing', "Save the job's engine first: a spec sheet is checked against it.");
  return row.spec;
}

/**
 * Spec sheets on a job. Each save edits the draft revision in place; once the
 * latest revision is issued (or the builder asks for a new revision), a save
 * writes the next revision instead and leaves the earlier one as it was.
 */
export function sheetsRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/sheets', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    const sheets = db
      .select()
      .from(schema.specSheets)
      .where(and(eq(schema.specSheets.jobId, req.params.jobId), eq(schema.specSheets.shopId, ctx.shop.id)))
      .orderBy(desc(schema.specSheets.updatedAt), asc(schema.specSheets.id))
      .all();
    const latest = new Map<string, RevisionRow>();
    if (sheets.length) {
      const revisions = db
        .select()
        .from(schema.sheetRevisions)
        .where(
          inArray(
            schema.sheetRevisions.sheetId,
            sheets.map((s) => s.id),
          ),
        )
        .orderBy(asc(schema.sheetRevisions.number))
        .all();
      for (const r of revisions) latest.set(r.sheetId, r);
    }
    res.json({
      sheets: sheets.flatMap((s) => {
        const current = latest.get(s.id);
        return current ? [toSheet(s, current)] : [];
      }),
    });
  });

  router.post('/jobs/:jobId/sheets', async (req, res) => {
    declareCalcFields(res, revisionFields);
    const body = parse(sheetCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const jobId = req.params.jobId;
    const sheet = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const engine = requireEngine(tx, ctx.shop.id, jobId);
      const profile = tx
        .select()
        .from(schema.camProfiles)
        .where(
          and(
            eq(schema.camProfiles.id, body.profileId),
            eq(schema.camProfiles.shopId, ctx.shop.id),
            eq(schema.camProfiles.jobId, jobId),
          ),
        )
        .get();
      if (!profile) {
        throw new HttpError(400, 'invalid', "profileId: Choose one of this job's profiles", {
          profileId: "Choose one of this job's profiles",
        });
      }
      const results = computeResults(engine, profile.spec);
      const created = tx
        .insert(schema.specSheets)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, jobId, title: body.title, createdBy: ctx.user.id })
        .returning()
        .get();
      const revision = tx
        .insert(schema.sheetRevisions)
        .values({
          id: crypto.randomUUID(),
          sheetId: created.id,
          number: 1,
          state: 'draft',
          label: profile.label,
          spec: profile.spec,
          engine,
          results,
          note: body.note,
          createdBy: ctx.user.id,
        })
        .returning()
        .get();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'create',
        entity: 'sheet',
        entityId: created.id,
        detail: { jobId, profileId: profile.id, revision: 1 },
      });
      return withHistory(created, [revision]);
    });
    res.status(201).json({ sheet });
  });

  router.get('/sheets/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ sheet: loadSheet(db, ctx.shop.id, req.params.id) });
  });

  router.patch('/sheets/:id', async (req, res) => {
    declareCalcFields(res, revisionFields);
    const { version, refreshEngine, newRevision, ...changes } = parse(sheetSaveSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const id = req.params.id;
    const sheet = db.transaction((tx) => {
      const current = tx
        .select()
        .from(schema.specSheets)
        .where(and(eq(schema.specSheets.id, id), eq(schema.specSheets.shopId, ctx.shop.id)))
        .get();
      if (!current) throw notFound('Spec sheet');
      if (current.version !== version) {
        throw conflict(
          `Someone saved this spec sheet after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
        );
      }
      const latest = tx
        .select()
        .from(schema.sheetRevisions)
        .where(eq(schema.sheetRevisions.sheetId, id))
        .orderBy(desc(schema.sheetRevisions.number))
        .limit(1)
        .get();
      if (!latest) throw new Error(`Sheet ${id} has no revisions`);

      const label = changes.label ?? latest.label;
      const spec = changes.spec ?? latest.spec;
      const note = changes.note ?? latest.note;
      const engine = refreshEngine ? requireEngine(tx, ctx.shop.id, current.jobId) : latest.engine;
      const results = computeResults(engine, spec);

      // An issued revision is the grinder's contract: never touch it, write the next one.
      const startNext = latest.state === 'issued' || newRevision === true;
      const saved = startNext
        ? tx
            .insert(schema.sheetRevisions)
            .values({
              id: crypto.randomUUID(),
              sheetId: id,
              number: latest.number + 1,
              state: 'draft',
              label,
              spec,
              engine,
              results,
              note,
              createdBy: ctx.user.id,
            })
            .returning()
            .get()
        : tx
            .update(schema.sheetRevisions)
            .set({ label, spec, engine, results, note })
            .where(and(eq(schema.sheetRevisions.id, latest.id), eq(schema.sheetRevisions.state, 'draft')))
            .returning()
            .get();
      if (!saved) throw conflict('This revision was issued while saving. Reload and try again.');

      const bumped = tx
        .update(schema.specSheets)
        .set({ version: version + 1 })
        .where(and(eq(schema.specSheets.id, id), eq(schema.specSheets.version, version)))
        .returning()
        .get();
      if (!bumped) throw conflict('This spec sheet changed while saving. Reload and try again.');
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: startNext ? 'revise' : 'update',
        entity: 'sheet',
        entityId: id,
        detail: {
          revision: saved.number,
          fields: [...Object.keys(changes), ...(refreshEngine ? ['engine'] : [])],
          version: bumped.version,
        },
      });
      return loadSheet(tx, ctx.shop.id, id);
    });
    res.json({ sheet });
  });

  return router;
}
