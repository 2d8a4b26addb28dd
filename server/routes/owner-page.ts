import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';

import type { Db } from '@/db';
import { approveSchema, depositConfirmSchema, ownerOptionCreateSchema, ownerOptionPatchSchema, ownerPageSchema, shareLinkCreateSchema } from '@/shared/owner';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { notFound, parse } from '../http';
import { queueEach } from '../mail';
import { queueOrderMail } from '../mail/order-mail';
import { queueBuilderMail, shareLinkMail, shareUrl } from '../mail/owner-mail';
import { pageRequest } from '../paging';
import { confirmDeposit, requirePayments, startDeposit } from '../payments/deposits';
import { requireJob } from '../store/jobs';
import {
  approveOption,
  createOption,
  deleteOption,
  linkGone,
  loadOwnerDesk,
  loadOwnerView,
  ownerJobsPage,
  saveOwnerWords,
  toApproval,
  updateOption,
} from '../store/owner-page';
import { requireShareablePhoto } from '../store/photos';
import { databaseRateLimitStore } from '../store/rate-limits';
import { createShareLink, linkByToken, linkOpen, markOpened, ownLinks, revokeShareLink, type LinkRow } from '../store/share-links';
import { sendPhotoFile } from '../uploads/photo-files';

/**
 * The builder's side of the owner page: the words about what failed, the
 * options offered (each bound to a sheet revision by checksum), and share links.
 */
export function ownerPageDeskRouter({ db, auth, mailer, publicUrl }: AppDeps) {
  const router = Router();

  router.get('/jobs/:jobId/owner', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    res.json({ desk: loadOwnerDesk(db, ctx.shop.id, req.params.jobId) });
  });

  router.put('/jobs/:jobId/owner', async (req, res) => {
    const body = parse(ownerPageSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.json({ desk: saveOwnerWords(db, actorOf(ctx), req.params.jobId, body) });
  });

  router.post('/jobs/:jobId/owner/options', async (req, res) => {
    const body = parse(ownerOptionCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.status(201).json({ desk: createOption(db, actorOf(ctx), req.params.jobId, body) });
  });

  router.patch('/owner-options/:id', async (req, res) => {
    const body = parse(ownerOptionPatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.json({ desk: updateOption(db, actorOf(ctx), req.params.id, body) });
  });

  router.delete('/owner-options/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.json({ desk: deleteOption(db, actorOf(ctx), req.params.id) });
  });

  router.post('/jobs/:jobId/share-links', async (req, res) => {
    const body = parse(shareLinkCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    const to = body.email ? [{ email: body.email, name: 'vehicle owner' }] : [];
    // The mail to the owner commits with the link or not at all.
    const { link, token } = createShareLink(db, actorOf(ctx), req.params.jobId, body, (tx, made) =>
      queueEach(
        mailer,
        tx,
        to,
        (person) => shareLinkMail(person, { shopName: ctx.shop.name, vehicle: made.vehicle, url: shareUrl(publicUrl, made.token), expiresAt: made.expiresAt }),
        ctx.shop.id,
      ),
    );
    const url = shareUrl(publicUrl, token);
    const emailed = to.length > 0;
    // The token is shown this once; only its hash is kept.
    res.status(201).json({ link, token, url, emailed });
  });

  router.post('/share-links/:id/revoke', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['update'] });
    res.json({ link: revokeShareLink(db, actorOf(ctx), req.params.id) });
  });

  return router;
}

/** Tokens are 32 random bytes in base64url: exactly 43 characters. */
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

function activeLink(db: Pick<Db, 'select'>, token: string): LinkRow {
  if (!TOKEN_SHAPE.test(token)) throw linkGone();
  const row = linkByToken(db, token);
  if (!linkOpen(row)) throw linkGone();
  return row;
}

export type ShareRateLimit = { windowMs: number; limit: number };

/** Which share link a request acts through, and where its API and page live. */
/** `returnUrl`: where the payment page sends the owner back; never carries a share token, which must not leave Lobewright. */
type Resolved = { link: LinkRow; apiBase: string; returnUrl: string; userId?: string };
type Resolve = (req: Request) => Resolved | Promise<Resolved>;

/**
 * The owner page: read it, see its photos, approve an option, pay the deposit. Mounted twice:
 * at /share/:token for anyone holding the link (no account), and at
 * /my/jobs/:jobId for a signed-in owner (customer role) the link was sent to.
 */
export function ownerPageRouter(deps: AppDeps, limit: ShareRateLimit = { windowMs: 60_000, limit: 120 }) {
  const { db, auth, publicUrl } = deps;
  const origin = publicUrl.replace(/\/+$/, '');
  const router = Router();
  // Slows anyone trying tokens: a real owner opens a handful of pages a minute.
  router.use(
    '/share',
    rateLimit({
      ...limit,
      store: databaseRateLimitStore(db, 'share:'),
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req, res) => res.status(429).json({ error: { code: 'rate_limited', message: 'Too many requests: wait a minute and try again' } }),
    }),
  );

  const byToken: Resolve = (req) => {
    const token = String(req.params.token);
    // The share page keeps its own address in the tab's session storage and /share/back returns to it.
    return { link: activeLink(db, token), apiBase: `/api/share/${token}`, returnUrl: `${origin}/share/back` };
  };
  mountOwnerRoutes(router, '/share/:token', byToken, deps);

  router.get('/my/jobs', async (req, res) => {
    const request = pageRequest(req);
    const ctx = await requireShopRole(auth, db, req, { summary: ['read'] });
    const page = ownerJobsPage(db, ctx.shop.id, ctx.user.email, request);
    res.json({
      jobs: page.jobs.map(({ jobId, vehicle, approved, paid }) => ({ jobId, vehicle, shopName: ctx.shop.name, approved, paid })),
      nextCursor: page.nextCursor,
    });
  });
  // A signed-in owner: the newest open link of the job that was sent to their e-mail.
  const mine: Resolve = async (req) => {
    const jobId = String(req.params.jobId);
    const ctx = await requireShopRole(auth, db, req, { summary: ['read'] });
    const link = ownLinks(db, ctx.shop.id, ctx.user.email).find((l) => l.jobId === jobId);
    if (!link) throw notFound('Summary');
    return { link, userId: ctx.user.id, apiBase: `/api/my/jobs/${encodeURIComponent(jobId)}`, returnUrl: `${origin}/my/${encodeURIComponent(jobId)}` };
  };
  mountOwnerRoutes(router, '/my/jobs/:jobId', mine, deps);
  return router;
}

function mountOwnerRoutes(router: Router, at: string, resolve: Resolve, deps: AppDeps) {
  const { db, uploadsDir, payments } = deps;

  router.get(at, async (req, res) => {
    const { link, apiBase } = await resolve(req);
    markOpened(db, link.id);
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Referrer-Policy', 'no-referrer');
    res.json({ view: loadOwnerView(db, link, (id) => `${apiBase}/photos/${id}`, { currency: deps.currency, depositsOn: payments !== undefined }) });
  });

  router.get(`${at}/photos/:photoId`, async (req, res) => {
    const { link } = await resolve(req);
    await sendPhotoFile(res, uploadsDir, requireShareablePhoto(db, link, String(req.params.photoId)));
  });

  router.post(`${at}/approve`, async (req, res) => {
    const body = parse(approveSchema, req.body);
    // Resolve first (it may read the session); the checks and the write then share one transaction.
    const resolved = await resolve(req);
    const approval = approveOption(db, resolved.link.id, resolved.userId ?? null, deps.currency, body, (tx, row, firmed) => {
      queueBuilderMail(tx, deps, 'approved', row.jobId, row.shopId, { optionTitle: row.optionTitle, approverName: row.approverName, checksum: row.checksum });
      // A revision already out for a quote became the firm order: its grinder hears they may grind it.
      if (firmed) queueOrderMail(tx, deps, 'confirmed', firmed);
    });
    res.status(201).json({ approval: toApproval(approval) });
  });

  router.post(`${at}/deposit`, async (req, res) => {
    requirePayments(payments);
    const { link, returnUrl } = await resolve(req);
    const { url, created } = await startDeposit(deps, link, returnUrl);
    res.status(created ? 201 : 200).json({ url });
  });

  router.post(`${at}/deposit/confirm`, async (req, res) => {
    const body = parse(depositConfirmSchema, req.body);
    requirePayments(payments);
    const { link } = await resolve(req);
    res.json({ payment: await confirmDeposit(deps, link, body.sessionId) });
  });
}
