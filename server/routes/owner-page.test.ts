import { createHash, randomBytes } from 'node:crypto';

import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { offerChecksum, revisionChecksum } from '@/shared/checksum';
import type { OwnerView } from '@/shared/owner';
import { Client, createTestApp, makeShop, memberWithRole, signUp, verifyEmail, type TestApp } from '@/tests/fixtures';
import { ownerPageKit } from '@/tests/owner-page-kit';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const { INTERNAL_FINDINGS, INTERNAL_SHEET_NOTE, sharedJob, owner } = ownerPageKit(() => t);

describe('share links', () => {
  it('are 256-bit random tokens stored only as a hash', async () => {
    const s = await sharedJob('Hash shop');
    expect(s.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const row = t.db.select().from(schema.shareLinks).where(eq(schema.shareLinks.id, s.linkId)).get()!;
    expect(row.tokenHash).not.toContain(s.token);
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    // 30 days by default.
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeGreaterThan(29.9 * 24 * 3600 * 1000);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeLessThan(30.1 * 24 * 3600 * 1000);
  });

  it('refuse guessed tokens: random, near-miss and malformed ones all get 404', async () => {
    const s = await sharedJob('Guess shop');
    const o = owner();
    const flipped = (s.token[0] === 'A' ? 'B' : 'A') + s.token.slice(1);
    const guesses = [
      flipped,
      s.token.slice(0, -1),
      `${s.token}A`,
      '',
      'null',
      '../../etc/passwd',
      ...Array.from({ length: 20 }, () => randomBytes(32).toString('base64url')),
    ];
    for (const guess of guesses) {
      const res = await o.get(`/api/share/${encodeURIComponent(guess)}`);
      expect([404], `token ${guess}`).toContain(res.status);
    }
    expect((await o.get(`/api/share/${s.token}`)).status).toBe(200);
  });

  it('stop working when revoked or expired', async () => {
    const s = await sharedJob('Revoke shop');
    const o = owner();
    expect((await o.get(`/api/share/${s.token}`)).status).toBe(200);
    const revoked = await s.builder.post(`/api/share-links/${s.linkId}/revoke`);
    expect(revoked.body.link.state).toBe('revoked');
    expect((await o.get(`/api/share/${s.token}`)).status).toBe(404);

    const next = await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { expiresInDays: 1 });
    expect((await o.get(`/api/share/${next.body.token}`)).status).toBe(200);
    t.db
      .update(schema.shareLinks)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.shareLinks.id, next.body.link.id))
      .run();
    expect((await o.get(`/api/share/${next.body.token}`)).status).toBe(404);
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.links.map((l: { state: string }) => l.state).sort()).toEqual(['expired', 'revoked']);
  });

  it('are made and revoked by builders of the shop only', async () => {
    const s = await sharedJob('Who shop');
    const tech = await memberWithRole(t, s.shopId, 'tech');
    expect((await tech.post(`/api/jobs/${s.jobId}/share-links`, {})).status).toBe(403);
    expect((await tech.post(`/api/share-links/${s.linkId}/revoke`)).status).toBe(403);
    const other = await makeShop(t, 'repair', 'Other repair');
    expect((await other.founder.post(`/api/jobs/${s.jobId}/share-links`, {})).status).toBe(404);
    expect((await other.founder.post(`/api/share-links/${s.linkId}/revoke`)).status).toBe(404);
    expect((await owner().post(`/api/jobs/${s.jobId}/share-links`, {})).status).toBe(401);
    expect((await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { expiresInDays: 400 })).body.error.fields).toHaveProperty('expiresInDays');
  });

  it('can be mailed to the owner through the outbox', async () => {
    const s = await sharedJob('Mail link shop');
    const res = await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email: 'owner-mail-link@example.test' });
    expect(res.body.emailed).toBe(true);
    const mail = t.db
      .select()
      .from(schema.outbox)
      .all()
      .find((m) => m.to === 'owner-mail-link@example.test')!;
    expect(mail.text).toContain(res.body.url);
    expect(mail.text).not.toContain(INTERNAL_FINDINGS);
  });
});

describe('the owner view', () => {
  it('shows the owner words, options, comparison and cautions, and leaks nothing internal', async () => {
    const s = await sharedJob('Leak shop');
    // A photo the builder did not mark shareable stays out.
    t.db
      .insert(schema.photos)
      .values({
        id: 'private-photo',
        shopId: s.shopId,
        jobId: s.jobId,
        storedName: 'private-photo.jpg',
        originalName: 'secret.jpg',
        mimeType: 'image/jpeg',
        size: 10,
        caption: 'INTERNAL caption',
      })
      .run();
    const res = await owner().get(`/api/share/${s.token}`);
    expect(res.status).toBe(200);
    const view = res.body.view as OwnerView;
    expect(view.whatFailed).toBe('A lifter stopped rolling and wore the cam lobe.');
    expect(view.options).toHaveLength(1);
    expect(view.options[0]).toMatchObject({ title: 'Towing regrind', priceCents: 76_000, depositCents: 22_500, leadTimeDays: 8 });
    expect(view.cautions.join(' ')).toMatch(/emissions/i);
    expect(view.cautions.join(' ')).toMatch(/measures piston-to-valve clearance/i);
    expect(view.photos).toEqual([]);
    const text = JSON.stringify(res.body);
    for (const secret of [INTERNAL_FINDINGS, INTERNAL_SHEET_NOTE, 'Test core', 'INTERNAL caption', 'secret.jpg', s.shopId, s.sheet.id])
      expect(text).not.toContain(secret);
    expect(res.body.view).not.toHaveProperty('findings');
    expect(res.body.view.options[0]).not.toHaveProperty('revisionId');
  });

  it('compares each option with the first in plain words', async () => {
    const s = await sharedJob('Compare shop');
    const stock = await s.builder.post(`/api/jobs/${s.jobId}/profiles`, {
      label: 'Stock-spec',
      coreNotes: '',
      spec: { ...s.sheet.current.spec, intake: { ...s.sheet.current.spec.intake, duration050: s.sheet.current.spec.intake.duration050 - 8 } },
    });
    const stockSheet = (await s.builder.post(`/api/jobs/${s.jobId}/sheets`, { title: 'Stock', profileId: stock.body.profile.id })).body.sheet;
    await s.builder.post(`/api/jobs/${s.jobId}/owner/options`, {
      sheetId: stockSheet.id,
      title: 'Stock-spec',
      priceCents: 60_000,
      depositCents: 20_000,
      leadTimeDays: 5,
    });
    const view = (await owner().get(`/api/share/${s.token}`)).body.view as OwnerView;
    expect(view.options.map((o) => o.title)).toEqual(['Towing regrind', 'Stock-spec']);
    expect(view.options[0]!.comparison).toBeNull();
    // 8° less intake duration at 0.050 in, said in words (hand-worked from the two specs).
    expect(view.options[1]!.comparison!.points.find((p) => p.topic === 'timing')!.text).toMatch(/intake valve open about 8° shorter/);
    expect(view.options[1]!.fit).toMatch(/fit checks/);
  });
});

describe('approval', () => {
  it('binds the exact revision checksum and notifies the builders', async () => {
    const s = await sharedJob('Approve shop');
    const o = owner();
    const view = (await o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    const option = view.options[0]!;
    const revision = t.db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.sheetId, s.sheet.id)).get()!;
    expect(option.checksum).toBe(revisionChecksum(revision));

    const missing = await o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: '' });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['agree', 'name']);
    const wrong = await o.post(`/api/share/${s.token}/approve`, {
      optionId: option.id,
      checksum: '0123456789ab',
      offer: option.offer,
      name: 'Test Owner',
      agree: true,
    });
    expect(wrong.status).toBe(409);

    const ok = await o.post(`/api/share/${s.token}/approve`, {
      optionId: option.id,
      checksum: option.checksum,
      offer: option.offer,
      name: 'Test Owner',
      agree: true,
    });
    expect(ok.status).toBe(201);
    expect(ok.body.approval).toMatchObject({ optionId: option.id, checksum: revisionChecksum(revision), revisionId: revision.id, name: 'Test Owner' });
    expect(
      (await o.post(`/api/share/${s.token}/approve`, { optionId: option.id, checksum: option.checksum, offer: option.offer, name: 'Again', agree: true }))
        .status,
    ).toBe(409);

    const mail = t.db
      .select()
      .from(schema.outbox)
      .all()
      .find((m) => m.to === s.builder.email && m.subject.startsWith('Approved: Towing regrind'));
    expect(mail?.text).toContain(revisionChecksum(revision));
    // Options are locked once approved.
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.approval.checksum).toBe(option.checksum);
    expect((await s.builder.patch(`/api/owner-options/${option.id}`, { version: desk.options[0].version, priceCents: 1 })).status).toBe(409);
    expect((await s.builder.delete(`/api/owner-options/${option.id}`)).status).toBe(409);
  });

  it('refuses an option the builder changed after the owner opened the page', async () => {
    const s = await sharedJob('Stale shop');
    const o = owner();
    const before = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: s.sheet.version, note: 'Changed after sharing', newRevision: true });
    expect(edited.status).toBe(200);
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.options[0].stale).toBe(true);
    const refreshed = await s.builder.patch(`/api/owner-options/${before.id}`, { version: desk.options[0].version, refreshRevision: true });
    expect(refreshed.body.desk.options[0].stale).toBe(false);
    const res = await o.post(`/api/share/${s.token}/approve`, {
      optionId: before.id,
      checksum: before.checksum,
      offer: before.offer,
      name: 'Test Owner',
      agree: true,
    });
    expect(res.status).toBe(409);
  });
});

describe('an approval names the revision the sheet holds (one job, one truth, finding 2)', () => {
  const approve = (o: ReturnType<typeof owner>, token: string, read: OwnerView['options'][number]) =>
    o.post(`/api/share/${token}/approve`, { optionId: read.id, checksum: read.checksum, offer: read.offer, name: 'Test Owner', agree: true });

  it('refuses an option whose sheet has a newer revision, even read fresh, and takes it once the builder offers the newest', async () => {
    const s = await sharedJob('Newer revision shop');
    const o = owner();
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: s.sheet.version, note: 'Revision 2 for the grinder', newRevision: true });
    expect(edited.status).toBe(200);
    // The owner reloads: the option still offers revision 1, an earlier draft nobody will grind.
    const read = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect(read.revisionNumber).toBe(1);
    expect(read.updating).toContain('revision 2');
    const refused = await approve(o, s.token, read);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('option_stale');
    expect(refused.body.error.message).toContain('revision 2');
    expect(t.db.select().from(schema.ownerApprovals).where(eq(schema.ownerApprovals.jobId, s.jobId)).get()).toBeUndefined();

    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    await s.builder.patch(`/api/owner-options/${read.id}`, { version: desk.options[0].version, refreshRevision: true });
    const fresh = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect(fresh.revisionNumber).toBe(2);
    expect(fresh.updating).toBeNull();
    const ok = await approve(o, s.token, fresh);
    expect(ok.status).toBe(201);
    const latest = t.db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.sheetId, s.sheet.id)).all().at(-1)!;
    // The stored approval names the sheet's latest revision by id, with that revision's own checksum.
    expect(ok.body.approval).toMatchObject({ revisionId: latest.id, checksum: revisionChecksum(latest) });
  });

  it('keeps the approved draft as approved: a later save starts the next revision, and issuing sends the approved one with its checksum', async () => {
    const s = await sharedJob('Approved draft shop');
    const grinding = await makeShop(t, 'grinding', 'Approved draft grinding');
    const o = owner();
    const read = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    const ok = await approve(o, s.token, read);
    expect(ok.status).toBe(201);
    const approvedRow = t.db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, ok.body.approval.revisionId)).get()!;
    expect(approvedRow.state).toBe('draft');

    // The builder edits after the approval: revision 2 is written, the approved revision 1 stays word for word.
    const sheet = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    expect(sheet.toIssue).toEqual({ number: 1, approved: true, replacesApproved: null });
    const saved = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: sheet.version, note: 'A later idea, not approved' });
    expect(saved.status).toBe(200);
    expect(saved.body.sheet.current.number).toBe(2);
    expect(saved.body.sheet.toIssue).toEqual({ number: 1, approved: true, replacesApproved: null });
    const after = t.db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, approvedRow.id)).get()!;
    expect(after).toEqual(approvedRow);
    expect(revisionChecksum(after)).toBe(ok.body.approval.checksum);
    // The engine is checked against the approved revision, the one to be ground, not the newer draft.
    const tech = await memberWithRole(t, s.shopId, 'tech');
    const run = await tech.post(`/api/sheets/${s.sheet.id}/fit-checks`);
    expect(run.status).toBe(201);
    expect(run.body.run).toMatchObject({ revisionId: approvedRow.id, revisionNumber: 1 });

    // Issuing sends revision 1, the approved one, not the newer draft: the order and the approval name one revision and checksum.
    const issued = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: saved.body.sheet.version, grinderShopId: grinding.shopId });
    expect(issued.status).toBe(201);
    expect(issued.body.order).toMatchObject({ revisionId: ok.body.approval.revisionId, revisionNumber: 1, checksum: ok.body.approval.checksum });
    expect(issued.body.order.firm).toMatchObject({ by: 'owner', reason: null });
    // Revision 2, saved after the approval, is what can go next: it replaces the approved revision (see firm-orders.test.ts).
    const next = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    expect(next.toIssue).toEqual({ number: 2, approved: false, replacesApproved: 1 });
  });

  it('refuses to issue a sheet the owner did not approve', async () => {
    const s = await sharedJob('Other sheet shop');
    const grinding = await makeShop(t, 'grinding', 'Other sheet grinding');
    // One sheet per option: the second option is its own profile with its own sheet.
    const second = await s.builder.post(`/api/jobs/${s.jobId}/profiles`, { label: 'Second', spec: s.sheet.current.spec });
    const otherSheet = (await s.builder.post(`/api/jobs/${s.jobId}/sheets`, { title: 'Second option', profileId: second.body.profile.id })).body.sheet;
    const o = owner();
    const read = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect((await approve(o, s.token, read)).status).toBe(201);
    const sheet = (await s.builder.get(`/api/sheets/${otherSheet.id}`)).body.sheet;
    expect(sheet.toIssue).toBeNull();
    expect(sheet.issueBlocked).toMatch(/owner approved another option/);
    const res = await s.builder.post(`/api/sheets/${otherSheet.id}/issue`, { version: sheet.version, grinderShopId: grinding.shopId });
    expect(res.status).toBe(409);
    expect(t.db.select().from(schema.grindOrders).where(eq(schema.grindOrders.sheetId, otherSheet.id)).all()).toEqual([]);
  });

  it('refuses a draft edited in place after the option was offered, and the desk flags it', async () => {
    const s = await sharedJob('Edited draft shop');
    const o = owner();
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: s.sheet.version, note: 'Edited in the same draft' });
    expect(edited.status).toBe(200);
    expect(edited.body.sheet.current.number).toBe(1);
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect(desk.options[0].stale).toBe(true);
    const read = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    const refused = await approve(o, s.token, read);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('option_stale');
    expect(refused.body.error.message).toContain('edited');
  });
});

describe('an owner with an account', () => {
  it('finds the summary sent to their e-mail, approves it signed in, and sees nothing else', async () => {
    const s = await sharedJob('Account owner shop');
    const customer = await memberWithRole(t, s.shopId, 'customer');
    expect((await customer.get('/api/my/jobs')).body.jobs).toEqual([]);
    expect((await customer.get(`/api/my/jobs/${s.jobId}`)).status).toBe(404);
    // The builder sends a link to the owner's address (any case).
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email: customer.email.toUpperCase() });
    const list = (await customer.get('/api/my/jobs')).body.jobs;
    expect(list).toEqual([{ jobId: s.jobId, vehicle: expect.any(String), shopName: 'Account owner shop', approved: false, paid: false }]);
    const view = (await customer.get(`/api/my/jobs/${s.jobId}`)).body.view as OwnerView;
    expect(JSON.stringify(view)).not.toContain(INTERNAL_FINDINGS);
    const option = view.options[0]!;
    const approved = await customer.post(`/api/my/jobs/${s.jobId}/approve`, {
      optionId: option.id,
      checksum: option.checksum,
      offer: option.offer,
      name: 'Signed Owner',
      agree: true,
    });
    expect(approved.status).toBe(201);
    const audit = t.db.select().from(schema.auditLog).where(eq(schema.auditLog.entityId, approved.body.approval.id)).get()!;
    expect(audit.userId).toBe(customer.userId);
    const start = await customer.post(`/api/my/jobs/${s.jobId}/deposit`);
    expect(start.status).toBe(201);
    const paid = await fetch(start.body.url, { method: 'POST', redirect: 'manual' });
    expect(new URL(paid.headers.get('location')!).pathname).toBe(`/my/${s.jobId}`);
    expect((await customer.get('/api/my/jobs')).body.jobs[0]).toMatchObject({ approved: true, paid: true });
    // Staff and other shops' owners do not get this route.
    expect((await s.builder.get('/api/my/jobs')).status).toBe(403);
    const elsewhere = await makeShop(t, 'repair', 'Elsewhere');
    const otherOwner = await memberWithRole(t, elsewhere.shopId, 'customer');
    expect((await otherOwner.get(`/api/my/jobs/${s.jobId}`)).status).toBe(404);
  });
});

describe('inviting the owner', () => {
  it('gives an owner who signs up later with the e-mailed address a customer account that finds the summary', async () => {
    const s = await sharedJob('Invite shop');
    const email = `later-owner-${Date.now()}@example.test`;
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email });
    const later = new Client(t.url);
    expect((await later.post('/api/auth/sign-up/email', { name: 'Later Owner', email, password: 'correct-horse-9' })).status).toBe(200);
    await verifyEmail(t, later, email);
    const joined = t.db.select().from(schema.memberships).where(eq(schema.memberships.organizationId, s.shopId)).all();
    expect(joined.map((m) => m.role).sort()).toEqual(['builder', 'customer']);
    const me = (await later.get('/api/me')).body;
    expect(me.activeShop).toMatchObject({ id: s.shopId, role: 'customer' });
    expect((await later.get('/api/my/jobs')).body.jobs.map((j: { jobId: string }) => j.jobId)).toEqual([s.jobId]);
    // Not staff: no jobs list.
    expect((await later.get('/api/jobs')).status).toBe(403);
  });

  it('keeps someone who signs up with the e-mailed address out of the shop until they verify it', async () => {
    const s = await sharedJob('Unverified invite shop');
    const email = `claimed-${Date.now()}@example.test`;
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email });
    const claimant = new Client(t.url);
    expect((await claimant.post('/api/auth/sign-up/email', { name: 'Claimant', email, password: 'correct-horse-9' })).status).toBe(200);
    const user = t.db.select().from(schema.users).where(eq(schema.users.email, email)).get()!;
    expect(user.emailVerified).toBe(false);
    expect(t.db.select().from(schema.memberships).where(eq(schema.memberships.userId, user.id)).all()).toEqual([]);
    expect((await claimant.get(`/api/my/jobs/${s.jobId}`)).status).not.toBe(200);
    expect((await claimant.get('/api/my/jobs')).status).not.toBe(200);
    // A second share link to an unverified account does not add it either.
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email });
    expect(t.db.select().from(schema.memberships).where(eq(schema.memberships.userId, user.id)).all()).toEqual([]);
    await verifyEmail(t, claimant, email);
    expect((await claimant.get(`/api/my/jobs/${s.jobId}`)).status).toBe(200);
  });

  it('adds an existing account as a customer and leaves a staff member their role', async () => {
    const s = await sharedJob('Existing invite shop');
    const existing = await signUp(t, 'Existing Owner');
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email: existing.email });
    const membership = t.db.select().from(schema.memberships).where(eq(schema.memberships.userId, existing.userId)).get();
    expect(membership).toMatchObject({ organizationId: s.shopId, role: 'customer' });
    await s.builder.post(`/api/jobs/${s.jobId}/share-links`, { email: s.builder.email });
    const own = t.db.select().from(schema.memberships).where(eq(schema.memberships.userId, s.builder.userId)).all();
    expect(own.map((m) => m.role)).toEqual(['builder']);
  });
});

describe('the approval binds the whole offer (finding 4)', () => {
  it('refuses an approval after the builder changed the price, deposit, lead time or name, and takes it once the owner reloads', async () => {
    const s = await sharedJob('Offer shop');
    const o = owner();
    const option = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    const approval = (read: typeof option) => ({ optionId: read.id, checksum: read.checksum, offer: read.offer, name: 'Test Owner', agree: true });
    const changes = [{ priceCents: 9_999_999 }, { depositCents: 100 }, { leadTimeDays: 60 }, { title: 'Towing regrind, premium' }];
    let read = option;
    for (const change of changes) {
      const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
      expect((await s.builder.patch(`/api/owner-options/${option.id}`, { version: desk.options[0].version, ...change })).status).toBe(200);
      const stale = await o.post(`/api/share/${s.token}/approve`, approval(read));
      expect(stale.status, JSON.stringify(change)).toBe(409);
      expect(stale.body.error.code).toBe('offer_changed');
      expect(stale.body.error.message).toMatch(/reload/);
      expect(t.db.select().from(schema.ownerApprovals).where(eq(schema.ownerApprovals.jobId, s.jobId)).get()).toBeUndefined();
      read = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
      expect(read.offer).not.toBe(option.offer);
    }
    const ok = await o.post(`/api/share/${s.token}/approve`, approval(read));
    expect(ok.status).toBe(201);
    expect(ok.body.approval).toMatchObject({
      priceCents: 9_999_999,
      depositCents: 100,
      leadTimeDays: 60,
      currency: 'usd',
      offer: read.offer,
      optionTitle: 'Towing regrind, premium',
    });
    // The approved option cannot change any more.
    const desk = (await s.builder.get(`/api/jobs/${s.jobId}/owner`)).body.desk;
    expect((await s.builder.patch(`/api/owner-options/${option.id}`, { version: desk.options[0].version, priceCents: 50_000 })).status).toBe(409);
  });

  it('changes the offer checksum with each term, as SHA-256 over the canonical JSON of the offer', () => {
    // FIPS 180-4 SHA-256, checked here with node:crypto (an independent implementation) over the documented canonical JSON.
    const terms = { checksum: '0123456789ab', title: 'Stock regrind', priceCents: 50_000, depositCents: 10_000, currency: 'usd', leadTimeDays: 7 };
    const json = '{"checksum":"0123456789ab","currency":"usd","depositCents":10000,"leadTimeDays":7,"priceCents":50000,"title":"Stock regrind"}';
    expect(offerChecksum(terms)).toBe(createHash('sha256').update(json).digest('hex').slice(0, 12));
    for (const change of [
      { priceCents: 50_001 },
      { depositCents: 0 },
      { currency: 'cad' },
      { leadTimeDays: 8 },
      { title: 'Stock regrind ' },
      { checksum: '0123456789ac' },
    ]) {
      expect(offerChecksum({ ...terms, ...change })).not.toBe(offerChecksum(terms));
    }
  });
});

describe('the owner page after the fit checks ran on the engine (issue 14, finding 7)', () => {
  it('shows the latest run of the offered revision, when and by whom, and no longer says PTV is still to be measured', async () => {
    const s = await sharedJob('Checked shop');
    const o = owner();
    const before = (await o.get(`/api/share/${s.token}`)).body.view as OwnerView;
    const option = before.options[0]!;
    expect(option.checkedOnEngine).toBeNull();
    expect(option.fit).toContain('Still to be measured on the engine');
    expect(option.fit).toContain('clearance to the piston');
    expect(option.summary.complete).toBe(false);
    expect(option.summary.label).toMatch(/^(Fail · |Watch · )?\d+ of \d+ checks run$/);

    // The tech measures a PTV baseline too tight for the towing lift and runs the checks: PTV fails.
    const tech = await memberWithRole(t, s.shopId, 'tech');
    const tight = [{ crankAngle: -10, clearance: 0.06, valveLift: 0.046 }];
    expect(
      (await tech.post(`/api/jobs/${s.jobId}/measurements`, { kind: 'ptv-baseline', data: { method: 'clay', intake: tight, exhaust: tight } })).status,
    ).toBe(201);
    const run = (await tech.post(`/api/sheets/${s.sheet.id}/fit-checks`)).body.run;
    expect(run.results.checks.find((c: { id: string }) => c.id === 'ptvIntake').status).toBe('fail');

    const after = ((await o.get(`/api/share/${s.token}`)).body.view as OwnerView).options[0]!;
    expect(after.checkedOnEngine).toEqual({ revisionNumber: run.revisionNumber, at: run.createdAt, by: 'A tech' });
    expect(after.summary).toEqual(run.summary);
    expect(after.summary.status).toBe('fail');
    expect(after.summary.label).toMatch(/^Fail · \d+ of \d+ checks run$/);
    expect(after.fit).toMatch(/^The shop's fit checks on the engine flag intake valve clearance to the piston/);
    expect(after.fit).not.toMatch(/Still to be measured on the engine: .*clearance to the piston/);
    // The builder's desk and the owner page read the same run.
    const runs = (await s.builder.get(`/api/sheets/${s.sheet.id}/fit-checks`)).body.runs;
    expect(runs[0].summary).toEqual(after.summary);
  });
});
