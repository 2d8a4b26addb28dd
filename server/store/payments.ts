import { and, desc, eq, inArray, isNull, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { Payment } from '@/shared/owner';

import { conflict } from '../http';
import { audit } from './audit';
import type { AfterWrite, Reader, Writer } from './db';
import { loadApproval } from './owner-page';
import type { LinkRow } from './share-links';

export type PaymentRow = typeof schema.payments.$inferSelect;

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

/** The job's payments, newest first. */
export function jobPayments(db: Reader, jobId: string): PaymentRow[] {
  return db.select().from(schema.payments).where(eq(schema.payments.jobId, jobId)).orderBy(desc(schema.payments.createdAt)).all();
}

/** Whether any of these jobs has a paid deposit. */
export function paidJobIds(db: Reader, jobIds: string[]): Set<string> {
  if (!jobIds.length) return new Set();
  return new Set(
    db
      .select({ jobId: schema.payments.jobId })
      .from(schema.payments)
      .where(and(inArray(schema.payments.jobId, jobIds), eq(schema.payments.state, 'paid')))
      .all()
      .map((p) => p.jobId),
  );
}

/** The job's payment made through this checkout session, if any (newest first). */
export function paymentBySession(db: Reader, jobId: string, sessionId: string): PaymentRow | undefined {
  return db
    .select()
    .from(schema.payments)
    .where(and(eq(schema.payments.checkoutSessionId, sessionId), eq(schema.payments.jobId, jobId)))
    .orderBy(desc(schema.payments.createdAt))
    .get();
}

/** What the payment service says about a checkout session: which one, what it took, and the payment it made. */
export type SessionFacts = { id: string; amount_total?: number | null; currency?: string | null; payment_intent?: unknown };

/**
 * What one report of a paid session did:
 * - `paid`: the deposit is now paid;
 * - `already`: this session was settled before (a replay, or the return page after the webhook);
 * - `refused`: its amount or currency is not the deposit's, so nothing is paid;
 * - `refund`: the deposit was already paid through another session, so this payment is given back;
 * - `unknown`: no deposit has this session.
 */
export type Settled =
  | { kind: 'paid' | 'already' | 'refund'; payment: PaymentRow }
  | { kind: 'refused'; payment: PaymentRow; fields: Record<string, string> }
  | { kind: 'unknown'; payment?: undefined };

const intentOf = (session: SessionFacts) => (typeof session.payment_intent === 'string' ? session.payment_intent : null);

/**
 * Settles a paid session against the deposit it was opened for. The amount and currency
 * are compared with what was asked (never taken from the report), and a deposit is paid
 * at most once: a second paid session is marked for refund.
 */
export function settlePaid(tx: Writer, session: SessionFacts, via: 'webhook' | 'return'): Settled {
  const row = tx.select().from(schema.payments).where(eq(schema.payments.checkoutSessionId, session.id)).get();
  if (!row) return { kind: 'unknown' };
  if (row.state === 'paid' || row.state === 'refund-due' || row.state === 'refunded') return { kind: 'already', payment: row };
  const fields: Record<string, string> = {};
  if (session.amount_total !== row.amountCents)
    fields['data.object.amount_total'] = `The deposit is ${row.amountCents} cents, not ${session.amount_total ?? 'none'}`;
  if (session.currency !== row.currency) fields['data.object.currency'] = `The deposit is in ${row.currency}, not ${session.currency ?? 'none'}`;
  if (Object.keys(fields).length) {
    audit(tx, {
      shopId: row.shopId,
      userId: null,
      action: 'refuse',
      entity: 'payment',
      entityId: row.id,
      detail: {
        jobId: row.jobId,
        via,
        expected: { amountCents: row.amountCents, currency: row.currency },
        reported: { amountCents: session.amount_total ?? null, currency: session.currency ?? null },
      },
    });
    return { kind: 'refused', payment: row, fields };
  }
  const paidBefore = tx
    .select({ id: schema.payments.id })
    .from(schema.payments)
    .where(and(eq(schema.payments.approvalId, row.approvalId), eq(schema.payments.state, 'paid')))
    .get();
  const state = paidBefore ? ('refund-due' as const) : ('paid' as const);
  const payment = tx
    .update(schema.payments)
    .set({ state, paidAt: new Date(), paymentIntentId: intentOf(session) })
    .where(eq(schema.payments.id, row.id))
    .returning()
    .get();
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

/** A reservation older than this was left by a request that died while the payment service answered. */
const STALE_RESERVATION_MS = 60_000;

/**
 * In one transaction: the approval's open payment if there is one, else a new row
 * with no session yet. The row goes in before the payment service is called (never
 * from inside a transaction), and at most one row per approval is open (a unique
 * index), so two tabs cannot both start a session.
 */
export function reserveDeposit(tx: Writer, link: Pick<LinkRow, 'shopId' | 'jobId'>) {
  const approval = loadApproval(tx, link.jobId);
  if (!approval) throw conflict('Approve an option before paying the deposit');
  if (approval.depositCents <= 0) throw conflict('The shop asks no deposit for this option');
  const paid = tx
    .select({ id: schema.payments.id })
    .from(schema.payments)
    .where(and(eq(schema.payments.approvalId, approval.id), eq(schema.payments.state, 'paid')))
    .get();
  if (paid) throw conflict('The deposit is already paid');
  // A deposit paid under an approval that was withdrawn counts toward this one: the owner pays only the difference.
  const credit = tx
    .select({ cents: sql<number>`coalesce(sum(${schema.payments.amountCents}), 0)` })
    .from(schema.payments)
    .where(and(eq(schema.payments.jobId, link.jobId), eq(schema.payments.state, 'paid'), eq(schema.payments.currency, approval.currency)))
    .get();
  const dueCents = approval.depositCents - (credit?.cents ?? 0);
  if (dueCents <= 0) throw conflict('The deposit is already paid: what you paid with your earlier approval covers it');
  const open = tx
    .select()
    .from(schema.payments)
    .where(and(eq(schema.payments.approvalId, approval.id), eq(schema.payments.state, 'open')))
    .get();
  if (open?.checkoutSessionId) return { kind: 'open' as const, payment: open, approval };
  if (open) {
    if (Date.now() - open.createdAt.getTime() < STALE_RESERVATION_MS) throw conflict('A payment page for this deposit is being opened: try again in a moment');
    tx.delete(schema.payments).where(eq(schema.payments.id, open.id)).run();
  }
  const payment = tx
    .insert(schema.payments)
    .values({
      id: crypto.randomUUID(),
      shopId: link.shopId,
      jobId: link.jobId,
      approvalId: approval.id,
      amountCents: dueCents,
      currency: approval.currency,
    })
    .returning()
    .get();
  audit(tx, {
    shopId: link.shopId,
    userId: null,
    action: 'create',
    entity: 'payment',
    entityId: payment.id,
    detail: { jobId: link.jobId, amountCents: payment.amountCents, currency: payment.currency },
  });
  return { kind: 'reserved' as const, payment, approval };
}

/** Keeps the session the payment service opened for a reserved payment. */
export function storeSession(db: Pick<Db, 'update'>, paymentId: string, session: { id: string; url: string }) {
  db.update(schema.payments).set({ checkoutSessionId: session.id, checkoutUrl: session.url }).where(eq(schema.payments.id, paymentId)).run();
}

/** Removes a reservation whose session never opened. */
export function dropReservation(db: Pick<Db, 'delete'>, paymentId: string) {
  db.delete(schema.payments)
    .where(and(eq(schema.payments.id, paymentId), isNull(schema.payments.checkoutSessionId)))
    .run();
}

/** An open session the payment service says has expired. */
export function markExpired(db: Pick<Db, 'update'>, paymentId: string) {
  db.update(schema.payments)
    .set({ state: 'expired' })
    .where(and(eq(schema.payments.id, paymentId), eq(schema.payments.state, 'open')))
    .run();
}

/** A second payment given back through the payment service, audited. */
export function markRefunded(db: Db, payment: PaymentRow, refundId: string) {
  db.transaction((tx) => {
    tx.update(schema.payments)
      .set({ state: 'refunded', refundId })
      .where(and(eq(schema.payments.id, payment.id), eq(schema.payments.state, 'refund-due')))
      .run();
    audit(tx, {
      shopId: payment.shopId,
      userId: null,
      action: 'refund',
      entity: 'payment',
      entityId: payment.id,
      detail: { jobId: payment.jobId, refundId, amountCents: payment.amountCents },
    });
  });
}

/**
 * One webhook event in one transaction: its id is recorded first (a replay changes nothing and
 * says so), a paid session is settled, and the event keeps what it did.
 */
export function recordPaymentEvent(
  db: Db,
  event: { id: string; type: string; session?: SessionFacts & { payment_status: string } },
  after?: AfterWrite<Settled>,
): { duplicate: true } | { duplicate: false; settled: Settled } {
  return db.transaction((tx) => {
    const fresh = tx.insert(schema.paymentEvents).values({ id: event.id, type: event.type }).onConflictDoNothing().run();
    if (fresh.changes === 0) return { duplicate: true as const };
    const settled: Settled = event.session?.payment_status === 'paid' ? settlePaid(tx, event.session, 'webhook') : { kind: 'unknown' };
    const recorded = event.session?.payment_status === 'paid' ? settled.kind : 'ignored';
    tx.update(schema.paymentEvents).set({ outcome: recorded }).where(eq(schema.paymentEvents.id, event.id)).run();
    after?.(tx, settled);
    return { duplicate: false as const, settled };
  });
}
