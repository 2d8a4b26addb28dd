import express, { Router, type Request } from 'express';
import { z } from 'zod';

import type { AppDeps } from '../deps';
import { HttpError, parse } from '../http';
import { afterSettled, queuePaidMail } from '../payments/deposits';
import { recordPaymentEvent } from '../store/payments';

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
  amount_total: z
    .number({ error: 'Amount must be a number of cents' })
    .int('Amount is in whole cents')
    .min(0, 'Amount cannot be negative')
    .max(10_000_000)
    .nullish(),
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
    const outcome = recordPaymentEvent(db, event, (tx, settled) => queuePaidMail(tx, deps, settled));
    if (outcome.duplicate) return void res.json({ received: true, duplicate: true });
    const { settled } = outcome;
    if (settled.kind === 'refused') {
      throw new HttpError(
        400,
        'amount_mismatch',
        'The event does not pay this deposit: its amount or currency differs, so nothing was marked paid',
        settled.fields,
      );
    }
    await afterSettled(deps, settled);
    res.json({ received: true, duplicate: false });
  });
  return router;
}
