import express, { Router, type Request } from 'express';
import { and, desc, eq, gt, inArray, isNull, sql } from 'drizzle-orm';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';

import type { Db } from '@/db';
import { schema } from '@/db';
import { approveSchema, depositConfirmSchema, type Payment } from '@/shared/owner';

import type { Payments } from '../payments';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound, parse } from '../http';
import { mailEach } from '../mail';
import { pageRequest, toPage } from '../paging';
import { ownerEventMail, type OwnerEventFacts } from '../mail/owner-mail';
import { linkOpen, loadApproval, loadOwnerView, optionOffer, toApproval, toPayment } from '../owner-view';
import { hashShareToken } from './owner';
import { recipients } from './orders';
import { sendPhotoFile } from './photos';

type Tx = Pick<Db, 'select' | 'insert' | 'update'>;
type LinkRow = typeof schema.shareLinks.$inferSelect;

/** Tokens are 32 random bytes in base64url: exactly 43 characters. */
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

/** Missing, wrong, revoked and expired all look the same. */
const linkGone = () => new HttpError(404, 'not_found', 'This link does not open a summary: it may have expired or been withdrawn. Ask the shop for a new one.');

function activeLink(db: Pick<Db, 'select'>, token: string): LinkRow {
  if (!TOKEN_SHAPE.test(token)) throw linkGone();
  const row = db.select().from(schema.shareLinks).where(eq(schema.shareLinks.tokenHash, hashShareToken(token))).get();
  if (!linkOpen(row)) throw linkGone();
  return row;
}

export type ShareRateLimit = { windowMs: number; limit: number };

type PaymentRow = typeof schema.payments.$inferSelect;
/** What the payment service says about a checkout session: which one, what it took, and the payment it made. */
type SessionFacts = { id: string; amount_total?: number | null; currency?: string | null; payment_intent?: unknown };

/**
 * What one report of a paid session did:
 * - `paid`: the deposit is now paid;
 * - `already`: this session was settled before (a replay, or the return page after the webhook);
 * - `refused`: its amount or currency is not the deposit's, so nothing is paid;
 * - `refund`: the deposit was already paid through another session, so this payment is given back;
 * - `unknown`: no deposit has this session.
 */
type Settled =
  | { kind: 'paid' | 'already' | 'refund'; payment: PaymentRow }
  | { kind: 'refused'; payment: PaymentRow; fields: Record<string, string> }
  | { kind: 'unknown'; payment?: undefined };

const intentOf = (session: SessionFacts) => (typeof session.payment_intent === 'string' ? session.payment_intent : null);

/**
 * Settles a paid session against the deposit it was opened for. The amount and currency
 * are compared with what was asked (never taken from the report), and a deposit is paid
 * at most once: a second paid session is marked for refund.
 */
function settlePaid(tx: Tx, session: SessionFacts, via: 'webhook' | 'return'): Settled {
  const row = tx.select().from(schema.payments).where(eq(schema.payments.checkoutSessionId, session.id)).get();
  if (!row) return { kind: 'unknown' };
  if (row.state === 'paid' || row.state === 'refund-due' || row.state === 'refunded') return { kind: 'already', payment: row };
  const fields: Record<string, string> = {};
  if (session.amount_total !== row.amountCents) fields['data.object.amount_total'] = `The deposit is ${row.amountCents} cents, not ${session.amount_total ?? 'none'}`;
  if (session.currency !== row.currency) fields['data.object.currency'] = `The deposit is in ${row.currency}, not ${session.currency ?? 'none'}`;
  if (Object.keys(fields).length) {
    audit(tx, { shopId: row.shopId, userId: null, action: 'refuse', entity: 'payment', entityId: row.id, detail: { jobId: row.jobId, via, expected: { amountCents: row.amountCents, currency: row.currency }, reported: { amountCents: session.amount_total ?? null, currency: session.currency ?? null } } });
    return { kind: 'refused', payment: row, fields };
  }
  const paidBefore = tx
    .select({ id: schema.payments.id })
    .from(schema.payments)
    .where(and(eq(schema.payments.approvalId, row.approvalId), eq(schema.payments.state, 'paid')))
    .get();
  const state = paidBefore ? ('refund-due' as const) : ('paid' as const);
  const payment = tx.update(schema.payments).set({ state, paidAt: new Date(), paymentIntentId: intentOf(session) }).where(eq(schema.payments.id, row.id)).returning().get();
  audit(tx, {
    shopId: row.shopId,
    userId: null,
    action: paidBefore ? 'paid-twice' : 'paid',
    entity: 'payment',
    entityId: row.id,
    detail: { jobId: row.jobId, amountCents: row.amountCents, currency: row.currency, via, ...(paidBefore ? { alreadyPaidBy: paidBefore.id } : {}) },
  });
  return { kind: paidBefore ? 'refund' : 'paid', payment };
}

/** Gives back a second payment of a paid deposit through the payment service; if the service fails, it stays `refund-due` for the shop to see. */
async function refundSecond({ db, payments }: Pick<AppDeps, 'db' | 'payments'>, payment: PaymentRow) {
  if (!payments || !payment.paymentIntentId) return console.error(`Payment ${payment.id} was paid twice and needs a refund by hand: no payment to refund`);
  try {
    const refund = await payments.stripe.refunds.create({ payment_intent: payment.paymentIntentId }, { idempotencyKey: `refund-${payment.id}` });
    db.transaction((tx) => {
      tx.update(schema.payments).set({ state: 'refunded', refundId: refund.id }).where(and(eq(schema.payments.id, payment.id), eq(schema.payments.state, 'refund-due'))).run();
      audit(tx, { shopId: payment.shopId, userId: null, action: 'refund', entity: 'payment', entityId: payment.id, detail: { jobId: payment.jobId, refundId: refund.id, amountCents: payment.amountCents } });
    });
  } catch (error) {
    console.error(`Payment ${payment.id} was paid twice and the refund failed; it stays refund-due`, error);
  }
}

/** After the settling transaction commits: tell the builders of a new payment, or refund a second one. */
async function afterSettled(deps: AppDeps, settled: Settled) {
  if (settled.kind === 'paid') await tellBuildersPaid(deps, settled.payment);
  if (settled.kind === 'refund') await refundSecond(deps, settled.payment);
}

type MailDeps = Pick<AppDeps, 'db' | 'mailer' | 'publicUrl'>;

/** Mails every builder of the shop; a failure is logged and never undoes the write. */
async function tellBuilders({ db, mailer, publicUrl }: MailDeps, kind: 'approved' | 'paid', jobId: string, shopId: string, facts: Omit<OwnerEventFacts, 'publicUrl' | 'jobId' | 'vehicle'>) {
  const job = db.select({ vehicle: schema.jobs.vehicle }).from(schema.jobs).where(eq(schema.jobs.id, jobId)).get();
  await mailEach(mailer, recipients(db, shopId, 'builder'), (person) => ownerEventMail(kind, person, { ...facts, publicUrl, jobId, vehicle: job?.vehicle ?? 'vehicle' }), `Job ${jobId}, ${kind} mail`);
}

async function tellBuildersPaid(deps: MailDeps, payment: typeof schema.payments.$inferSelect) {
  const approval = loadApproval(deps.db, payment.jobId);
  if (!approval) return;
  await tellBuilders(deps, 'paid', payment.jobId, payment.shopId, {
    optionTitle: approval.optionTitle,
    approverName: approval.approverName,
    checksum: approval.checksum,
    amountCents: payment.amountCents,
    currency: payment.currency,
  });
}

/** Which share link a request acts through, and where its API and page live. */
/** `returnUrl`: where the payment page sends the owner back; never carries a share token, which must not leave Lobewright. */
type Resolved = { link: LinkRow; apiBase: string; returnUrl: string; userId?: string };
type Resolve = (req: Request, tx: Pick<Db, 'select'>) => Resolved | Promise<Resolved>;

/**
 * The owner's page: read it, approve an option, pay the deposit. Mounted twice:
 * at /share/:token for anyone holding the link (no account), and at
 * /my/jobs/:jobId for a signed-in owner (customer role) the link was sent to.
 */
export function shareRouter(deps: AppDeps, limit: ShareRateLimit = { windowMs: 60_000, limit: 120 }) {
  const { db, auth, publicUrl } = deps;
  const origin = publicUrl.replace(/\/+$/, '');
  const router = Router();
  // Slows anyone trying tokens: a real owner opens a handful of pages a minute.
  router.use('/share', rateLimit({ ...limit, standardHeaders: 'draft-8', legacyHeaders: false, handler: (_req, res) => res.status(429).json({ error: { code: 'rate_limited', message: 'Too many requests: wait a minute and try again' } }) }));

  const byToken: Resolve = (req, tx) => {
    const token = String(req.params.token);
    // The share page keeps its own address in the tab's session storage and /share/back returns to it.
    return { link: activeLink(tx, token), apiBase: `/api/share/${token}`, returnUrl: `${origin}/share/back` };
  };
  mountOwnerRoutes(router, '/share/:token', byToken, deps);

  // A signed-in owner: the newest open link of the job that was sent to their e-mail.
  const byAccount = async (req: Request) => {
    const ctx = await requireShopRole(auth, db, req, { summary: ['read'] });
    return { ctx, links: ownLinks(db, ctx.shop.id, ctx.user.email) };
  };
  router.get('/my/jobs', async (req, res) => {
    const { limit, after } = pageRequest(req);
    const ctx = await requireShopRole(auth, db, req, { summary: ['read'] });
    // One entry per job, in the order of its newest open link (keyset on that time and the job id); the list needs no analysis.
    const links = schema.shareLinks;
    const newest = sql<number>`max(${links.createdAt})`;
    const grouped = db
      .select({ jobId: links.jobId, newest })
      .from(links)
      .where(and(eq(links.shopId, ctx.shop.id), eq(links.email, ctx.user.email.toLowerCase()), isNull(links.revokedAt), gt(links.expiresAt, new Date())))
      .groupBy(links.jobId)
      .having(after ? sql`${newest} < ${after.at} or (${newest} = ${after.at} and ${links.jobId} < ${after.id})` : undefined)
      .orderBy(desc(newest), desc(links.jobId))
      .limit(limit + 1)
      .all();
    const page = toPage(grouped, limit, (g) => ({ at: Number(g.newest), id: g.jobId }));
    const jobIds = page.rows.map((g) => g.jobId);
    if (!jobIds.length) return void res.json({ jobs: [], nextCursor: null });
    const vehicles = new Map(
      db.select({ id: schema.jobs.id, vehicle: schema.jobs.vehicle }).from(schema.jobs).where(inArray(schema.jobs.id, jobIds)).all().map((j) => [j.id, j.vehicle]),
    );
    const approved = new Set(db.select({ jobId: schema.ownerApprovals.jobId }).from(schema.ownerApprovals).where(inArray(schema.ownerApprovals.jobId, jobIds)).all().map((a) => a.jobId));
    const paid = new Set(
      db
        .select({ jobId: schema.payments.jobId })
        .from(schema.payments)
        .where(and(inArray(schema.payments.jobId, jobIds), eq(schema.payments.state, 'paid')))
        .all()
        .map((p) => p.jobId),
    );
    res.json({
      jobs: jobIds.map((jobId) => ({ jobId, vehicle: vehicles.get(jobId) ?? '', shopName: ctx.shop.name, approved: approved.has(jobId), paid: paid.has(jobId) })),
      nextCursor: page.nextCursor,
    });
  });
  const mine: Resolve = async (req) => {
    const jobId = String(req.params.jobId);
    const { ctx, links } = await byAccount(req);
    const link = links.find((l) => l.jobId === jobId);
    if (!link) throw notFound('Summary');
    return { link, userId: ctx.user.id, apiBase: `/api/my/jobs/${encodeURIComponent(jobId)}`, returnUrl: `${origin}/my/${encodeURIComponent(jobId)}` };
  };
  mountOwnerRoutes(router, '/my/jobs/:jobId', mine, deps);
  return router;
}

/** Open links of the shop sent to this e-mail, newest first. */
function ownLinks(db: Pick<Db, 'select'>, shopId: string, email: string) {
  return db
    .select()
    .from(schema.shareLinks)
    .where(and(eq(schema.shareLinks.shopId, shopId), eq(schema.shareLinks.email, email.toLowerCase()), isNull(schema.shareLinks.revokedAt), gt(schema.shareLinks.expiresAt, new Date())))
    .orderBy(desc(schema.shareLinks.createdAt))
    .all();
}

/** A reservation older than this was left by a request that died while the payment service answered. */
const STALE_RESERVATION_MS = 60_000;

/**
 * In one transaction: the approval's open payment if there is one, else a new row
 * with no session yet. The row goes in before the payment service is called (never
 * from inside a transaction), and at most one row per approval is open (a unique
 * index), so two tabs cannot both start a session.
 */
function reserveDeposit(tx: Tx & Pick<Db, 'delete'>, link: LinkRow) {
  const approval = loadApproval(tx, link.jobId);
  if (!approval) throw conflict('Approve an option before paying the deposit');
  if (approval.depositCents <= 0) throw conflict('The shop asks no deposit for this option');
  const paid = tx.select({ id: schema.payments.id }).from(schema.payments).where(and(eq(schema.payments.approvalId, approval.id), eq(schema.payments.state, 'paid'))).get();
  if (paid) throw conflict('The deposit is already paid');
  const open = tx.select().from(schema.payments).where(and(eq(schema.payments.approvalId, approval.id), eq(schema.payments.state, 'open'))).get();
  if (open?.checkoutSessionId) return { kind: 'open' as const, payment: open, approval };
  if (open) {
    if (Date.now() - open.createdAt.getTime() < STALE_RESERVATION_MS) throw conflict('A payment page for this deposit is being opened: try again in a moment');
    tx.delete(schema.payments).where(eq(schema.payments.id, open.id)).run();
  }
  const payment = tx
    .insert(schema.payments)
    .values({ id: crypto.randomUUID(), shopId: link.shopId, jobId: link.jobId, approvalId: approval.id, amountCents: approval.depositCents, currency: approval.currency })
    .returning()
    .get();
  audit(tx, { shopId: link.shopId, userId: null, action: 'create', entity: 'payment', entityId: payment.id, detail: { jobId: link.jobId, amountCents: payment.amountCents, currency: payment.currency } });
  return { kind: 'reserved' as const, payment, approval };
}

/** Opens the checkout session for a reserved payment, for exactly the amount and currency approved; a failure removes the reservation. */
async function openSession(db: Db, service: Payments, payment: PaymentRow, optionTitle: string, back: string) {
  try {
    const session = await service.stripe.checkout.sessions.create(
      {
        mode: 'payment',
        client_reference_id: payment.id,
        metadata: { paymentId: payment.id, jobId: payment.jobId },
        success_url: `${back}?deposit={CHECKOUT_SESSION_ID}`,
        cancel_url: back,
        line_items: [{ quantity: 1, price_data: { currency: payment.currency, unit_amount: payment.amountCents, product_data: { name: `Deposit: ${optionTitle}` } } }],
      },
      { idempotencyKey: `deposit-${payment.id}` },
    );
    if (!session.url) throw new HttpError(502, 'payment_service', 'The payment service did not return a page to pay on; try again');
    db.update(schema.payments).set({ checkoutSessionId: session.id, checkoutUrl: session.url }).where(eq(schema.payments.id, payment.id)).run();
    return session.url;
  } catch (error) {
    db.delete(schema.payments).where(and(eq(schema.payments.id, payment.id), isNull(schema.payments.checkoutSessionId))).run();
    throw error;
  }
}

function mountOwnerRoutes(router: Router, at: string, resolve: Resolve, deps: AppDeps) {
  const { db, uploadsDir, payments } = deps;

  function requirePayments() {
    if (!payments) throw new HttpError(503, 'payments_off', 'Card payments are not set up on this server; the shop can take the deposit in person');
    return payments;
  }

  router.get(at, async (req, res) => {
    const { link, apiBase } = await resolve(req, db);
    db.update(schema.shareLinks).set({ lastOpenedAt: new Date() }).where(eq(schema.shareLinks.id, link.id)).run();
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Referrer-Policy', 'no-referrer');
    res.json({ view: loadOwnerView(db, link, (id) => `${apiBase}/photos/${id}`, { currency: deps.currency, depositsOn: payments !== undefined }) });
  });

  router.get(`${at}/photos/:photoId`, async (req, res) => {
    const { link } = await resolve(req, db);
    const row = db
      .select()
      .from(schema.photos)
      .where(and(eq(schema.photos.id, String(req.params.photoId)), eq(schema.photos.jobId, link.jobId), eq(schema.photos.shopId, link.shopId), eq(schema.photos.shareable, true)))
      .get();
    if (!row) throw notFound('Photo');
    await sendPhotoFile(res, uploadsDir, row);
  });

  router.post(`${at}/approve`, async (req, res) => {
    const body = parse(approveSchema, req.body);
    // Resolve first (it may read the session); the checks and the write then share one transaction.
    const resolved = await resolve(req, db);
    const approval = db.transaction((tx) => {
      const link = tx.select().from(schema.shareLinks).where(eq(schema.shareLinks.id, resolved.link.id)).get();
      if (!linkOpen(link)) throw linkGone();
      if (loadApproval(tx, link.jobId)) throw conflict('An option is already approved for this job; call the shop to change it');
      const option = tx
        .select()
        .from(schema.ownerOptions)
        .where(and(eq(schema.ownerOptions.id, body.optionId), eq(schema.ownerOptions.jobId, link.jobId), eq(schema.ownerOptions.shopId, link.shopId)))
        .get();
      if (!option) throw new HttpError(400, 'invalid', 'optionId: Choose one of the options on this page', { optionId: 'Choose one of the options on this page' });
      // The whole offer, not only the revision: a price, deposit, currency, lead time or name changed since the page was read is refused.
      const offer = optionOffer(option, deps.currency);
      if (option.checksum !== body.checksum || offer !== body.offer) {
        throw new HttpError(409, 'offer_changed', 'The shop changed this option after you opened the page: reload the page and read it again before approving');
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
          currency: deps.currency,
          leadTimeDays: option.leadTimeDays,
          offerChecksum: offer,
          approverName: body.name,
          shareLinkId: link.id,
        })
        .returning()
        .get();
      audit(tx, { shopId: link.shopId, userId: resolved.userId ?? null, action: 'approve', entity: 'owner-approval', entityId: row.id, detail: { jobId: link.jobId, optionId: option.id, checksum: option.checksum, offer, name: body.name, shareLinkId: link.id } });
      return row;
    });
    await tellBuilders(deps, 'approved', approval.jobId, approval.shopId, { optionTitle: approval.optionTitle, approverName: approval.approverName, checksum: approval.checksum });
    res.status(201).json({ approval: toApproval(approval) });
  });

  router.post(`${at}/deposit`, async (req, res) => {
    const service = requirePayments();
    const { link, returnUrl } = await resolve(req, db);
    // Twice at most: an open session found expired is closed, and one new one is opened.
    for (let attempt = 0; attempt < 2; attempt++) {
      const step = db.transaction((tx) => reserveDeposit(tx, link));
      if (step.kind === 'reserved') {
        const url = await openSession(db, service, step.payment, step.approval.optionTitle, returnUrl);
        return void res.status(201).json({ url });
      }
      // One open session per approval: asking again answers the same page while it can still be paid.
      const session = await service.stripe.checkout.sessions.retrieve(step.payment.checkoutSessionId!);
      if (session.status === 'open' && session.url) return void res.json({ url: session.url });
      if (session.status === 'complete' && session.payment_status === 'paid') {
        const settled = db.transaction((tx) => settlePaid(tx, session, 'return'));
        await afterSettled(deps, settled);
        throw conflict('The deposit is already paid');
      }
      db.update(schema.payments).set({ state: 'expired' }).where(and(eq(schema.payments.id, step.payment.id), eq(schema.payments.state, 'open'))).run();
    }
    throw new HttpError(502, 'payment_service', 'The payment service did not open a page to pay on; try again');
  });

  router.post(`${at}/deposit/confirm`, async (req, res) => {
    const body = parse(depositConfirmSchema, req.body);
    const service = requirePayments();
    const { link } = await resolve(req, db);
    const known = db
      .select()
      .from(schema.payments)
      .where(and(eq(schema.payments.checkoutSessionId, body.sessionId), eq(schema.payments.jobId, link.jobId)))
      .orderBy(desc(schema.payments.createdAt))
      .get();
    if (!known) throw notFound('Payment');
    let payment: Payment = toPayment(known);
    if (known.state === 'open' || known.state === 'expired') {
      const session = await service.stripe.checkout.sessions.retrieve(body.sessionId);
      if (session.payment_status === 'paid') {
        const settled = db.transaction((tx) => settlePaid(tx, session, 'return'));
        if (settled.payment) payment = toPayment(settled.payment);
        await afterSettled(deps, settled);
      }
    }
    res.json({ payment });
  });
}


/**
 * What the webhook reads of a verified event. A signature proves who sent it, not
 * its shape, so an event it cannot read is a 400 rather than a crash or a stored oddity.
 */
const webhookEventSchema = z.object({
  id: z.string({ error: 'Missing event id' }).min(1, 'Missing event id').max(255),
  type: z.string({ error: 'Missing event type' }).min(1, 'Missing event type').max(255),
  data: z.object({ object: z.unknown() }, { error: 'Missing event data' }),
});

/** The completed checkout session: the deposit it pays, its amount in cents and its currency. */
const completedSessionSchema = z.object({
  id: z.string({ error: 'Missing session id' }).min(1, 'Missing session id').max(255),
  payment_status: z.string({ error: 'Missing payment status' }),
  payment_intent: z.string({ error: 'Payment must be an id' }).max(255).nullish(),
  amount_total: z.number({ error: 'Amount must be a number of cents' }).int('Amount is in whole cents').min(0, 'Amount cannot be negative').max(10_000_000).nullish(),
  currency: z
    .string({ error: 'Currency must be a code' })
    .regex(/^[a-z]{3}$/, 'Currency is a three-letter code')
    .nullish(),
});

/** The event's fields, named as in the event (`data.object.currency`). */
function readEvent(body: unknown) {
  const event = parse(webhookEventSchema, body);
  if (event.type !== 'checkout.session.completed') return { ...event, session: undefined };
  try {
    return { ...event, session: parse(completedSessionSchema, event.data.object) };
  } catch (error) {
    if (!(error instanceof HttpError) || !error.fields) throw error;
    const fields = Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k === '(body)' ? 'data.object' : `data.object.${k}`, v]));
    throw new HttpError(400, 'invalid', `${Object.keys(fields)[0]}: ${Object.values(fields)[0]}`, fields);
  }
}

/**
 * The payment service's webhook. Reads the raw body (the signature covers its
 * exact bytes), so it is mounted before the JSON parser. A bad signature is a
 * 400 and changes nothing; an event id seen before is acknowledged and ignored.
 */
export function paymentWebhook(deps: AppDeps) {
  const { db, payments } = deps;
  const router = Router();
  router.post('/payments/webhook', express.raw({ type: '*/*', limit: '256kb' }), async (req: Request, res) => {
    if (!payments) throw new HttpError(503, 'payments_off', 'Payments are not set up on this server');
    const signature = req.headers['stripe-signature'];
    if (typeof signature !== 'string' || !Buffer.isBuffer(req.body)) {
      throw new HttpError(400, 'bad_signature', 'The event is not signed', { 'stripe-signature': 'Missing signature header' });
    }
    let verified: unknown;
    try {
      verified = payments.stripe.webhooks.constructEvent(req.body, signature, payments.webhookSecret);
    } catch {
      throw new HttpError(400, 'bad_signature', 'The event signature does not match', { 'stripe-signature': 'Signature does not match the body' });
    }
    const event = readEvent(verified);
    const outcome = db.transaction((tx) => {
      const fresh = tx.insert(schema.paymentEvents).values({ id: event.id, type: event.type }).onConflictDoNothing().run();
      if (fresh.changes === 0) return { duplicate: true as const };
      const settled: Settled = event.session?.payment_status === 'paid' ? settlePaid(tx, event.session, 'webhook') : { kind: 'unknown' };
      const recorded = event.session?.payment_status === 'paid' ? settled.kind : 'ignored';
      tx.update(schema.paymentEvents).set({ outcome: recorded }).where(eq(schema.paymentEvents.id, event.id)).run();
      return { duplicate: false as const, settled };
    });
    if (outcome.duplicate) return void res.json({ received: true, duplicate: true });
    const { settled } = outcome;
    if (settled.kind === 'refused') {
      throw new HttpError(400, 'amount_mismatch', 'The event does not pay this deposit: its amount or currency differs, so nothing was marked paid', settled.fields);
    }
    await afterSettled(deps, settled);
    res.json({ received: true, duplicate: false });
  });
  return router;
}
