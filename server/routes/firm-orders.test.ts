import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import type { OwnerView } from '@/shared/owner';
import { Client, createTestApp, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';
import { ownerPageKit } from '@/tests/owner-page-kit';

/*
 * One job, one truth (issue rules): a grinder can be asked to quote any issued revision, but only one revision of a job
 * is its firm order, the one the grinder may grind. It is the owner's approved revision, or where the shop skips the
 * owner, the one a builder confirms with a reason. An approval whose revision is superseded before grinding is withdrawn
 * and the owner asked again; a deposit already paid counts toward the new one.
 */

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const { sharedJob, owner } = ownerPageKit(() => t);

const quote = { quote: { priceCents: 48_500, leadTimeDays: 6 } };
const reason = 'Fleet account: the fleet manager signs off by phone';

/** A shared job (one option on its sheet) with a grinding shop and its grinder. */
async function jobWithGrinder(name: string) {
  const s = await sharedJob(name);
  const grinding = await makeShop(t, 'grinding', `${name} grinding`);
  const grinder = await memberWithRole(t, grinding.shopId, 'grinder');
  return { ...s, grinderShopId: grinding.shopId, grinder };
}

type Job = Awaited<ReturnType<typeof jobWithGrinder>>;

async function sheetOf(s: Job, sheetId = s.sheet.id) {
  return (await s.builder.get(`/api/sheets/${sheetId}`)).body.sheet;
}

async function issue(s: Job, extra: Record<string, unknown> = {}, sheetId = s.sheet.id) {
  const sheet = await sheetOf(s, sheetId);
  return s.builder.post(`/api/sheets/${sheetId}/issue`, { version: sheet.version, grinderShopId: s.grinderShopId, ...extra });
}

async function approve(o: Client, token: string, index = 0) {
  const read = ((await o.get(`/api/share/${token}`)).body.view as OwnerView).options[index]!;
  return o.post(`/api/share/${token}/approve`, { optionId: read.id, checksum: read.checksum, offer: read.offer, name: 'Demo Owner', agree: true });
}

const move = (who: Client, orderId: string, version: number, to: string, extra: Record<string, unknown> = {}) =>
  who.post(`/api/orders/${orderId}/move`, { version, to, ...extra });

const mailTo = (email: string) =>
  t.db
    .select()
    .from(schema.outbox)
    .all()
    .filter((m) => m.to === email);

describe('a request for a quote and the one firm order', { timeout: 30_000 }, () => {
  it('lets the grinder quote a request but not grind it; the owner approving its revision makes it the firm order', async () => {
    const s = await jobWithGrinder('Quote first');
    const res = await issue(s);
    expect(res.status).toBe(201);
    const order = res.body.order;
    expect(order.firm).toBeNull();
    expect(mailTo(s.grinder.email).find((m) => m.subject.startsWith('New spec sheet'))!.text).toMatch(/request for a quote/);
    expect((await move(s.grinder, order.id, 1, 'quoted', quote)).status).toBe(200);
    const early = await move(s.grinder, order.id, 2, 'grinding');
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('not_firm');
    expect(early.body.error.message).toMatch(/request for a quote/);

    // The owner approves the option bound to that issued revision: the order becomes firm, and the grinder hears it.
    const o = owner();
    expect((await approve(o, s.token)).status).toBe(201);
    const firm = (await s.builder.get(`/api/orders/${order.id}`)).body.order;
    expect(firm).toMatchObject({ firm: { by: 'owner', reason: null }, version: 3 });
    expect(firm.events.map((e: { action: string }) => e.action)).toContain('confirm');
    expect(mailTo(s.grinder.email).some((m) => m.subject.startsWith('Firm order:'))).toBe(true);
    expect((await move(s.grinder, order.id, 3, 'grinding')).status).toBe(200);
    // The approval and the order name one revision and checksum.
    const view = (await o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    expect(view.approval).toMatchObject({ checksum: order.checksum });
  });

  it('lets a builder confirm a request without the owner, with a reason kept in the audit log, and only one per job', async () => {
    const s = await jobWithGrinder('Builder confirms');
    const order = (await issue(s)).body.order;
    const tech = await memberWithRole(t, s.shopId, 'tech');
    expect((await tech.post(`/api/orders/${order.id}/confirm`, { version: 1, reason })).status).toBe(403);
    expect((await s.grinder.post(`/api/orders/${order.id}/confirm`, { version: 1, reason })).status).toBe(403);
    const short = await s.builder.post(`/api/orders/${order.id}/confirm`, { version: 1, reason: 'ok' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty('reason');
    expect((await s.builder.post(`/api/orders/${order.id}/confirm`, { version: 9, reason })).status).toBe(409);
    const ok = await s.builder.post(`/api/orders/${order.id}/confirm`, { version: 1, reason });
    expect(ok.status).toBe(200);
    expect(ok.body.order.firm).toMatchObject({ by: 'builder', reason });
    const row = t.db
      .select()
      .from(schema.auditLog)
      .all()
      .find((a) => a.entity === 'order' && a.entityId === order.id && a.action === 'confirm');
    expect(row?.detail).toMatchObject({ by: 'builder', reason });
    expect((await s.builder.post(`/api/orders/${order.id}/confirm`, { version: 2, reason })).status).toBe(409);

    // A second option of the job can be quoted but not made firm: the job grinds one revision.
    const profile = await s.builder.post(`/api/jobs/${s.jobId}/profiles`, { label: 'Second', spec: s.sheet.current.spec });
    const other = (await s.builder.post(`/api/jobs/${s.jobId}/sheets`, { title: 'Second option', profileId: profile.body.profile.id })).body.sheet;
    const asFirm = await issue(s, { confirm: { reason } }, other.id);
    expect(asFirm.status).toBe(409);
    expect(asFirm.body.error.code).toBe('firm_order_exists');
    const rfq = await issue(s, {}, other.id);
    expect(rfq.status).toBe(201);
    const second = await s.builder.post(`/api/orders/${rfq.body.order.id}/confirm`, { version: 1, reason });
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/already this job’s firm order/);
  });

  it('issues a firm order at once when the builder gives a reason, and refuses a reason once the owner has approved', async () => {
    const s = await jobWithGrinder('Firm at issue');
    const res = await issue(s, { confirm: { reason } });
    expect(res.body.order.firm).toMatchObject({ by: 'builder', reason });
    expect(mailTo(s.grinder.email).find((m) => m.subject.startsWith('New spec sheet'))!.text).toMatch(/firm order/);

    const a = await jobWithGrinder('Approved then reason');
    expect((await approve(owner(), a.token)).status).toBe(201);
    const refused = await issue(a, { confirm: { reason } });
    expect(refused.status).toBe(409);
    const plain = await issue(a);
    expect(plain.body.order.firm).toMatchObject({ by: 'owner' });
  });

  it('refuses the owner an option the shop already ordered another revision for', async () => {
    const s = await jobWithGrinder('Owner too late');
    // The builder confirms an order on a second option; the owner then tries to approve the first.
    const profile = await s.builder.post(`/api/jobs/${s.jobId}/profiles`, { label: 'Second', spec: s.sheet.current.spec });
    const other = (await s.builder.post(`/api/jobs/${s.jobId}/sheets`, { title: 'Second option', profileId: profile.body.profile.id })).body.sheet;
    expect((await issue(s, { confirm: { reason } }, other.id)).status).toBe(201);
    const res = await approve(owner(), s.token);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already ordered another option/);
  });
});

describe('an approval superseded before grinding', { timeout: 30_000 }, () => {
  /** The owner approves revision 1 (a draft), the builder issues it, the grinder asks for changes, the builder saves revision 2. */
  async function changesAsked(name: string, email: string) {
    const s = await jobWithGrinder(name);
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email });
    const o = owner();
    const approval = (await approve(o, s.token)).body.approval;
    const first = (await issue(s)).body.order;
    expect(first.firm).toMatchObject({ by: 'owner' });
    expect((await move(s.grinder, first.id, 1, 'changes-asked', { message: 'Base circle too small for this core' })).status).toBe(200);
    const sheet = await sheetOf(s);
    expect((await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: sheet.version, note: 'Larger base circle per the grinder' })).status).toBe(200);
    return { ...s, o, approval, first };
  }

  it('is withdrawn when the next revision is issued, and the owner is mailed and asked again; their new approval makes it firm', async () => {
    const email = 'asked-again@example.test';
    const s = await changesAsked('Asked again', email);
    // Before this rule the approved, issued revision was a dead end: no later revision could be issued (finding 2).
    const sheet = await sheetOf(s);
    expect(sheet.toIssue).toEqual({ number: 2, approved: false, replacesApproved: 1 });
    const second = await issue(s);
    expect(second.status).toBe(201);
    expect(second.body.order).toMatchObject({ revisionNumber: 2, firm: null });

    const view = (await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    expect(view.approval).toBeNull();
    expect(view.withdrawn).toMatchObject({ optionTitle: 'Towing regrind', checksum: s.approval.checksum });
    expect(view.withdrawn!.reason).toMatch(/Revision 2 .* replaced revision 1/);
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.approval).toBeNull();
    expect(desk.withdrawn).toMatchObject({ checksum: s.approval.checksum });
    const [mail, ...more] = mailTo(email).filter((m) => /approve again/.test(m.subject));
    expect(more).toHaveLength(0);
    expect(mail!.text).toContain('Towing regrind');
    expect(mail!.text).toMatch(/nothing is ground until you approve again/);
    expect(t.db.select().from(schema.ownerApprovals).where(eq(schema.ownerApprovals.jobId, s.jobId)).all()).toHaveLength(1);
    // The old order is closed; the new one cannot be ground until the owner approves again.
    expect((await move(s.grinder, second.body.order.id, 1, 'quoted', quote)).status).toBe(200);
    expect((await move(s.grinder, second.body.order.id, 2, 'grinding')).status).toBe(409);

    // The builder offers revision 2 and the owner approves it: a second approval row, and the order on revision 2 is firm.
    const option = desk.options[0];
    expect((await s.builder.patch(`/api/owner-options/${option.id}`, { version: option.version, refreshRevision: true })).status).toBe(200);
    const again = await approve(s.o, s.token);
    expect(again.status).toBe(201);
    expect(again.body.approval).toMatchObject({ revisionId: second.body.order.revisionId, checksum: second.body.order.checksum });
    expect((await move(s.grinder, second.body.order.id, 3, 'grinding')).status).toBe(200);
    const after = (await s.o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    expect(after.withdrawn).toBeNull();
    const lifecycle = (await s.builder.get(`/api/jobs/${s.jobId}/lifecycle`)).body.lifecycle;
    expect(JSON.stringify(lifecycle)).toContain(second.body.order.checksum);
  });

  it('stays when grinding has begun on the approved revision: issuing another is refused until the shops agree', async () => {
    const s = await jobWithGrinder('Already grinding');
    const o = owner();
    expect((await approve(o, s.token)).status).toBe(201);
    const first = (await issue(s)).body.order;
    await move(s.grinder, first.id, 1, 'quoted', quote);
    expect((await move(s.grinder, first.id, 2, 'grinding')).status).toBe(200);
    const sheet = await sheetOf(s);
    await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: sheet.version, note: 'A late change' });
    const res = await issue(s);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Grinding has begun on revision 1/);
    expect(((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).approval).not.toBeNull();
  });
});
