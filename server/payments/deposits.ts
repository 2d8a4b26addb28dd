/**
 * Deposits on the owner's page, through the payment SDK. A payment row is reserved in a
 * transaction before the payment service is called (never from inside one), the session
 * is stored after, and every report of a paid session (webhook or return page) settles
 * through store/payments' settlePaid: the amount and currency are compared with the
 * approval's, and a second paid session of a paid deposit is refunded after the commit.
 */
import type { Db } from '@/db';
import type { Payment } from '@/shared/owner';

import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound } from '../http';
import { queueBuilderMail } from '../mail/owner-mail';
import { loadApproval } from '../store/owner-page';
import {
  dropReservation,
  markExpired,
  markRefunded,
  paymentBySession,
  reserveDeposit,
  settlePaid,
  storeSession,
  toPayment,
  type PaymentRow,
  type SessionFacts,
  type Settled,
} from '../store/payments';
import type { Writer } from '../store/db';
import type { LinkRow } from '../store/share-links';
import type { Payments } from './index';

type DepositDeps = Pick<AppDeps, 'db' | 'mailer' | 'publicUrl' | 'payments'>;

/** The payment service, or a 503: the shop can still take the deposit in person. */
export function requirePayments(payments: Payments | undefined): Payments {
  if (!payments) throw new HttpError(503, 'payments_off', 'Card payments are not set up on this server; the shop can take the deposit in person');
  return payments;
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
        line_items: [
          { quantity: 1, price_data: { currency: payment.currency, unit_amount: payment.amountCents, product_data: { name: `Deposit: ${optionTitle}` } } },
        ],
      },
      { idempotencyKey: `deposit-${payment.id}` },
    );
    if (!session.url) throw new HttpError(502, 'payment_service', 'The payment service did not return a page to pay on; try again');
    storeSession(db, payment.id, { id: session.id, url: session.url });
    return session.url;
  } catch (error) {
    dropReservation(db, payment.id);
    throw error;
  }
}

/** Gives back a second payment of a paid deposit through the payment service; if the service fails, it stays `refund-due` for the shop to see. */
async function refundSecond({ db, payments }: Pick<AppDeps, 'db' | 'payments'>, payment: PaymentRow) {
  if (!payments || !payment.paymentIntentId) return console.error(`Payment ${payment.id} was paid twice and needs a refund by hand: no payment to refund`);
  try {
    const refund = await payments.stripe.refunds.create({ payment_intent: payment.paymentIntentId }, { idempotencyKey: `refund-${payment.id}` });
    markRefunded(db, payment, refund.id);
  } catch (error) {
    console.error(`Payment ${payment.id} was paid twice and the refund failed; it stays refund-due`, error);
  }
}

/** Inside the settling transaction: a new payment queues the builders' mail, so it commits with the payment. */
export function queuePaidMail(tx: Writer, deps: Pick<DepositDeps, 'mailer' | 'publicUrl'>, settled: Settled) {
  if (settled.kind !== 'paid') return;
  const { payment } = settled;
  const approval = loadApproval(tx, payment.jobId);
  if (!approval) return;
  queueBuilderMail(tx, deps, 'paid', payment.jobId, payment.shopId, {
    optionTitle: approval.optionTitle,
    approverName: approval.approverName,
    checksum: approval.checksum,
    amountCents: payment.amountCents,
    currency: payment.currency,
  });
}

/** After the settling transaction commits: a second payment is refunded through the payment service. */
export async function afterSettled(deps: DepositDeps, settled: Settled) {
  if (settled.kind === 'refund') await refundSecond(deps, settled.payment);
}

/** Settles a paid session the owner came back from, with the builders' mail, in one transaction. */
function settleReturn(deps: DepositDeps, session: SessionFacts) {
  return deps.db.transaction((tx) => {
    const settled = settlePaid(tx, session, 'return');
    queuePaidMail(tx, deps, settled);
    return settled;
  });
}

/**
 * The page to pay the approved deposit on: a new session (`created`), or the open one a second
 * tab already started. An open session found expired is closed and one new one opened.
 */
export async function startDeposit(deps: DepositDeps, link: LinkRow, returnUrl: string): Promise<{ url: string; created: boolean }> {
  const { db } = deps;
  const service = requirePayments(deps.payments);
  // Twice at most: an open session found expired is closed, and one new one is opened.
  for (let attempt = 0; attempt < 2; attempt++) {
    const step = db.transaction((tx) => reserveDeposit(tx, link));
    if (step.kind === 'reserved') {
      const url = await openSession(db, service, step.payment, step.approval.optionTitle, returnUrl);
      return { url, created: true };
    }
    // One open session per approval: asking again answers the same page while it can still be paid.
    const session = await service.stripe.checkout.sessions.retrieve(step.payment.checkoutSessionId!);
    if (session.status === 'open' && session.url) return { url: session.url, created: false };
    if (session.status === 'complete' && session.payment_status === 'paid') {
      const settled = settleReturn(deps, session);
      await afterSettled(deps, settled);
      throw conflict('The deposit is already paid');
    }
    markExpired(db, step.payment.id);
  }
  throw new HttpError(502, 'payment_service', 'The payment service did not open a page to pay on; try again');
}

/** The owner is back from the payment page: settle the session now in case the webhook has not arrived. */
export async function confirmDeposit(deps: DepositDeps, link: LinkRow, sessionId: string): Promise<Payment> {
  const { db } = deps;
  const service = requirePayments(deps.payments);
  const known = paymentBySession(db, link.jobId, sessionId);
  if (!known) throw notFound('Payment');
  let payment: Payment = toPayment(known);
  if (known.state === 'open' || known.state === 'expired') {
    const session = await service.stripe.checkout.sessions.retrieve(sessionId);
    if (session.payment_status === 'paid') {
      const settled = settleReturn(deps, session);
      if (settled.payment) payment = toPayment(settled.payment);
      await afterSettled(deps, settled);
    }
  }
  return payment;
}
