import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import type { OwnerView } from '@/shared/owner';
import { createTestApp, type TestApp } from '@/tests/fixtures';
import { ownerPageKit } from '@/tests/owner-page-kit';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const { sharedJob, owner, webhookBody, postWebhook, sign } = ownerPageKit(() => t);

describe('payment webhook', () => {
  async function openPayment(name: string) {
    const s = await sharedJob(name);
    const o = owner();
    const option = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    await o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: 'Test Owner', agree: true });
    const start = await o.post(`/api/share/${s.token}/deposit`);
    const sessionId = new URL(start.body.url).pathname.split('/').pop()!;
    const payment = () => t.db.select().from(schema.payments).where(eq(schema.payments.checkoutSessionId, sessionId)).get()!;
    return { sessionId, payment };
  }

  it('accepts a valid signature (generateTestHeaderString) and marks the payment paid', async () => {
    const { sessionId, payment } = await openPayment('Hook ok shop');
    const payload = webhookBody(sessionId);
    const res = await postWebhook(payload, sign(payload));
    expect(res).toEqual({ status: 200, body: { received: true, duplicate: false } });
    expect(payment()).toMatchObject({ state: 'paid', amountCents: 22_500 });
  });

  it('rejects a tampered body, a wrong secret or a missing header with 400 and changes nothing', async () => {
    const { sessionId, payment } = await openPayment('Hook bad shop');
    const payload = webhookBody(sessionId);
    const tampered = payload.replace('22500', '1');
    for (const [body, signature] of [
      [tampered, sign(payload)],
      [payload, sign(payload, 'whsec_someone_else')],
      [payload, 't=1,v1=00'],
    ] as const) {
      const res = await postWebhook(body, signature);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('bad_signature');
    }
    const missing = await fetch(`${t.url}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: payload });
    expect(missing.status).toBe(400);
    expect(payment().state).toBe('open');
    expect(
      t.db
        .select()
        .from(schema.paymentEvents)
        .all()
        .some((e) => payload.includes(e.id)),
    ).toBe(false);
  });

  it('answers a signed event it cannot read with 400 naming the field, never a server error, and writes nothing', async () => {
    const { sessionId, payment } = await openPayment('Hook shape shop');
    const event = JSON.parse(webhookBody(sessionId, 'evt_test_odd_shape')) as { data: { object: Record<string, unknown> } } & Record<string, unknown>;
    const session = event.data.object;
    const odd: [string, unknown][] = [
      ['(body)', ''],
      ['(body)', [1, 2]],
      ['id', { ...event, id: undefined }],
      ['id', { ...event, id: 42 }],
      ['type', { ...event, type: null }],
      ['data', { ...event, data: 'paid' }],
      ['data.object.id', { ...event, data: { object: { ...session, id: undefined } } }],
      ['data.object.amount_total', { ...event, data: { object: { ...session, amount_total: '22500' } } }],
      ['data.object.amount_total', { ...event, data: { object: { ...session, amount_total: -1 } } }],
      ['data.object.currency', { ...event, data: { object: { ...session, currency: 'dollars' } } }],
    ];
    for (const [field, body] of odd) {
      const payload = JSON.stringify(body);
      const res = await postWebhook(payload, sign(payload));
      expect(res.status, payload).toBe(400);
      expect(Object.keys(res.body.error.fields), payload).toContain(field);
    }
    expect(payment().state).toBe('open');
    expect(
      t.db
        .select()
        .from(schema.paymentEvents)
        .all()
        .some((e) => e.id === 'evt_test_odd_shape'),
    ).toBe(false);
  });

  it('ignores a replayed event', async () => {
    const { sessionId, payment } = await openPayment('Hook replay shop');
    const payload = webhookBody(sessionId, 'evt_test_replayed_once');
    expect((await postWebhook(payload, sign(payload))).body.duplicate).toBe(false);
    const paidAt = payment().paidAt;
    const auditRows = t.db.select().from(schema.auditLog).where(eq(schema.auditLog.entityId, payment().id)).all().length;
    const replay = await postWebhook(payload, sign(payload));
    expect(replay).toEqual({ status: 200, body: { received: true, duplicate: true } });
    expect(payment().paidAt).toEqual(paidAt);
    expect(t.db.select().from(schema.auditLog).where(eq(schema.auditLog.entityId, payment().id)).all().length).toBe(auditRows);
  });
});
