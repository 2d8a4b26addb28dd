import Stripe from 'stripe';

import { createFakePaymentService, type FakePaymentService } from './fake-service';

/** How the app takes deposits: the payment SDK pointed at the real service or at the local fake. */
export type Payments = {
  readonly kind: 'service' | 'local-fake';
  stripe: Stripe;
  /** Secret the webhook checks each event's signature with. */
  webhookSecret: string;
  /** ISO currency, lower case. */
  currency: string;
};

/** The key and secret the local fake uses: not secrets, since nothing real moves. */
export const localFakeKeys = { apiKey: 'sk_test_lobewright_local_fake', webhookSecret: 'whsec_lobewright_local_fake' } as const;

/** The real payment service, with the account's secret key and its webhook signing secret. */
export function servicePayments({ secretKey, webhookSecret, currency }: { secretKey: string; webhookSecret: string; currency: string }): Payments {
  return { kind: 'service', stripe: new Stripe(secretKey, { maxNetworkRetries: 2 }), webhookSecret, currency };
}

/**
 * Starts the local fake payment service and an SDK client pointed at it
 * (the SDK's host, port and protocol settings).
 */
export async function startLocalPayments({
  publicUrl,
  port = 0,
  currency = 'usd',
  listenHost,
}: {
  /** The app's public origin: the webhook goes to its /api/payments/webhook, and the pay page uses its host name. */
  publicUrl: string;
  port?: number;
  currency?: string;
  listenHost?: string;
}): Promise<{ payments: Payments; service: FakePaymentService; origin: string }> {
  const app = new URL(publicUrl);
  const service = createFakePaymentService({
    webhookUrl: new URL('/api/payments/webhook', app).toString(),
    webhookSecret: localFakeKeys.webhookSecret,
    apiKey: localFakeKeys.apiKey,
    publicHost: app.hostname,
  });
  const { port: actual, origin } = await service.listen(port, listenHost);
  const stripe = new Stripe(localFakeKeys.apiKey, {
    host: listenHost ?? 'localhost',
    port: actual,
    protocol: 'http',
    maxNetworkRetries: 0,
    telemetry: false,
  });
  return { payments: { kind: 'local-fake', stripe, webhookSecret: localFakeKeys.webhookSecret, currency }, service, origin };
}
