import { and, asc, desc, eq, getTableColumns, gt, inArray, isNull, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { z } from 'zod';

import { resolveCheckLimits } from '@/calc/checks';
import { analyzeForJob, revisionResults } from '@/shared/analysis';
import { jobCore, type JobCore } from '@/shared/job-core';
import type { EngineSpec } from '@/shared/engine';
import type { ProfileSpec } from '@/shared/profile';
import type { Revision, RevisionResults, RevisionSummary, Sheet, sheetCreateSchema, sheetSaveSchema, SheetWithHistory, Supersession } from '@/shared/sheets';

import { conflict, HttpError, notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireEngine } from './engines';
import { requireJob } from './jobs';
import { prepared } from './prepared';
import { latestMeasurements } from './measurements';
import { findJobProfile } from './profiles';
import { loadShopLimits } from './shop-limits';

type SheetRow = typeof schema.specSheets.$inferSelect;
type RevisionRow = typeof schema.sheetRevisions.$inferSelect;
type RevisionSummaryRow = Omit<RevisionRow, 'results'>;

/** The revision columns a sheet's history reads: all but the results, which only the latest brings. */
const { results: _results, ...summaryColumns } = getTableColumns(schema.sheetRevisions);

/**
 * Which of one sheet's revisions are superseded, and by what: each revision's first later issued one
 * (`revisions` oldest first). Worked out from the revisions themselves, so an issued row never changes to say so.
 */
export function supersessionsIn(revisions: readonly RevisionSummaryRow[]): Map<string, Supersession> {
  const out = new Map<string, Supersession>();
  let next: Supersession | null = null;
  for (const r of [...revisions].reverse()) {
    if (next) out.set(r.id, next);
    if (r.state === 'issued' && r.issuedAt) next = { number: r.number, at: r.issuedAt.toISOString() };
  }
  return out;
}

/** The revision by id with what supersedes it (a later issued revision of its sheet), or undefined. */
export function revisionWithSupersession(db: Reader, id: string): Revision | undefined {
  const row = db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, id)).get();
  if (!row) return undefined;
  const later = db
    .select()
    .from(schema.sheetRevisions)
    .where(and(eq(schema.sheetRevisions.sheetId, row.sheetId), eq(schema.sheetRevisions.state, 'issued'), gt(schema.sheetRevisions.number, row.number)))
    .orderBy(asc(schema.sheetRevisions.number))
    .limit(1)
    .get();
  return toRevision(row, later?.issuedAt ? { number: later.number, at: later.issuedAt.toISOString() } : null);
}

export function toRevision(row: RevisionRow, supersededBy: Supersession | null): Revision {
  return { ...toRevisionSummary(row, supersededBy), results: row.results };
}

function toRevisionSummary(row: RevisionSummaryRow, supersededBy: Supersession | null): RevisionSummary {
  return {
    id: row.id,
    sheetId: row.sheetId,
    number: row.number,
    state: row.state,
    label: row.label,
    spec: row.spec,
    engine: row.engine,
    note: row.note,
    coreNotes: row.coreNotes,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    issuedAt: row.issuedAt ? row.issuedAt.toISOString() : null,
    supersededBy,
  };
}

function toSheet(row: SheetRow, current: RevisionRow): Sheet {
  return {
    id: row.id,
    shopId: row.shopId,
    jobId: row.jobId,
    profileId: row.profileId,
    title: row.title,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    // The latest revision has no later one to supersede it.
    current: toRevision(current, null),
  };
}

/** The revision of the job's live approval (the approval names one revision of one sheet), or null. */
export function approvedRevisionId(db: Reader, jobId: string): string | null {
  const statement = prepared(db, 'sheets.approved-revision', (d) =>
    d
      .select({ id: schema.ownerApprovals.revisionId })
      .from(schema.ownerApprovals)
      .where(and(eq(schema.ownerApprovals.jobId, sql.placeholder('jobId')), isNull(schema.ownerApprovals.withdrawnAt)))
      .prepare(),
  );
  return statement.get({ jobId })?.id ?? null;
}

/** The revision the engine is checked against: the owner's approved one when it is on this sheet (the one ground), else the sheet's latest. */
export function revisionToCheck(db: Reader, sheet: { id: string; jobId: string }): RevisionRow {
  const approvedId = approvedRevisionId(db, sheet.jobId);
  const approved = approvedId
    ? db
        .select()
        .from(schema.sheetRevisions)
        .where(and(eq(schema.sheetRevisions.id, approvedId), eq(schema.sheetRevisions.sheetId, sheet.id)))
        .get()
    : undefined;
  return approved ?? latestRevisionRow(db, sheet.id);
}

/**
 * Which revision issuing the sheet sends to a grinder, or why none can go. Once the owner has approved, the approved
 * revision goes while it is a draft, even with a later draft on the sheet, and a sheet the owner did not approve cannot
 * be issued. Once the approved revision is issued, only a later draft can go: it supersedes the approved one
 * (`replacesApproved`), and issuing it withdraws the approval so the owner is asked again. Before any approval, it is
 * the latest revision while a draft.
 */
export function issueTarget<Row extends RevisionSummaryRow>(
  revisions: readonly Row[],
  approvedId: string | null,
): { row: Row; approved: boolean; replacesApproved: number | null } | { blocked: string } {
  const latest = revisions[revisions.length - 1];
  if (!latest) throw new Error('A sheet with no revisions');
  if (approvedId) {
    const approved = revisions.find((r) => r.id === approvedId);
    if (!approved) return { blocked: 'The owner approved another option on this job, so this sheet is not the one to grind.' };
    if (approved.state === 'draft') return { row: approved, approved: true, replacesApproved: null };
    if (latest.state === 'draft' && latest.number > approved.number) return { row: latest, approved: false, replacesApproved: approved.number };
    return {
      blocked: `Revision ${approved.number}, the one the owner approved, is already issued. To change it, save the sheet: that starts revision ${approved.number + 1}, and issuing it withdraws the owner’s approval so they can approve again.`,
    };
  }
  if (latest.state === 'issued') {
    return {
      blocked: `Revision ${latest.number} is already issued — edit the sheet to start a new revision, then issue that. Saving a new note or values starts revision ${latest.number + 1} as a draft you can issue.`,
    };
  }
  return { row: latest, approved: false, replacesApproved: null };
}

/** The sheet with its history (`revisions` oldest first, `latest` the last of them with its results). */
function withHistory(db: Reader, row: SheetRow, revisions: readonly RevisionSummaryRow[], latest: RevisionRow): SheetWithHistory {
  const superseded = supersessionsIn(revisions);
  const target = issueTarget(revisions, approvedRevisionId(db, row.jobId));
  return {
    ...toSheet(row, latest),
    revisions: revisions.map((r) => toRevisionSummary(r, superseded.get(r.id) ?? null)),
    toIssue: 'row' in target ? { number: target.row.number, approved: target.approved, replacesApproved: target.replacesApproved } : null,
    issueBlocked: 'blocked' in target ? target.blocked : null,
  };
}

const sheetStatements = (db: Reader) =>
  prepared(db, 'sheets.load', (d) => ({
    sheet: d
      .select()
      .from(schema.specSheets)
      .where(and(eq(schema.specSheets.id, sql.placeholder('id')), eq(schema.specSheets.shopId, sql.placeholder('shopId'))))
      .prepare(),
    revisions: d
      .select(summaryColumns)
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.sheetId, sql.placeholder('id')))
      .orderBy(asc(schema.sheetRevisions.number))
      .prepare(),
    results: d
      .select({ results: schema.sheetRevisions.results })
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.id, sql.placeholder('revisionId')))
      .prepare(),
    revision: d
      .select()
      .from(schema.sheetRevisions)
      .where(and(eq(schema.sheetRevisions.sheetId, sql.placeholder('id')), eq(schema.sheetRevisions.number, sql.placeholder('number'))))
      .prepare(),
  }));

/** The sheet with every revision, oldest first, and the latest with its results; a 404 for another shop's sheet. */
export function loadSheet(db: Reader, shopId: string, id: string): SheetWithHistory {
  const statements = sheetStatements(db);
  const sheet = statements.sheet.get({ id, shopId });
  if (!sheet) throw notFound('Spec sheet');
  const revisions = statements.revisions.all({ id });
  const latest = revisions[revisions.length - 1];
  const results = latest && statements.results.get({ revisionId: latest.id });
  if (!latest || !results) throw new Error(`Sheet ${id} has no revisions`);
  return withHistory(db, sheet, revisions, { ...latest, results: results.results });
}

/** One revision of the shop's sheet, by its number, with its results and what supersedes it; a 404 when either is missing. */
export function loadRevision(db: Reader, shopId: string, id: string, number: number): Revision {
  const statements = sheetStatements(db);
  if (!statements.sheet.get({ id, shopId })) throw notFound('Spec sheet');
  const row = statements.revision.get({ id, number });
  if (!row) throw notFound('Revision');
  const superseded = supersessionsIn(statements.revisions.all({ id }));
  return toRevision(row, superseded.get(row.id) ?? null);
}

/** The sheet row in the shop, or a 404. */
export function requireSheetRow(db: Reader, shopId: string, id: string): SheetRow {
  const sheet = db
    .select()
    .from(schema.specSheets)
    .where(and(eq(schema.specSheets.id, id), eq(schema.specSheets.shopId, shopId)))
    .get();
  if (!sheet) throw notFound('Spec sheet');
  return sheet;
}

/** The sheet's latest revision (every sheet has one). */
export function latestRevisionRow(db: Reader, sheetId: string): RevisionRow {
  const latest = db
    .select()
    .from(schema.sheetRevisions)
    .where(eq(schema.sheetRevisions.sheetId, sheetId))
    .orderBy(desc(schema.sheetRevisions.number))
    .limit(1)
    .get();
  if (!latest) throw new Error(`Sheet ${sheetId} has no revisions`);
  return latest;
}

/** The job's sheets, latest change first, each with its current revision; a 404 for another shop's job. */
export function jobSheets(db: Reader, shopId: string, jobId: string): Sheet[] {
  requireJob(db, shopId, jobId);
  const sheets = db
    .select()
    .from(schema.specSheets)
    .where(and(eq(schema.specSheets.jobId, jobId), eq(schema.specSheets.shopId, shopId)))
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
  return sheets.flatMap((s) => {
    const current = latest.get(s.id);
    return current ? [toSheet(s, current)] : [];
  });
}

/**
 * The numbers a revision keeps, computed from its profile values and engine snapshot. Calc may
 * refuse them (a CalcInputError in calc's terms: the route declares the request's names).
 */
function computeResults(db: Reader, shopId: string, jobId: string, engine: EngineSpec, spec: ProfileSpec): RevisionResults {
  const { job, limits } = jobCoreOf(db, shopId, jobId, engine);
  const worked = analyzeForJob(engine, spec, job, limits);
  return revisionResults(worked.analysis, worked.job);
}

/** The job's core (its newest lobe table and pushrod readings) and the shop's limits, for "fits the core?". */
export function jobCoreOf(db: Reader, shopId: string, jobId: string, engine: EngineSpec) {
  const { limits } = loadShopLimits(db, shopId);
  const job: JobCore = jobCore({ measured: latestMeasurements(db, shopId, jobId), limits: resolveCheckLimits(limits), lifterType: engine.lifterType });
  return { job, limits };
}

/** The sheet that grinds this job profile, if it has one. */
export function sheetOfProfile(db: Reader, shopId: string, jobId: string, profileId: string): SheetRow | undefined {
  return db
    .select()
    .from(schema.specSheets)
    .where(and(eq(schema.specSheets.jobId, jobId), eq(schema.specSheets.shopId, shopId), eq(schema.specSheets.profileId, profileId)))
    .get();
}

/** A new sheet on the job from one of its profiles, with revision 1 as a draft against the job's engine. */
export function createSheet(db: Db, who: Actor, jobId: string, body: z.output<typeof sheetCreateSchema>): SheetWithHistory {
  return db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const engine = requireEngine(tx, who.shopId, jobId);
    const profile = findJobProfile(tx, who.shopId, jobId, body.profileId);
    if (!profile) {
      throw new HttpError(400, 'invalid', "profileId: Choose one of this job's profiles", {
        profileId: "Choose one of this job's profiles",
      });
    }
    const taken = sheetOfProfile(tx, who.shopId, jobId, profile.id);
    if (taken) {
      throw new HttpError(
        409,
        'sheet_exists',
        `${profile.label} already has its spec sheet, “${taken.title}”. Save to that sheet: it starts the next revision.`,
      );
    }
    const spec = body.spec ?? profile.spec;
    const results = computeResults(tx, who.shopId, jobId, engine, spec);
    const created = tx
      .insert(schema.specSheets)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, jobId, profileId: profile.id, title: body.title, createdBy: who.userId })
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
        spec,
        engine,
        results,
        note: body.note,
        coreNotes: profile.coreNotes,
        createdBy: who.userId,
      })
      .returning()
      .get();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'create',
      entity: 'sheet',
      entityId: created.id,
      detail: { jobId, profileId: profile.id, revision: 1, ...(body.spec ? { fields: ['spec'] } : {}) },
    });
    return withHistory(tx, created, [revision], revision);
  });
}

/**
 * Saves a sheet: edits the draft revision in place, or writes the next revision when the
 * latest is issued (or `newRevision` asks for one), leaving the earlier one as it was.
 */
export function saveSheet(
  db: Db,
  who: Actor,
  id: string,
  { version, refreshEngine, newRevision, ...changes }: z.output<typeof sheetSaveSchema>,
): SheetWithHistory {
  return db.transaction((tx) => {
    const current = tx
      .select()
      .from(schema.specSheets)
      .where(and(eq(schema.specSheets.id, id), eq(schema.specSheets.shopId, who.shopId)))
      .get();
    if (!current) throw notFound('Spec sheet');
    if (current.version !== version) {
      throw conflict(
        `Someone saved this spec sheet after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
      );
    }
    const latest = latestRevisionRow(tx, id);

    // An issued revision is the grinder's contract, and an approved one the owner's: never touch either, write the next one.
    const startNext = latest.state === 'issued' || latest.id === approvedRevisionId(tx, current.jobId) || newRevision === true;
    const label = changes.label ?? latest.label;
    const spec = changes.spec ?? latest.spec;
    // A note belongs to its revision: the next one starts without it.
    const note = changes.note ?? (startNext ? '' : latest.note);
    // The profile's core notes as they stand now go with the revision written (kept as they were if it left the job).
    const profile = current.profileId ? findJobProfile(tx, who.shopId, current.jobId, current.profileId) : undefined;
    const coreNotes = profile?.coreNotes ?? latest.coreNotes;
    const engine = refreshEngine ? requireEngine(tx, who.shopId, current.jobId) : latest.engine;
    const results = computeResults(tx, who.shopId, current.jobId, engine, spec);

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
            coreNotes,
            createdBy: who.userId,
          })
          .returning()
          .get()
      : tx
          .update(schema.sheetRevisions)
          .set({ label, spec, engine, results, note, coreNotes })
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
      shopId: who.shopId,
      userId: who.userId,
      action: startNext ? 'revise' : 'update',
      entity: 'sheet',
      entityId: id,
      detail: {
        revision: saved.number,
        fields: [...Object.keys(changes), ...(refreshEngine ? ['engine'] : [])],
        version: bumped.version,
      },
    });
    return loadSheet(tx, who.shopId, id);
  });
}
