import { and, asc, desc, eq } from 'drizzle-orm';

import { compareProfilesForOwner, OWNER_CAUTIONS, ownerFitText } from '@/calc/compare';
import type { ProfileAnalysis } from '@/calc/analysis';
import type { Db } from '@/db';
import { schema } from '@/db';
import { analyzeRecords } from '@/shared/analysis';
import { offerChecksum } from '@/shared/checksum';
import { productCautions } from '@/shared/cautions';
import type { Approval, OwnerDesk, OwnerOption, OwnerView, OwnerViewOption, Payment, ShareLink } from '@/shared/owner';

import { loadShopLimits } from './routes/shop-limits';

type Reader = Pick<Db, 'select'>;
type OptionRow = typeof schema.ownerOptions.$inferSelect;
type LinkRow = typeof schema.shareLinks.$inferSelect;
type ApprovalRow = typeof schema.ownerApprovals.$inferSelect;
type PaymentRow = typeof schema.payments.$inferSelect;
type RevisionRow = typeof schema.sheetRevisions.$inferSelect;

export function linkState(row: Pick<LinkRow, 'revokedAt' | 'expiresAt'>, now = new Date()): ShareLink['state'] {
  if (row.revokedAt) return 'revoked';
  return row.expiresAt.getTime() <= now.getTime() ? 'expired' : 'active';
}

/** The link still opens the owner's page: not withdrawn, not expired. */
export const linkOpen = (row: Pick<LinkRow, 'revokedAt' | 'expiresAt'> | undefined): row is LinkRow => row !== undefined && linkState(row) === 'active';

export function toShareLink(row: LinkRow): ShareLink {
  return {
    id: row.id,
    state: linkState(row),
    email: row.email,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    revokedAt: row.revokedAt?.toISOString() ?? null,
    lastOpenedAt: row.lastOpenedAt?.toISOString() ?? null,
  };
}

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

export function toPayment(row: PaymentRow): Payment {
  return {
    id: row.id,
    state: row.state,
    amountCents: row.amountCents,
    currency: row.currency,
    paidAt: row.paidAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
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
    stale: (latest.get(row.sheetId) ?? revision.number) > revision.number,
  };
}

export function loadApproval(db: Reader, jobId: string) {
  return db.select().from(schema.ownerApprovals).where(eq(schema.ownerApprovals.jobId, jobId)).get();
}

function loadPayments(db: Reader, jobId: string) {
  return db.select().from(schema.payments).where(eq(schema.payments.jobId, jobId)).orderBy(desc(schema.payments.createdAt)).all();
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
  const links = db
    .select()
    .from(schema.shareLinks)
    .where(and(eq(schema.shareLinks.jobId, jobId), eq(schema.shareLinks.shopId, shopId)))
    .orderBy(desc(schema.shareLinks.createdAt))
    .all();
  return {
    jobId,
    whatFailed: page?.whatFailed ?? '',
    version: page?.version ?? 0,
    options: optionRows(db, shopId, jobId).map((r) => toOption(r.option, r.revision, latest)),
    links: links.map(toShareLink),
    approval: approval ? toApproval(approval) : null,
    payments: loadPayments(db, jobId).map(toPayment),
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
  offerChecksum({ checksum: option.checksum, title: option.title, priceCents: option.priceCents, depositCents: option.depositCents, leadTimeDays: option.leadTimeDays, currency });

/** How this server prices and takes deposits. */
export type OwnerTerms = { currency: string; depositsOn: boolean };

/**
 * The owner's page: the shop's words about what failed, shareable photos, and
 * each option compared in plain words with the first (the reference). Nothing
 * internal: no findings, notes, core notes, measurements or grinder threads.
 */
export function loadOwnerView(db: Reader, link: Pick<LinkRow, 'shopId' | 'jobId' | 'expiresAt'>, photoUrl: (id: string) => string, terms: OwnerTerms): OwnerView {
  const job = db
    .select({ vehicle: schema.jobs.vehicle, customerName: schema.jobs.customerName, shopName: schema.shops.name })
    .from(schema.jobs)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.jobs.shopId))
    .where(and(eq(schema.jobs.id, link.jobId), eq(schema.jobs.shopId, link.shopId)))
    .get();
  if (!job) throw new Error(`Share link points at a missing job ${link.jobId}`);
  const limits = loadShopLimits(db, link.shopId).limits;
  const rows = optionRows(db, link.shopId, link.jobId);
  const analyses = rows.map((r) => analyzeRecords(r.revision.engine, r.revision.spec, { limits }));
  const reference = rows[0];
  const options = rows.map((r, i): OwnerViewOption => {
    const a = analyses[i]!;
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
      status: a.status,
      comparison:
        i === 0 || !reference
          ? null
          : compareProfilesForOwner({ current: analyses[0]!, candidate: a, currentName: reference.option.title, candidateName: r.option.title }),
      fit: ownerFitText(a, r.option.title),
      figures: figures(a),
    };
  });
  const photos = db
    .select({ id: schema.photos.id, caption: schema.photos.caption })
    .from(schema.photos)
    .where(and(eq(schema.photos.jobId, link.jobId), eq(schema.photos.shopId, link.shopId), eq(schema.photos.shareable, true)))
    .orderBy(asc(schema.photos.createdAt))
    .all();
  const approval = loadApproval(db, link.jobId);
  const payments = loadPayments(db, link.jobId);
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
    payment: payment ? toPayment(payment) : null,
    currency: terms.currency,
    depositsOn: terms.depositsOn,
    expiresAt: link.expiresAt.toISOString(),
  };
}
