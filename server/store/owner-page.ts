import { and, asc, desc, eq, gt, inArray, isNotNull, isNull, max, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { compareProfilesForOwner, OWNER_CAUTIONS, ownerFitText } from '@/calc/compare';
import type { ProfileAnalysis } from '@/calc/analysis';
import { summarizeChecks } from '@/calc/checks';
import type { Db } from '@/db';
import { schema } from '@/db';
import { analyzeRecords } from '@/shared/analysis';
import { ownerCoreText } from '@/shared/fits-core';
import { offerChecksum, revisionChecksum } from '@/shared/checksum';
import { productCautions } from '@/shared/cautions';
import type {
  Approval,
  approveSchema,
  OwnerDesk,
  OwnerOption,
  ownerOptionCreateSchema,
  ownerOptionPatchSchema,
  OwnerView,
  OwnerViewOption,
  WithdrawnApproval,
} from '@/shared/owner';
import { ownerUpdatingText } from '@/shared/owner';
import type { Order } from '@/shared/orders';

import { conflict, HttpError, notFound } from '../http';
import { toPage, type PageRequest } from '../paging';
import { audit } from './audit';
import type { Actor, Reader, Writer } from './db';
import { requireJob } from './jobs';
import { liveFirmOrder, makeFirm, orderOfRevision } from './orders';
import { jobPayments, paidJobIds, toPayment } from './payments';
import { shareablePhotos } from './photos';
import { latestRunOfRevision } from './fit-checks';
import { jobLinks, linkById, linkOpen, toShareLink, type LinkRow } from './share-links';
import { loadShopLimits } from './shop-limits';

type OptionRow = typeof schema.ownerOptions.$inferSelect;
type ApprovalRow = typeof schema.ownerApprovals.$inferSelect;
type RevisionRow = typeof schema.sheetRevisions.$inferSelect;

/** Missing, wrong, revoked and expired links all look the same. */
export const linkGone = () =>
  new HttpError(404, 'not_found', 'This link does not open a summary: it may have expired or been withdrawn. Ask the shop for a new one.');

export function toApproval(row: ApprovalRow): Approval {
  return {
    id: row.id,
    optionId: row.optionId,
    optionTitle: row.optionTitle,
    revisionId: row.revisionId,
    checksum: row.checksum,
    priceCents: row.priceCents,
    depositCents: row.depositCents,
    currency: row.currency,
    leadTimeDays: row.leadTimeDays,
    offer: row.offerChecksum,
    name: row.approverName,
    at: row.createdAt.toISOString(),
  };
}

/** The latest revision number of each sheet on a job. */
function latestRevisionNumbers(db: Reader, jobId: string) {
  const rows = db
    .select({ sheetId: schema.sheetRevisions.sheetId, number: schema.sheetRevisions.number })
    .from(schema.sheetRevisions)
    .innerJoin(schema.specSheets, eq(schema.specSheets.id, schema.sheetRevisions.sheetId))
    .where(eq(schema.specSheets.jobId, jobId))
    .all();
  const latest = new Map<string, number>();
  for (const r of rows) latest.set(r.sheetId, Math.max(latest.get(r.sheetId) ?? 0, r.number));
  return latest;
}

function optionRows(db: Reader, shopId: string, jobId: string) {
  return db
    .select({ option: schema.ownerOptions, revision: schema.sheetRevisions })
    .from(schema.ownerOptions)
    .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.ownerOptions.revisionId))
    .where(and(eq(schema.ownerOptions.jobId, jobId), eq(schema.ownerOptions.shopId, shopId)))
    .orderBy(asc(schema.ownerOptions.position), asc(schema.ownerOptions.createdAt))
    .all();
}

/**
 * Why an option no longer offers what its sheet holds, or null while it does: a later revision of its sheet was
 * written, or its draft was edited after the option was bound to it (the content no longer has the option's
 * checksum). The builder's desk flags it and the owner's approval is refused, so an approval always names the
 * revision and checksum the sheet has.
 */
export function optionStaleness(option: Pick<OptionRow, 'checksum'>, revision: RevisionRow, latestNumber: number): string | null {
  if (latestNumber > revision.number) return `the sheet has revision ${latestNumber}, newer than revision ${revision.number} this option offers`;
  if (revisionChecksum(revision) !== option.checksum) return `revision ${revision.number} was edited after this option was offered`;
  return null;
}

function toOption(row: OptionRow, revision: RevisionRow, latest: Map<string, number>): OwnerOption {
  return {
    id: row.id,
    sheetId: row.sheetId,
    revisionId: row.revisionId,
    revisionNumber: revision.number,
    checksum: row.checksum,
    title: row.title,
    ownerNote: row.ownerNote,
    priceCents: row.priceCents,
    depositCents: row.depositCents,
    leadTimeDays: row.leadTimeDays,
    version: row.version,
    stale: optionStaleness(row, revision, latest.get(row.sheetId) ?? revision.number) !== null,
  };
}

/** The job's live approval: the one not withdrawn (a unique index allows one), or undefined. */
export function loadApproval(db: Reader, jobId: string) {
  return db
    .select()
    .from(schema.ownerApprovals)
    .where(and(eq(schema.ownerApprovals.jobId, jobId), isNull(schema.ownerApprovals.withdrawnAt)))
    .get();
}

/** The job's most recently withdrawn approval, shown to the owner and the builder while no live approval has replaced it. */
function withdrawnApproval(db: Reader, jobId: string): WithdrawnApproval | null {
  const row = db
    .select()
    .from(schema.ownerApprovals)
    .where(and(eq(schema.ownerApprovals.jobId, jobId), isNotNull(schema.ownerApprovals.withdrawnAt)))
    .orderBy(desc(schema.ownerApprovals.withdrawnAt))
    .limit(1)
    .get();
  return row?.withdrawnAt
    ? { optionTitle: row.optionTitle, checksum: row.checksum, at: row.withdrawnAt.toISOString(), reason: row.withdrawnReason ?? '' }
    : null;
}

/**
 * Withdraws the job's live approval, in the caller's transaction, because its revision was superseded before grinding
 * began: the row stays, with when and why, and the options open again for the owner to approve. Answers the withdrawn
 * row with the addresses its owner's links went to, or undefined when there was none.
 */
export function withdrawApproval(tx: Writer, who: Actor, jobId: string, reason: string) {
  const row = tx
    .update(schema.ownerApprovals)
    .set({ withdrawnAt: new Date(), withdrawnReason: reason })
    .where(and(eq(schema.ownerApprovals.jobId, jobId), isNull(schema.ownerApprovals.withdrawnAt)))
    .returning()
    .get();
  if (!row) return undefined;
  audit(tx, {
    shopId: who.shopId,
    userId: who.userId,
    action: 'withdraw',
    entity: 'owner-approval',
    entityId: row.id,
    detail: { jobId, reason, checksum: row.checksum },
  });
  const links = tx
    .select({ email: schema.shareLinks.email })
    .from(schema.shareLinks)
    .where(
      and(
        eq(schema.shareLinks.jobId, jobId),
        isNull(schema.shareLinks.revokedAt),
        gt(schema.shareLinks.expiresAt, new Date()),
        isNotNull(schema.shareLinks.email),
      ),
    )
    .all();
  return { row, emails: [...new Set(links.flatMap((l) => (l.email ? [l.email] : [])))] };
}

export function loadOwnerPage(db: Reader, shopId: string, jobId: string) {
  return db
    .select()
    .from(schema.ownerPages)
    .where(and(eq(schema.ownerPages.jobId, jobId), eq(schema.ownerPages.shopId, shopId)))
    .get();
}

/** Everything the builder sees about the owner's side of a job. */
export function loadOwnerDesk(db: Reader, shopId: string, jobId: string): OwnerDesk {
  const page = loadOwnerPage(db, shopId, jobId);
  const latest = latestRevisionNumbers(db, jobId);
  const approval = loadApproval(db, jobId);
  const links = jobLinks(db, shopId, jobId);
  return {
    jobId,
    whatFailed: page?.whatFailed ?? '',
    version: page?.version ?? 0,
    options: optionRows(db, shopId, jobId).map((r) => toOption(r.option, r.revision, latest)),
    links: links.map(toShareLink),
    approval: approval ? toApproval(approval) : null,
    withdrawn: approval ? null : withdrawnApproval(db, jobId),
    payments: jobPayments(db, jobId).map(toPayment),
  };
}

function figures(a: ProfileAnalysis): OwnerViewOption['figures'] {
  return {
    intakeLiftIn: a.intake.valveLift,
    exhaustLiftIn: a.exhaust.valveLift,
    intakeDuration050: a.intake.duration050,
    exhaustDuration050: a.exhaust.duration050,
  };
}

/** The checksum over an option's whole offer in `currency`: what the owner's approval must quote. */
export const optionOffer = (option: Pick<OptionRow, 'checksum' | 'title' | 'priceCents' | 'depositCents' | 'leadTimeDays'>, currency: string) =>
  offerChecksum({
    checksum: option.checksum,
    title: option.title,
    priceCents: option.priceCents,
    depositCents: option.depositCents,
    leadTimeDays: option.leadTimeDays,
    currency,
  });

/** How this server prices and takes deposits. */
export type OwnerTerms = { currency: string; depositsOn: boolean };

/**
 * The owner's page: the shop's words about what failed, shareable photos, and
 * each option compared in plain words with the first (the reference). Nothing
 * internal: no findings, notes, core notes, measurements or grinder threads.
 */
export function loadOwnerView(
  db: Reader,
  link: Pick<LinkRow, 'shopId' | 'jobId' | 'expiresAt'>,
  photoUrl: (id: string) => string,
  terms: OwnerTerms,
): OwnerView {
  const job = db
    .select({ vehicle: schema.jobs.vehicle, customerName: schema.jobs.customerName, shopName: schema.shops.name })
    .from(schema.jobs)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.jobs.shopId))
    .where(and(eq(schema.jobs.id, link.jobId), eq(schema.jobs.shopId, link.shopId)))
    .get();
  if (!job) throw new Error(`Share link points at a missing job ${link.jobId}`);
  const limits = loadShopLimits(db, link.shopId).limits;
  const rows = optionRows(db, link.shopId, link.jobId);
  const latest = latestRevisionNumbers(db, link.jobId);
  const analyses = rows.map((r) => analyzeRecords(r.revision.engine, r.revision.spec, { limits }));
  const reference = rows[0];
  const options = rows.map((r, i): OwnerViewOption => {
    const a = analyses[i]!;
    // What the tech measured on the engine, once the fit checks ran against this revision, stands over the numbers alone.
    const run = latestRunOfRevision(db, link.shopId, r.option.revisionId);
    return {
      id: r.option.id,
      title: r.option.title,
      ownerNote: r.option.ownerNote,
      priceCents: r.option.priceCents,
      depositCents: r.option.depositCents,
      leadTimeDays: r.option.leadTimeDays,
      checksum: r.option.checksum,
      offer: optionOffer(r.option, terms.currency),
      revisionNumber: r.revision.number,
      updating: optionStaleness(r.option, r.revision, latest.get(r.option.sheetId) ?? r.revision.number),
      status: a.status,
      summary: run ? run.summary : summarizeChecks(a),
      checkedOnEngine: run ? { revisionNumber: run.revisionNumber, at: run.createdAt, by: run.createdByName } : null,
      comparison:
        i === 0 || !reference
          ? null
          : compareProfilesForOwner({ current: analyses[0]!, candidate: a, currentName: reference.option.title, candidateName: r.option.title }),
      fit: run ? ownerFitText(run.results, r.option.title, 'engine') : ownerFitText(a, r.option.title),
      core: ownerCoreText(r.revision.results.feasibility, r.option.title),
      figures: figures(a),
    };
  });
  const photos = shareablePhotos(db, link);
  const approval = loadApproval(db, link.jobId);
  const payments = jobPayments(db, link.jobId);
  // The paid deposit if there is one, else the newest attempt; a refunded second payment never stands for it.
  const payment = payments.find((p) => p.state === 'paid') ?? payments.find((p) => p.state === 'open' || p.state === 'expired');
  return {
    shopName: job.shopName,
    vehicle: job.vehicle,
    customerName: job.customerName,
    whatFailed: loadOwnerPage(db, link.shopId, link.jobId)?.whatFailed ?? '',
    photos: photos.map((p) => ({ ...p, url: photoUrl(p.id) })),
    options,
    cautions: [...OWNER_CAUTIONS, productCautions.practice],
    approval: approval ? toApproval(approval) : null,
    withdrawn: approval ? null : withdrawnApproval(db, link.jobId),
    payment: payment ? toPayment(payment) : null,
    currency: terms.currency,
    depositsOn: terms.depositsOn,
    expiresAt: link.expiresAt.toISOString(),
  };
}

/** Once the owner has approved, the offer is what they approved: options stay as they are. */
function requireNotApproved(db: Pick<Db, 'select'>, jobId: string) {
  if (loadApproval(db, jobId)) throw conflict('The owner has already approved an option; the options can no longer change');
}

/** The sheet's latest revision, in the shop's job. */
function latestRevision(db: Pick<Db, 'select'>, shopId: string, jobId: string, sheetId: string) {
  const row = db
    .select({ revision: schema.sheetRevisions })
    .from(schema.sheetRevisions)
    .innerJoin(schema.specSheets, eq(schema.specSheets.id, schema.sheetRevisions.sheetId))
    .where(and(eq(schema.specSheets.id, sheetId), eq(schema.specSheets.shopId, shopId), eq(schema.specSheets.jobId, jobId)))
    .orderBy(desc(schema.sheetRevisions.number))
    .get();
  return row?.revision;
}

function loadOption(db: Pick<Db, 'select'>, shopId: string, id: string) {
  const row = db
    .select()
    .from(schema.ownerOptions)
    .where(and(eq(schema.ownerOptions.id, id), eq(schema.ownerOptions.shopId, shopId)))
    .get();
  if (!row) throw notFound('Option');
  return row;
}

/** Saves the owner's words about what failed, at `version` (0 writes the first). */
export function saveOwnerWords(db: Db, who: Actor, jobId: string, body: { version: number; whatFailed: string }): OwnerDesk {
  return db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const current = loadOwnerPage(tx, who.shopId, jobId);
    if ((current?.version ?? 0) !== body.version) throw conflict("Someone else changed the owner's page: reload to see their changes");
    if (current) {
      tx.update(schema.ownerPages)
        .set({ whatFailed: body.whatFailed, version: body.version + 1, updatedAt: new Date() })
        .where(and(eq(schema.ownerPages.jobId, jobId), eq(schema.ownerPages.version, body.version)))
        .run();
    } else {
      tx.insert(schema.ownerPages).values({ jobId, shopId: who.shopId, whatFailed: body.whatFailed }).run();
    }
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'update', entity: 'owner-page', entityId: jobId });
    return loadOwnerDesk(tx, who.shopId, jobId);
  });
}

/** Offers the owner an option: the sheet's latest revision, bound by its checksum, with a price, deposit and lead time. */
export function createOption(db: Db, who: Actor, jobId: string, body: z.output<typeof ownerOptionCreateSchema>): OwnerDesk {
  return db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    requireNotApproved(tx, jobId);
    const revision = latestRevision(tx, who.shopId, jobId, body.sheetId);
    if (!revision) throw new HttpError(400, 'invalid', "sheetId: Choose one of this job's spec sheets", { sheetId: "Choose one of this job's spec sheets" });
    const last = tx
      .select({ position: max(schema.ownerOptions.position) })
      .from(schema.ownerOptions)
      .where(eq(schema.ownerOptions.jobId, jobId))
      .get();
    const id = crypto.randomUUID();
    const { sheetId, ...fields } = body;
    const checksum = revisionChecksum(revision);
    tx.insert(schema.ownerOptions)
      .values({
        id,
        shopId: who.shopId,
        jobId,
        sheetId,
        revisionId: revision.id,
        checksum,
        ...fields,
        position: (last?.position ?? 0) + 1,
        createdBy: who.userId,
      })
      .run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'create',
      entity: 'owner-option',
      entityId: id,
      detail: { jobId, sheetId, revision: revision.number, checksum },
    });
    return loadOwnerDesk(tx, who.shopId, jobId);
  });
}

/** Changes an option at `version`; `refreshRevision` re-binds it to its sheet's latest revision. */
export function updateOption(db: Db, who: Actor, id: string, { version, refreshRevision, ...changes }: z.output<typeof ownerOptionPatchSchema>): OwnerDesk {
  return db.transaction((tx) => {
    const current = loadOption(tx, who.shopId, id);
    requireNotApproved(tx, current.jobId);
    if (current.version !== version) throw conflict('Someone else changed this option: reload to see their changes');
    const price = changes.priceCents ?? current.priceCents;
    const deposit = changes.depositCents ?? current.depositCents;
    if (deposit > price)
      throw new HttpError(400, 'invalid', 'depositCents: The deposit cannot be more than the price', {
        depositCents: 'The deposit cannot be more than the price',
      });
    const revision = refreshRevision ? latestRevision(tx, who.shopId, current.jobId, current.sheetId) : undefined;
    tx.update(schema.ownerOptions)
      .set({
        ...changes,
        ...(revision ? { revisionId: revision.id, checksum: revisionChecksum(revision) } : {}),
        version: version + 1,
        updatedAt: new Date(),
      })
      .where(and(eq(schema.ownerOptions.id, current.id), eq(schema.ownerOptions.version, version)))
      .run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'update',
      entity: 'owner-option',
      entityId: current.id,
      detail: { jobId: current.jobId, fields: Object.keys(changes), ...(revision ? { revision: revision.number } : {}) },
    });
    return loadOwnerDesk(tx, who.shopId, current.jobId);
  });
}

export function deleteOption(db: Db, who: Actor, id: string): OwnerDesk {
  return db.transaction((tx) => {
    const current = loadOption(tx, who.shopId, id);
    requireNotApproved(tx, current.jobId);
    tx.delete(schema.ownerOptions)
      .where(and(eq(schema.ownerOptions.id, current.id), eq(schema.ownerOptions.shopId, who.shopId)))
      .run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'delete',
      entity: 'owner-option',
      entityId: current.id,
      detail: { jobId: current.jobId, title: current.title },
    });
    return loadOwnerDesk(tx, who.shopId, current.jobId);
  });
}

/**
 * The owner approves one option through an open link: the checksum and offer they read must still be
 * the option's (a 409 if the builder changed it since); one approval per job, with its audit row.
 */
export function approveOption(
  db: Db,
  linkId: string,
  userId: string | null,
  currency: string,
  body: z.output<typeof approveSchema>,
  /** `firmed`: the order already out for a quote on the approved revision, which this approval made the firm order. */
  after?: (tx: Writer, row: ApprovalRow, firmed: Order | undefined) => void,
): ApprovalRow {
  return db.transaction((tx) => {
    const link = linkById(tx, linkId);
    if (!linkOpen(link)) throw linkGone();
    if (loadApproval(tx, link.jobId)) throw conflict('An option is already approved for this job; call the shop to change it');
    const option = tx
      .select()
      .from(schema.ownerOptions)
      .where(and(eq(schema.ownerOptions.id, body.optionId), eq(schema.ownerOptions.jobId, link.jobId), eq(schema.ownerOptions.shopId, link.shopId)))
      .get();
    if (!option)
      throw new HttpError(400, 'invalid', 'optionId: Choose one of the options on this page', { optionId: 'Choose one of the options on this page' });
    // The whole offer, not only the revision: a price, deposit, currency, lead time or name changed since the page was read is refused.
    const offer = optionOffer(option, currency);
    if (option.checksum !== body.checksum || offer !== body.offer) {
      throw new HttpError(409, 'offer_changed', 'The shop changed this option after you opened the page: reload the page and read it again before approving');
    }
    // The sheet moved on under the option (a newer revision, or its draft edited): approving would name a revision
    // and checksum the sheet no longer holds, so the shop has to offer the current one first.
    const revision = tx.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, option.revisionId)).get();
    const latest = tx
      .select({ number: max(schema.sheetRevisions.number) })
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.sheetId, option.sheetId))
      .get();
    const stale = revision ? optionStaleness(option, revision, latest?.number ?? revision.number) : 'its revision is gone';
    if (stale) {
      throw new HttpError(409, 'option_stale', ownerUpdatingText(stale));
    }
    // The shop already went ahead with another revision without the owner: approving this one would make a second.
    const firm = liveFirmOrder(tx, link.jobId);
    if (firm && firm.revisionId !== option.revisionId) {
      throw conflict('The shop has already ordered another option for this vehicle. Call the shop before you approve this one.');
    }
    const row = tx
      .insert(schema.ownerApprovals)
      .values({
        id: crypto.randomUUID(),
        shopId: link.shopId,
        jobId: link.jobId,
        optionId: option.id,
        revisionId: option.revisionId,
        checksum: option.checksum,
        optionTitle: option.title,
        priceCents: option.priceCents,
        depositCents: option.depositCents,
        currency: currency,
        leadTimeDays: option.leadTimeDays,
        offerChecksum: offer,
        approverName: body.name,
        shareLinkId: link.id,
      })
      .returning()
      .get();
    audit(tx, {
      shopId: link.shopId,
      userId,
      action: 'approve',
      entity: 'owner-approval',
      entityId: row.id,
      detail: { jobId: link.jobId, optionId: option.id, checksum: option.checksum, offer, name: body.name, shareLinkId: link.id },
    });
    // The revision was already sent for a quote: its order becomes the firm order, the one the grinder may grind.
    const quoted = orderOfRevision(tx, option.revisionId);
    const firmed = quoted && !quoted.firm ? makeFirm(tx, { shopId: link.shopId, userId }, quoted.id, { by: 'owner', reason: null }) : undefined;
    after?.(tx, row, firmed);
    return row;
  });
}

/** One page of the jobs whose open links were sent to this address, newest link first, with approval and payment. */
export function ownerJobsPage(db: Reader, shopId: string, email: string, { limit, after }: PageRequest) {
  // One entry per job, in the order of its newest open link (keyset on that time and the job id); the list needs no analysis.
  const links = schema.shareLinks;
  const newest = sql<number>`max(${links.createdAt})`;
  const grouped = db
    .select({ jobId: links.jobId, newest })
    .from(links)
    .where(and(eq(links.shopId, shopId), eq(links.email, email.toLowerCase()), isNull(links.revokedAt), gt(links.expiresAt, new Date())))
    .groupBy(links.jobId)
    .having(after ? sql`${newest} < ${after.at} or (${newest} = ${after.at} and ${links.jobId} < ${after.id})` : undefined)
    .orderBy(desc(newest), desc(links.jobId))
    .limit(limit + 1)
    .all();
  const page = toPage(grouped, limit, (g) => ({ at: Number(g.newest), id: g.jobId }));
  const jobIds = page.rows.map((g) => g.jobId);
  if (!jobIds.length) return { jobs: [], nextCursor: null };
  const vehicles = new Map(
    db
      .select({ id: schema.jobs.id, vehicle: schema.jobs.vehicle })
      .from(schema.jobs)
      .where(inArray(schema.jobs.id, jobIds))
      .all()
      .map((j) => [j.id, j.vehicle]),
  );
  const approved = new Set(
    db
      .select({ jobId: schema.ownerApprovals.jobId })
      .from(schema.ownerApprovals)
      .where(and(inArray(schema.ownerApprovals.jobId, jobIds), isNull(schema.ownerApprovals.withdrawnAt)))
      .all()
      .map((a) => a.jobId),
  );
  const paid = paidJobIds(db, jobIds);
  return {
    jobs: jobIds.map((jobId) => ({ jobId, vehicle: vehicles.get(jobId) ?? '', approved: approved.has(jobId), paid: paid.has(jobId) })),
    nextCursor: page.nextCursor,
  };
}
