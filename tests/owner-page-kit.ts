import { randomBytes } from 'node:crypto';

import Stripe from 'stripe';
import { expect } from 'vitest';

import { Client, makeJobWithEngine, type TestApp } from './fixtures';

/**
 * What the owner page's tests share: a job shared with its owner (internal findings, a sheet,
 * an option and a link), an anonymous owner, and webhook bodies signed as the payment service signs.
 * `app` gives the test file's app, created in its beforeAll.
 */
export function ownerPageKit(app: () => TestApp) {
  // Read on each use, so the helpers see the app once beforeAll has made it.
  const tOf = app;
  const INTERNAL_FINDINGS = 'INTERNAL: lifter bore 3E scored, bill the core charge twice';
  const INTERNAL_SHEET_NOTE = 'INTERNAL: grinder owes us for the last core';

  /** A job with internal findings, a sheet, an owner page with one option, and a share link. */
  async function sharedJob(name = 'Owner shop') {
    const s = await makeJobWithEngine(tOf(), name);
    const builder = s.founder;
    const job = (await builder.get(`/api/jobs/${s.jobId}`)).body.job;
    expect((await builder.patch(`/api/jobs/${s.jobId}`, { version: job.version, findings: INTERNAL_FINDINGS })).status).toBe(200);
    const sheet = (await builder.post(`/api/jobs/${s.jobId}/sheets`, { title: 'Towing regrind', profileId: s.profileId, note: INTERNAL_SHEET_NOTE })).body
      .sheet;
    const page = await builder.put(`/api/jobs/${s.jobId}/owner`, { version: 0, whatFailed: 'A lifter stopped rolling and wore the cam lobe.' });
    expect(page.status).toBe(200);
    const option = await builder.post(`/api/jobs/${s.jobId}/owner/options`, {
      sheetId: sheet.id,
      title: 'Towing regrind',
      ownerNote: 'More pull at low speed.',
      priceCents: 76_000,
      depositCents: 22_500,
      leadTimeDays: 8,
    });
    expect(option.status).toBe(201);
    const link = await builder.post(`/api/jobs/${s.jobId}/share-links`, {});
    expect(link.status).toBe(201);
    return { ...s, builder, sheet, desk: option.body.desk, token: link.body.token as string, linkId: link.body.link.id as string };
  }

  const owner = () => new Client(tOf().url);

  function webhookBody(sessionId: string, eventId = `evt_test_${randomBytes(8).toString('hex')}`) {
    return JSON.stringify({
      id: eventId,
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', amount_total: 22_500, currency: 'usd' } },
    });
  }

  async function postWebhook(payload: string, signature: string) {
    const res = await fetch(`${tOf().url}/api/payments/webhook`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': signature },
      body: payload,
    });
    return { status: res.status, body: (await res.json()) as Record<string, any> };
  }

  const signer = new Stripe('sk_test_signing_only');
  /** Signed as the payment service signs: with the secret this start of the local fake made up, unless told. */
  const sign = (payload: string, secret: string = tOf().payments.webhookSecret) => signer.webhooks.generateTestHeaderString({ payload, secret });

  return { INTERNAL_FINDINGS, INTERNAL_SHEET_NOTE, sharedJob, owner, webhookBody, postWebhook, sign };
}
