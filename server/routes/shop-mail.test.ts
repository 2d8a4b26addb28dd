import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { createTestApp, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

import { markMailFailedTry, queueMail } from '../store/outbox';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A mail about `shopId` that failed after every try, as the sender leaves it. */
function failed(shopId: string, subject: string) {
  const id = queueMail(t.db, { to: 'owner@example.test', subject, text: 'Plain', html: '<p>Marked</p>' }, 'pending', shopId);
  t.db.update(schema.outbox).set({ attempts: 6 }).where(eq(schema.outbox.id, id)).run();
  markMailFailedTry(t.db, id, '550 mailbox unavailable', null);
  return id;
}

describe("the shop's undelivered mail", () => {
  it('shows the builder each mail that failed after every try, with the last answer, and puts one back in line', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Mail shop');
    const other = await makeShop(t, 'repair', 'Other mail shop');
    const id = failed(shopId, 'Your owner page');
    const theirs = failed(other.shopId, 'Not yours');

    const list = await founder.get('/api/shop/mail-failures');
    expect(list.status).toBe(200);
    expect(list.body.failures).toEqual([
      { id, to: 'owner@example.test', subject: 'Your owner page', attempts: 6, lastError: '550 mailbox unavailable', createdAt: expect.any(String) },
    ]);

    expect((await founder.post(`/api/shop/mail-failures/${theirs}/retry`)).status).toBe(404);
    const retried = await founder.post(`/api/shop/mail-failures/${id}/retry`);
    expect(retried.status).toBe(200);
    expect(retried.body.failures).toEqual([]);
    expect(t.db.select().from(schema.outbox).where(eq(schema.outbox.id, id)).get()).toMatchObject({ status: 'pending', attempts: 0 });
    expect(t.db.select().from(schema.auditLog).where(eq(schema.auditLog.entityId, id)).all()).toEqual([
      expect.objectContaining({ action: 'retry', entity: 'mail', shopId }),
    ]);
    // Sent again already: a second retry finds nothing failed.
    expect((await founder.post(`/api/shop/mail-failures/${id}/retry`)).status).toBe(404);
  });

  it('is not for a tech', async () => {
    const { shopId } = await makeShop(t, 'repair', 'Tech mail shop');
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get('/api/shop/mail-failures')).status).toBe(403);
  });
});
