import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';

import express, { type Request, type Response } from 'express';
import Stripe from 'stripe';
import { z } from 'zod';

import { formatCents } from '@/constants/format';

import { escapeHtml } from '../mail/compose';

/**
 * A stand-in for the card payment service, run by Lobewright itself so the whole
 * product works offline. It answers the few calls the payment SDK makes for a
 * deposit (create, retrieve and expire a Checkout Session; refund a payment),
 * serves a plain pay page, and on "pay" sends a signed `checkout.session.completed`
 * event to the webhook, signed the way the SDK verifies it. No card data, no real money.
 */

export type FakePaymentOptions = {
  /** Where completed sessions are reported (the app's /api/payments/webhook). */
  webhookUrl: string;
  /** Shared secret the webhook checks signatures with. */
  webhookSecret: string;
  /** The API key the SDK must send. */
  apiKey: string;
};

/** The fake listens only here: nobody on the network can reach it, let alone sign with its secret. */
export const LOOPBACK = '127.0.0.1';

type Refund = { id: string; object: 'refund'; amount: number; currency: string; payment_intent: string; status: 'succeeded'; created: number };

type Session = {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_total: number;
  currency: string;
  client_reference_id: string | null;
  metadata: Record<string, string>;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  payment_intent: string | null;
  created: number;
  livemode: false;
  description: string;
};

const lineItem = z.object({
  quantity: z.coerce.number().int().min(1).max(100),
  price_data: z.object({
    currency: z.string().regex(/^[a-z]{3}$/),
    unit_amount: z.coerce.number().int().min(1).max(99_999_999),
    product_data: z.object({ name: z.string().min(1).max(250) }),
  }),
});

const createBody = z.object({
  mode: z.literal('payment'),
  success_url: z.url(),
  cancel_url: z.url().optional(),
  client_reference_id: z.string().max(200).optional(),
  metadata: z.record(z.string(), z.string().max(500)).optional(),
  line_items: z.array(lineItem).min(1).max(20),
});

function randomId(prefix: string) {
  return `${prefix}_test_${crypto.randomUUID().replace(/-/g, '')}`;
}

function apiError(res: Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } });
}

function payPage(session: Session) {
  const amount = escapeHtml(formatCents(session.amount_total, session.currency));
  const done = session.status === 'complete';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Test payment: ${amount}</title>
<style>
body{font-family:system-ui,sans-serif;background:#fff;color:#111;margin:0;padding:24px;font-size:20px;line-height:1.4}
main{max-width:520px;margin:0 auto}
.tag{display:inline-block;border:2px solid #111;padding:2px 8px;font-size:16px;font-weight:700}
.amount{font-size:40px;font-weight:800;margin:12px 0}
button{font:inherit;font-weight:700;background:#0b3d2e;color:#fff;border:0;border-radius:8px;padding:16px 20px;width:100%;min-height:56px;cursor:pointer}
a{color:#0b3d2e}
</style></head>
<body><main>
<p class="tag">Test payment service on this machine</p>
<h1>${escapeHtml(session.description)}</h1>
<p class="amount">${amount}</p>
<p>No real money moves and no card is needed: this page stands in for the card payment service while Lobewright runs offline.</p>
${
  done
    ? '<p role="status">This deposit is already paid.</p>'
    : `<form method="post" action="/pay/${escapeHtml(session.id)}"><button type="submit">Pay ${amount} (test)</button></form>`
}
${session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Go back without paying</a></p>` : ''}
</main></body></html>`;
}

export function createFakePaymentService({ webhookUrl, webhookSecret, apiKey }: FakePaymentOptions) {
  const sessions = new Map<string, Session>();
  const refunds = new Map<string, Refund>();
  const signer = new Stripe(apiKey);
  let origin = '';
  const app = express();
  app.disable('x-powered-by');

  const requireKey: express.RequestHandler = (req, res, next) => {
    if (req.headers.authorization !== `Bearer ${apiKey}`) return apiError(res, 401, 'Invalid API key provided');
    next();
  };

  app.post('/v1/checkout/sessions', requireKey, express.urlencoded({ extended: true, limit: '50kb' }), (req: Request, res: Response) => {
    const parsed = createBody.safeParse(req.body);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      return apiError(res, 400, issue?.message ?? 'Invalid request', issue?.path.join('.'));
    }
    const body = parsed.data;
    const currencies = new Set(body.line_items.map((l) => l.price_data.currency));
    if (currencies.size > 1) return apiError(res, 400, 'All line items must use one currency', 'line_items');
    const id = randomId('cs');
    const session: Session = {
      id,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: body.line_items.reduce((sum, l) => sum + l.price_data.unit_amount * l.quantity, 0),
      currency: body.line_items[0]!.price_data.currency,
      client_reference_id: body.client_reference_id ?? null,
      metadata: body.metadata ?? {},
      success_url: body.success_url,
      cancel_url: body.cancel_url ?? null,
      url: `${origin}/pay/${id}`,
      payment_intent: null,
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      description: body.line_items.map((l) => l.price_data.product_data.name).join(', '),
    };
    sessions.set(id, session);
    res.json(session);
  });

  app.get('/v1/checkout/sessions/:id', requireKey, (req, res) => {
    const session = sessions.get(String(req.params.id));
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    res.json(session);
  });

  app.post('/v1/checkout/sessions/:id/expire', requireKey, (req, res) => {
    const session = sessions.get(String(req.params.id));
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    if (session.status !== 'open') return apiError(res, 400, `Only an open session can be expired; this one is ${session.status}`, 'session');
    Object.assign(session, { status: 'expired', url: null });
    res.json(session);
  });

  app.post('/v1/refunds', requireKey, express.urlencoded({ extended: false, limit: '10kb' }), (req: Request, res: Response) => {
    const intent = typeof req.body?.payment_intent === 'string' ? req.body.payment_intent : '';
    const session = [...sessions.values()].find((s) => s.payment_intent === intent && intent !== '');
    if (!session) return apiError(res, 404, `No such payment_intent: '${intent}'`, 'payment_intent');
    if ([...refunds.values()].some((r) => r.payment_intent === intent)) return apiError(res, 400, 'This payment has already been refunded', 'payment_intent');
    const refund: Refund = {
      id: randomId('re'),
      object: 'refund',
      amount: session.amount_total,
      currency: session.currency,
      payment_intent: intent,
      status: 'succeeded',
      created: Math.floor(Date.now() / 1000),
    };
    refunds.set(refund.id, refund);
    res.json(refund);
  });

  app.get('/pay/:id', (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return res.status(404).type('text/plain').send('No such payment');
    res.type('html').send(payPage(session));
  });

  app.post('/pay/:id', async (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return res.status(404).type('text/plain').send('No such payment');
    if (session.status === 'expired') return res.status(410).type('text/plain').send('This payment page has expired');
    if (session.status === 'open') await complete(session);
    res.redirect(303, session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id));
  });

  /** Marks the session paid and reports it, as a card payment on the pay page would. */
  async function complete(session: Session) {
    Object.assign(session, { status: 'complete', payment_status: 'paid', payment_intent: randomId('pi'), url: null });
    await deliver(session);
  }

  /** Sends the completed event, signed like the real service; a failure is logged (the app can still retrieve the session). */
  async function deliver(session: Session) {
    const event = {
      id: randomId('evt'),
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      data: { object: session },
    };
    const payload = JSON.stringify(event);
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
    try {
      const res = await fetch(webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload });
      if (!res.ok) console.error(`Test payment service: the webhook answered ${res.status}`);
    } catch (error) {
      console.error('Test payment service: could not reach the webhook', error);
    }
  }

  let server: Server | undefined;
  return {
    app,
    sessions,
    refunds,
    /** Pays an open session as the pay page's button does (tests). */
    async pay(id: string) {
      const session = sessions.get(id);
      if (!session || session.status !== 'open') throw new Error(`No open session ${id}`);
      await complete(session);
    },
    /** Starts listening on the loopback interface (port 0 picks a free one) and returns where the SDK should connect. */
    listen(port = 0) {
      return new Promise<{ port: number; origin: string }>((resolve, reject) => {
        server = app.listen(port, LOOPBACK, (error?: Error) => {
          if (error) return reject(error);
          const actual = (server!.address() as AddressInfo).port;
          origin = `http://${LOOPBACK}:${actual}`;
          resolve({ port: actual, origin });
        });
      });
    },
    close() {
      return new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
    },
  };
}

export type FakePaymentService = ReturnType<typeof createFakePaymentService>;
