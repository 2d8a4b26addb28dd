import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEFAULT_CHECK_LIMITS, SHOP_SOURCE } from '@/calc/checks';
import { defaultChecklistLabels } from '@/shared/measurements';
import { createTestApp, makeJobBody, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function shopWithJob(name = 'Checklist shop') {
  const shop = await makeShop(t, 'repair', name);
  const job = await shop.founder.post('/api/jobs', makeJobBody());
  return { ...shop, jobId: job.body.job.id as string };
}

describe('job checklist', () => {
  it('starts with the default items on first read, once', async () => {
    const { founder, jobId } = await shopWithJob();
    const first = await founder.get(`/api/jobs/${jobId}/checklist`);
    expect(first.status).toBe(200);
    expect(first.body.items.map((i: { label: string }) => i.label)).toEqual([...defaultChecklistLabels]);
    expect(first.body.items.map((i: { position: number }) => i.position)).toEqual(defaultChecklistLabels.map((_, i) => i + 1));
    const labels = first.body.items.map((i: { label: string }) => i.label).join(' | ');
    for (const topic of [/lifters/, /head bolts/, /valve stem seals/, /Timing set/, /in order/, /degreed/, /Piston-to-valve/, /coil bind/, /Break-in/]) {
      expect(labels).toMatch(topic);
    }
    expect(first.body.items.every((i: { doneAt: null; doneBy: null }) => i.doneAt === null && i.doneBy === null)).toBe(true);
    expect((await founder.get(`/api/jobs/${jobId}/checklist`)).body.items).toEqual(first.body.items);
  });

  it('records who ticked an item and when, clears it on untick, and keeps removed items removed', async () => {
    const { shopId, founder, jobId } = await shopWithJob();
    const tech = await memberWithRole(t, shopId, 'tech');
    const items = (await tech.get(`/api/jobs/${jobId}/checklist`)).body.items;
    const before = Date.now();
    const ticked = await tech.patch(`/api/checklist/${items[0].id}`, { done: true });
    expect(ticked.status).toBe(200);
    expect(ticked.body.item.doneBy).toEqual({ id: tech.userId, name: 'A tech' });
    expect(Date.parse(ticked.body.item.doneAt)).toBeGreaterThanOrEqual(before - 1000);
    // A second tick by someone else keeps the first who and when.
    const again = await founder.patch(`/api/checklist/${items[0].id}`, { done: true });
    expect(again.body.item).toEqual(ticked.body.item);
    const unticked = await founder.patch(`/api/checklist/${items[0].id}`, { done: false });
    expect(unticked.body.item).toMatchObject({ doneAt: null, doneBy: null });
    expect((await tech.patch(`/api/checklist/${items[0].id}`, { done: 'yes' })).body.error.fields).toEqual({ done: 'Say whether it is done' });

    const added = await tech.post(`/api/jobs/${jobId}/checklist`, { label: '  Oil pump pickup screen cleaned  ' });
    expect(added.status).toBe(201);
    expect(added.body.item).toMatchObject({ label: 'Oil pump pickup screen cleaned', position: defaultChecklistLabels.length + 1, doneBy: null });
    expect((await tech.post(`/api/jobs/${jobId}/checklist`, { label: ' ' })).body.error.fields).toEqual({ label: 'Write the item' });

    expect((await tech.delete(`/api/checklist/${items[1].id}`)).status).toBe(204);
    const after = (await tech.get(`/api/jobs/${jobId}/checklist`)).body.items;
    expect(after).toHaveLength(defaultChecklistLabels.length);
    expect(after.map((i: { id: string }) => i.id)).not.toContain(items[1].id);
    expect(after.at(-1).label).toBe('Oil pump pickup screen cleaned');
  });

  it('keeps shops apart and customers and grinders out', async () => {
    const a = await shopWithJob('Shop A');
    const b = await shopWithJob('Shop B');
    const item = (await a.founder.get(`/api/jobs/${a.jobId}/checklist`)).body.items[0];
    expect((await b.founder.get(`/api/jobs/${a.jobId}/checklist`)).status).toBe(404);
    expect((await b.founder.post(`/api/jobs/${a.jobId}/checklist`, { label: 'x' })).status).toBe(404);
    expect((await b.founder.patch(`/api/checklist/${item.id}`, { done: true })).status).toBe(404);
    expect((await b.founder.delete(`/api/checklist/${item.id}`)).status).toBe(404);
    for (const role of ['customer', 'grinder'] as const) {
      const person = await memberWithRole(t, a.shopId, role);
      expect((await person.get(`/api/jobs/${a.jobId}/checklist`)).status).toBe(403);
      expect((await person.post(`/api/jobs/${a.jobId}/checklist`, { label: 'x' })).status).toBe(403);
      expect((await person.patch(`/api/checklist/${item.id}`, { done: true })).status).toBe(403);
      expect((await person.delete(`/api/checklist/${item.id}`)).status).toBe(403);
    }
    const still = (await a.founder.get(`/api/jobs/${a.jobId}/checklist`)).body.items;
    expect(still[0]).toEqual(item);
    expect(still).toHaveLength(defaultChecklistLabels.length);
  });
});

describe('shop limits', () => {
  it("starts empty with calc's defaults, saves overrides with the shop's source, and guards the version", async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Limits shop');
    const tech = await memberWithRole(t, shopId, 'tech');
    const empty = await tech.get('/api/shop/limits');
    expect(empty.status).toBe(200);
    expect(empty.body).toEqual({ limits: {}, version: 0, resolved: DEFAULT_CHECK_LIMITS, defaults: DEFAULT_CHECK_LIMITS });

    const limits = { ptvIntake: { min: 0.1 }, hydraulicPreload: { min: 0.025, max: 0.07, source: 'Lifter maker sheet (demo)' } };
    const saved = await founder.put('/api/shop/limits', { version: 0, limits });
    expect(saved.status).toBe(200);
    expect(saved.body).toMatchObject({ limits, version: 1 });
    expect(saved.body.resolved.ptvIntake).toEqual({ min: 0.1, watchBand: DEFAULT_CHECK_LIMITS.ptvIntake.watchBand, source: SHOP_SOURCE });
    expect(saved.body.resolved.hydraulicPreload).toMatchObject({ min: 0.025, max: 0.07, source: 'Lifter maker sheet (demo)' });
    expect(saved.body.resolved.coilBind).toEqual(DEFAULT_CHECK_LIMITS.coilBind);
    expect((await tech.get('/api/shop/limits')).body).toEqual(saved.body);

    const stale = await founder.put('/api/shop/limits', { version: 0, limits: {} });
    expect(stale.status).toBe(409);
    const next = await founder.put('/api/shop/limits', { version: 1, limits: {} });
    expect(next.body).toMatchObject({ limits: {}, version: 2, resolved: DEFAULT_CHECK_LIMITS });
  });

  it('names every bad field: unknown rules and fields, non-numbers, negative bands, max not above min', async () => {
    const { founder } = await makeShop(t, 'repair', 'Bad limits shop');
    const res = await founder.put('/api/shop/limits', {
      version: 0,
      limits: {
        valveFloat: { min: 1 },
        coilBind: { min: 'lots', max: 0.2 },
        ptvExhaust: { watchBand: -0.01 },
        hydraulicPreload: { min: 0.06, max: 0.02 },
      },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      'limits.valveFloat': 'Unknown field',
      'limits.coilBind.min': 'Minimum must be a number',
      'limits.coilBind.max': 'Unknown field',
      'limits.ptvExhaust.watchBand': 'Watch band cannot be negative',
      'limits.hydraulicPreload.max': 'Maximum must be above the minimum',
    });
    // A lone minimum above the default maximum is caught once merged with the defaults.
    const merged = await founder.put('/api/shop/limits', { version: 0, limits: { hydraulicPreload: { min: 0.08 } } });
    expect(merged.status).toBe(400);
    expect(Object.keys(merged.body.error.fields)).toEqual(['limits.hydraulicPreload.max']);
    expect((await founder.get('/api/shop/limits')).body.version).toBe(0);
  });

  it('lets only the builder change limits; tech reads; customer and grinder get 403; shops are apart', async () => {
    const a = await makeShop(t, 'repair', 'Shop A limits');
    const b = await makeShop(t, 'repair', 'Shop B limits');
    await a.founder.put('/api/shop/limits', { version: 0, limits: { coilBind: { min: 0.08 } } });
    expect((await b.founder.get('/api/shop/limits')).body.limits).toEqual({});
    const tech = await memberWithRole(t, a.shopId, 'tech');
    expect((await tech.put('/api/shop/limits', { version: 1, limits: {} })).status).toBe(403);
    for (const role of ['customer', 'grinder'] as const) {
      const person = await memberWithRole(t, a.shopId, role);
      expect((await person.get('/api/shop/limits')).status).toBe(403);
      expect((await person.put('/api/shop/limits', { version: 1, limits: {} })).status).toBe(403);
    }
    const grinding = await makeShop(t, 'grinding', 'Grinding shop');
    expect((await grinding.founder.put('/api/shop/limits', { version: 0, limits: {} })).status).toBe(403);
    expect((await a.founder.get('/api/shop/limits')).body).toMatchObject({ version: 1, limits: { coilBind: { min: 0.08 } } });
  });
});
