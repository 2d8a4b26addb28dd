import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { startLocalPayments } from '@/server/payments';
import type { OwnerView } from '@/shared/owner';
import { createTestApp, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';
import { ownerPageKit } from '@/tests/owner-page-kit';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const { sharedJob, owner, webhookBody, postWebhook, sign } = ownerPageKit(() => t);

describe('deposit payment', () => {
  async function approved(name: string) {
    const s = await sharedJob(name);
    const o = owner();
    const option = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect(
      (await o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: 'Test Owner', agree: true }))
        .status,
    ).toBe(201);
    return { ...s, o };
  }

  it('goes through the local fake: checkout, pay page, signed webhook, paid on the job', async () => {
    const s = await approved('Pay shop');
    expect((await s.o.post(`/api/share/${s.token}/deposit/confirm`, { sessionId: 'cs_nothing' })).status).toBe(404);
    const start = await s.o.post(`/api/share/${s.token}/deposit`);
    expect(start.status).toBe(201);
    const payUrl = new URL(start.body.url);
    const page = await fetch(payUrl);
    expect(await page.text()).toContain('$225.00');
    // Paying sends the signed event and returns the owner to the share page.
    const paid = await fetch(payUrl, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    const back = new URL(paid.headers.get('location')!);
    // The token never goes to the payment service: the owner comes back through /share/back.
    expect(back.pathname).toBe('/share/back');
    const session = t.paymentService.sessions.get(back.searchParams.get('deposit')!)!;
    expect(JSON.stringify(session)).not.toContain(s.token);
    const sessionId = back.searchParams.get('deposit')!;

    const view = (await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    expect(view.payment).toMatchObject({ state: 'paid', amountCents: 22_500, currency: 'usd' });
    expect(new Date(view.payment!.paidAt!).getTime()).toBeGreaterThan(Date.now() - 60_000);
    const confirm = await s.o.post(`/api/share/${s.token}/deposit/confirm`, { sessionId });
    expect(confirm.body.payment.state).toBe('paid');
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.payments[0]).toMatchObject({ state: 'paid', amountCents: 22_500 });
    expect(
      t.db
        .select()
        .from(schema.outbox)
        .all()
        .some((m) => m.to === s.builder.email && m.subject.startsWith('Deposit paid: $225.00')),
    ).toBe(true);
    expect((await s.o.post(`/api/share/${s.token}/deposit`)).status).toBe(409);
  });

  it('needs an approval first', async () => {
    const s = await sharedJob('Unapproved shop');
    expect((await owner().post(`/api/share/${s.token}/deposit`)).status).toBe(409);
  });

  it('reconciles on return with a retrieve when the webhook has not arrived', async () => {
    const s = await approved('Return shop');
    const start = await s.o.post(`/api/share/${s.token}/deposit`);
    const sessionId = new URL(start.body.url).pathname.split('/').pop()!;
    // The service marks it paid but the event never reaches the app.
    const session = t.paymentService.sessions.get(sessionId)!;
    Object.assign(session, { status: 'complete', payment_status: 'paid' });
    expect(((await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView).payment?.state).toBe('open');
    const confirm = await s.o.post(`/api/share/${s.token}/deposit/confirm`, { sessionId });
    expect(confirm.body.payment).toMatchObject({ state: 'paid', amountCents: 22_500 });
  });
});

describe('deposits that cannot be forged or paid twice (findings 2 and 3)', () => {
  async function approvedJob(name: string) {
    const s = await sharedJob(name);
    const o = owner();
    const option = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect(
      (await o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: 'Test Owner', agree: true }))
        .status,
    ).toBe(201);
    const rows = () => t.db.select().from(schema.payments).where(eq(schema.payments.jobId, s.jobId)).all();
    return { ...s, o, rows };
  }
  const sessionOf = (url: string) => new URL(url).pathname.split('/').pop()!;

  it('makes up a new signing secret and API key on every start and listens only on the loopback interface', async () => {
    const other = await startLocalPayments({ publicUrl: t.url });
    try {
      expect(other.payments.webhookSecret).not.toBe(t.payments.webhookSecret);
      expect(other.payments.webhookSecret.length).toBeGreaterThanOrEqual(32);
      expect(new URL(other.origin).hostname).toBe('127.0.0.1');
      // A secret from another start does not sign for this app.
      const { sessionId } = await (async () => {
        const s = await approvedJob('Other secret shop');
        return { sessionId: sessionOf((await s.o.post(`/api/share/${s.token}/deposit`)).body.url) };
      })();
      const payload = webhookBody(sessionId);
      expect((await postWebhook(payload, sign(payload, other.payments.webhookSecret))).status).toBe(400);
    } finally {
      await other.service.close();
    }
  });

  it('refuses and records a signed event whose amount or currency is not the deposit, and marks nothing paid', async () => {
    const s = await approvedJob('Mismatch shop');
    const sessionId = sessionOf((await s.o.post(`/api/share/${s.token}/deposit`)).body.url);
    const forged = JSON.stringify({
      id: 'evt_test_one_unit_elsewhere',
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', amount_total: 1, currency: 'jpy' } },
    });
    const res = await postWebhook(forged, sign(forged));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('amount_mismatch');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['data.object.amount_total', 'data.object.currency']);
    expect(s.rows()).toMatchObject([{ state: 'open', amountCents: 22_500, currency: 'usd', paidAt: null }]);
    expect(t.db.select().from(schema.paymentEvents).where(eq(schema.paymentEvents.id, 'evt_test_one_unit_elsewhere')).get()?.outcome).toBe('refused');
    const refusal = t.db
      .select()
      .from(schema.auditLog)
      .where(eq(schema.auditLog.entityId, s.rows()[0]!.id))
      .all()
      .find((a) => a.action === 'refuse');
    expect(refusal?.detail).toMatchObject({ expected: { amountCents: 22_500, currency: 'usd' }, reported: { amountCents: 1, currency: 'jpy' } });
    expect(((await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView).payment?.state).toBe('open');
  });

  it('answers the same open session to a second tab, even asked at the same moment', async () => {
    const s = await approvedJob('Two tabs shop');
    const before = t.paymentService.sessions.size;
    const [first, second] = await Promise.all([s.o.post(`/api/share/${s.token}/deposit`), owner().post(`/api/share/${s.token}/deposit`)]);
    const answered = [first, second].filter((r) => r.status < 300);
    expect(answered.length).toBeGreaterThanOrEqual(1);
    // The one that lost the race is told to try again; it never opens a second session.
    for (const r of [first, second].filter((r) => r.status >= 300)) expect(r.status).toBe(409);
    const again = await owner().post(`/api/share/${s.token}/deposit`);
    expect(again.status).toBe(200);
    expect(again.body.url).toBe(answered[0]!.body.url);
    expect(t.paymentService.sessions.size - before).toBe(1);
    expect(s.rows()).toHaveLength(1);
    // Paid in one tab, the other tab's button is refused.
    await t.paymentService.pay(sessionOf(again.body.url));
    expect((await owner().post(`/api/share/${s.token}/deposit`)).status).toBe(409);
    expect(s.rows().filter((p) => p.state === 'paid')).toHaveLength(1);
  });

  it('opens a new session when the open one has expired', async () => {
    const s = await approvedJob('Expired session shop');
    const first = (await s.o.post(`/api/share/${s.token}/deposit`)).body.url as string;
    await t.payments.stripe.checkout.sessions.expire(sessionOf(first));
    const second = await s.o.post(`/api/share/${s.token}/deposit`);
    expect(second.status).toBe(201);
    expect(second.body.url).not.toBe(first);
    expect(
      s
        .rows()
        .map((p) => p.state)
        .sort(),
    ).toEqual(['expired', 'open']);
  });

  it('refunds a second paid session through the payment service and counts the deposit once', async () => {
    const s = await approvedJob('Paid twice shop');
    const firstUrl = (await s.o.post(`/api/share/${s.token}/deposit`)).body.url as string;
    // An older tab's session, opened before this one and paid after it (as a late payment page would).
    const approval = t.db.select().from(schema.ownerApprovals).where(eq(schema.ownerApprovals.jobId, s.jobId)).get()!;
    const late = await t.payments.stripe.checkout.sessions.create({
      mode: 'payment',
      success_url: `${t.url}/share/back`,
      line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: 22_500, product_data: { name: 'Deposit' } } }],
    });
    t.db
      .insert(schema.payments)
      .values({
        id: crypto.randomUUID(),
        shopId: s.shopId,
        jobId: s.jobId,
        approvalId: approval.id,
        checkoutSessionId: late.id,
        amountCents: 22_500,
        currency: 'usd',
        state: 'expired',
      })
      .run();
    await t.paymentService.pay(sessionOf(firstUrl));
    await t.paymentService.pay(late.id);
    const rows = s.rows();
    expect(rows.filter((p) => p.state === 'paid')).toHaveLength(1);
    const second = rows.find((p) => p.checkoutSessionId === late.id)!;
    expect(second.state).toBe('refunded');
    const refund = [...t.paymentService.refunds.values()].find((r) => r.id === second.refundId);
    expect(refund).toMatchObject({ amount: 22_500, currency: 'usd', payment_intent: second.paymentIntentId });
    expect(((await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView).payment).toMatchObject({ state: 'paid', amountCents: 22_500 });
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.payments.map((p: { state: string }) => p.state).sort()).toEqual(['paid', 'refunded']);
    // One "paid" mail to the builder, not two.
    expect(
      t.db
        .select()
        .from(schema.outbox)
        .all()
        .filter((m) => m.to === s.builder.email && m.subject.startsWith('Deposit paid')),
    ).toHaveLength(1);
  });
});

describe('a deposit paid under an approval that was withdrawn', () => {
  it('counts toward the owner’s new approval: nothing more is asked while it covers the deposit', async () => {
    const s = await sharedJob('Carried deposit');
    const o = owner();
    const read = async () => ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    const approve = async () => {
      const option = await read();
      return o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: 'Test Owner', agree: true });
    };
    expect((await approve()).status).toBe(201);
    const start = await o.post(`/api/share/${s.token}/deposit`);
    expect((await fetch(new URL(start.body.url), { method: 'POST', redirect: 'manual' })).status).toBe(303);

    // The grinder asks for changes on the approved revision; the builder issues revision 2, which withdraws the approval.
    const grinding = await makeShop(t, 'grinding', 'Carried deposit grinding');
    const grinder = await memberWithRole(t, grinding.shopId, 'grinder');
    const sheet = () => s.builder.get(`/api/sheets/${s.sheet.id}`).then((r) => r.body.sheet);
    const first = (await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: (await sheet()).version, grinderShopId: grinding.shopId })).body.order;
    await grinder.post(`/api/orders/${first.id}/move`, { version: first.version, to: 'changes-asked', message: 'Core too worn for this base circle' });
    await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: (await sheet()).version, note: 'Smaller base circle' });
    expect((await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: (await sheet()).version, grinderShopId: grinding.shopId })).status).toBe(201);
    expect(((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).approval).toBeNull();

    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    await s.builder.patch(`/api/owner-options/${desk.options[0].id}`, { version: desk.options[0].version, refreshRevision: true });
    expect((await approve()).status).toBe(201);
    const again = await o.post(`/api/share/${s.token}/deposit`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/earlier approval covers it/);
    expect(((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).payment).toMatchObject({ state: 'paid', amountCents: 22_500 });
    expect(t.db.select().from(schema.payments).where(eq(schema.payments.jobId, s.jobId)).all()).toHaveLength(1);
  });
});
