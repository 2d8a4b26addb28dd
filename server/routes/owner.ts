import { createHash, randomBytes } from 'node:crypto';

import { Router } from 'express';
import { and, desc, eq, max } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { revisionChecksum } from '@/shared/checksum';
import { ownerOptionCreateSchema, ownerOptionPatchSchema, ownerPageSchema, shareLinkCreateSchema, shareLinkLimits } from '@/shared/owner';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound, parse } from '../http';
import { mailEach } from '../mail';
import { shareLinkMail, shareUrl } from '../mail/owner-mail';
import { loadApproval, loadOwnerDesk, loadOwnerPage, toShareLink } from '../owner-view';
import { requireJob } from '../scope';



/** A new share token: 256 random bits, URL-safe. Only its hash is stored. */
export function newShareToken() {
  return randomBytes(shareLinkLimits.tokenBytes).toString('base64url');
}

export function hashShareToken(token: string) {
  return createHash('sha256').update(token).digest('hex');
}

type NewLink = { id?: string; shopId: string; jobId: string; email: string | null; days: number; createdBy: string | null };

/** Writes a share link with a fresh token; the token is returned this once and only its hash is stored. */
export function insertShareLink(tx: Pick<Db, 'insert'>, { id = crypto.randomUUID(), days, ...link }: NewLink) {
  const token = newShareToken();
  const expiresAt = new Date(Date.now() + days * 24 * 3600 * 1000);
  const row = tx.insert(schema.shareLinks).values({ id, ...link, tokenHash: hashShareToken(token), expiresAt }).returning().get();
  return { row, token };
}

/**
 * The owner a link is e-mailed to also gets a customer account in the shop:
 * at once when someone already signed up with that address and verified it, otherwise
 * when the address is verified (a pending invitation, accepted by the user hook in server/auth.ts).
 * Someone already in the shop keeps their role.
 */
function inviteOwner(tx: Pick<Db, 'select' | 'insert'>, shopId: string, inviterId: string, email: string, expiresAt: Date) {
  const user = tx.select({ id: schema.users.id, emailVerified: schema.users.emailVerified }).from(schema.users).where(eq(schema.users.email, email)).get();
  if (user?.emailVerified) {
    tx.insert(schema.memberships).values({ id: crypto.randomUUID(), organizationId: shopId, userId: user.id, role: 'customer' }).onConflictDoNothing().run();
    return;
  }
  tx.insert(schema.invitations).values({ id: crypto.randomUUID(), organizationId: shopId, email, role: 'customer', status: 'pending', expiresAt, inviterId }).run();
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

/**
 * The builder's side of the owner's page: the words about what failed, the
 * options offered (each bound to a sheet revision by checksum), and share links.
 */
export function ownerRouter({ db, auth, mailer, publicUrl }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/owner', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    res.json({ desk: loadOwnerDesk(db, ctx.shop.id, req.params.jobId) });
  });

  router.put('/jobs/:jobId/owner', async (req, res) => {
    const body = parse(ownerPageSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const jobId = req.params.jobId;
    const desk = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const current = loadOwnerPage(tx, ctx.shop.id, jobId);
      if ((current?.version ?? 0) !== body.version) throw conflict("Someone else changed the owner's page: reload to see their changes");
      if (current) {
        tx.update(schema.ownerPages)
          .set({ whatFailed: body.whatFailed, version: body.version + 1, updatedAt: new Date() })
          .where(and(eq(schema.ownerPages.jobId, jobId), eq(schema.ownerPages.version, body.version)))
          .run();
      } else {
        tx.insert(schema.ownerPages).values({ jobId, shopId: ctx.shop.id, whatFailed: body.whatFailed }).run();
      }
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'update', entity: 'owner-page', entityId: jobId });
      return loadOwnerDesk(tx, ctx.shop.id, jobId);
    });
    res.json({ desk });
  });

  router.post('/jobs/:jobId/owner/options', async (req, res) => {
    const body = parse(ownerOptionCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const jobId = req.params.jobId;
    const desk = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      requireNotApproved(tx, jobId);
      const revision = latestRevision(tx, ctx.shop.id, jobId, body.sheetId);
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
        .values({ id, shopId: ctx.shop.id, jobId, sheetId, revisionId: revision.id, checksum, ...fields, position: (last?.position ?? 0) + 1, createdBy: ctx.user.id })
        .run();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'owner-option', entityId: id, detail: { jobId, sheetId, revision: revision.number, checksum } });
      return loadOwnerDesk(tx, ctx.shop.id, jobId);
    });
    res.status(201).json({ desk });
  });

  router.patch('/owner-options/:id', async (req, res) => {
    const { version, refreshRevision, ...changes } = parse(ownerOptionPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const desk = db.transaction((tx) => {
      const current = loadOption(tx, ctx.shop.id, req.params.id);
      requireNotApproved(tx, current.jobId);
      if (current.version !== version) throw conflict('Someone else changed this option: reload to see their changes');
      const price = changes.priceCents ?? current.priceCents;
      const deposit = changes.depositCents ?? current.depositCents;
      if (deposit > price) throw new HttpError(400, 'invalid', 'depositCents: The deposit cannot be more than the price', { depositCents: 'The deposit cannot be more than the price' });
      const revision = refreshRevision ? latestRevision(tx, ctx.shop.id, current.jobId, current.sheetId) : undefined;
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
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'update',
        entity: 'owner-option',
        entityId: current.id,
        detail: { jobId: current.jobId, fields: Object.keys(changes), ...(revision ? { revision: revision.number } : {}) },
      });
      return loadOwnerDesk(tx, ctx.shop.id, current.jobId);
    });
    res.json({ desk });
  });

  router.delete('/owner-options/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const desk = db.transaction((tx) => {
      const current = loadOption(tx, ctx.shop.id, req.params.id);
      requireNotApproved(tx, current.jobId);
      tx.delete(schema.ownerOptions).where(and(eq(schema.ownerOptions.id, current.id), eq(schema.ownerOptions.shopId, ctx.shop.id))).run();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'delete', entity: 'owner-option', entityId: current.id, detail: { jobId: current.jobId, title: current.title } });
      return loadOwnerDesk(tx, ctx.shop.id, current.jobId);
    });
    res.json({ desk });
  });

  router.post('/jobs/:jobId/share-links', async (req, res) => {
    const body = parse(shareLinkCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const jobId = req.params.jobId;
    const { link, token, expiresAt, vehicle } = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      const hasOptions = tx.select({ id: schema.ownerOptions.id }).from(schema.ownerOptions).where(eq(schema.ownerOptions.jobId, jobId)).get();
      if (!hasOptions) throw conflict('Offer the owner at least one option before sharing the page');
      const made = insertShareLink(tx, { shopId: ctx.shop.id, jobId, email: body.email ?? null, days: body.expiresInDays, createdBy: ctx.user.id });
      const { row } = made;
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'share-link', entityId: row.id, detail: { jobId, expiresAt: row.expiresAt.toISOString(), emailed: Boolean(body.email) } });
      if (body.email) inviteOwner(tx, ctx.shop.id, ctx.user.id, body.email, row.expiresAt);
      const job = tx.select({ vehicle: schema.jobs.vehicle }).from(schema.jobs).where(eq(schema.jobs.id, jobId)).get();
      return { link: toShareLink(row), token: made.token, expiresAt: row.expiresAt, vehicle: job?.vehicle ?? '' };
    });
    const url = shareUrl(publicUrl, token);
    const to = body.email ? [{ email: body.email, name: 'vehicle owner' }] : [];
    const emailed = (await mailEach(mailer, to, (person) => shareLinkMail(person, { shopName: ctx.shop.name, vehicle, url, expiresAt }), `Share link ${link.id}`)) > 0;
    // The token is shown this once; only its hash is kept.
    res.status(201).json({ link, token, url, emailed });
  });

  router.post('/share-links/:id/revoke', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const link = db.transaction((tx) => {
      const row = tx
        .select()
        .from(schema.shareLinks)
        .where(and(eq(schema.shareLinks.id, req.params.id), eq(schema.shareLinks.shopId, ctx.shop.id)))
        .get();
      if (!row) throw notFound('Share link');
      if (row.revokedAt) return toShareLink(row);
      const updated = tx.update(schema.shareLinks).set({ revokedAt: new Date() }).where(eq(schema.shareLinks.id, row.id)).returning().get();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'revoke', entity: 'share-link', entityId: row.id, detail: { jobId: row.jobId } });
      return toShareLink(updated);
    });
    res.json({ link });
  });

  return router;
}
