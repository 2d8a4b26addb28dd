import { randomBytes } from 'node:crypto';

import Stripe from 'stripe';

import { createFakePaymentService, LOOPBACK, type FakePaymentService } from './fake-service';

/** How the app takes deposits: the payment SDK pointed at the real service or at the local fake. */
export type Payments = {
  readonly kind: 'service' | 'local-fake';
  stripe: Stripe;
  /** Secret the webhook checks each event's signature with. */
  webhookSecret: string;
  /** ISO currency, lower case. */
  currency: string;
};

/** The real payment service, with the account's secret key and its webhook signing secret. */
export function servicePayments({ secretKey, webhookSecret, currency }: { secretKey: string; webhookSecret: string; currency: string }): Payments {
  return { kind: 'service', stripe: new Stripe(secretKey, { maxNetworkRetries: 2 }), webhookSecret, currency };
}

/** Where the local fake listens and the secrets made up for this start: what another process needs to use it. */
export type LocalPaymentsConnection = { port: number; apiKey: string; webhookSecret: string };

/** The payment SDK pointed at a running local fake (the SDK's host, port and protocol settings). */
export function localPaymentsClient({ port, apiKey, webhookSecret }: LocalPaymentsConnection, currency = 'usd'): Payments {
  const stripe = new Stripe(apiKey, { host: LOOPBACK, port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
  return { kind: 'local-fake', stripe, webhookSecret, currency };
}

/**
 * Starts the local fake payment service on the loopback interface, with an API key
 * and a webhook signing secret made up for this start and handed to the app
 * in-process, or to its workers through their environment (nothing to copy, nothing
 * in the source), and an SDK client pointed at it.
 */
export async function startLocalPayments({
  publicUrl,
  port = 0,
  currency = 'usd',
}: {
  /** The app's public origin: the webhook goes to its /api/payments/webhook. */
  publicUrl: string;
  port?: number;
  currency?: string;
}): Promise<{ payments: Payments; service: FakePaymentService; origin: string; connection: LocalPaymentsConnection }> {
  const apiKey = `sk_test_${randomBytes(24).toString('hex')}`;
  const webhookSecret = `whsec_${randomBytes(24).toString('base64url')}`;
  const service = createFakePaymentService({ webhookUrl: new URL('/api/payments/webhook', publicUrl).toString(), webhookSecret, apiKey });
  const { port: actual, origin } = await service.listen(port);
  const connection = { port: actual, apiKey, webhookSecret };
  return { payments: localPaymentsClient(connection, currency), service, origin, connection };
}
