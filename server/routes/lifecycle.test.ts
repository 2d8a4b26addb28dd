import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Lifecycle, LifecycleStageKey } from '@/shared/lifecycle';
import { createTestApp, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';
import { ownerPageKit } from '@/tests/owner-page-kit';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const { sharedJob, owner } = ownerPageKit(() => t);

const doneKeys = (l: Lifecycle) => l.stages.filter((s) => s.done).map((s) => s.key);

describe('a job’s lifecycle', { timeout: 30_000 }, () => {
  it('is read from the records, stage by stage, and only the approved revision’s order counts as the firm one', async () => {
    const s = await sharedJob('Lifecycle shop');
    const read = async () => {
      const res = await s.builder.get(`/api/jobs/${s.jobId}/lifecycle`);
      expect(res.status).toBe(200);
      return res.body.lifecycle as Lifecycle;
    };
    const stage = (l: Lifecycle, key: LifecycleStageKey) => l.stages.find((x) => x.key === key)!;

    // Findings written, one option sent by link; nothing measured yet.
    let l = await read();
    expect(l.stages.map((x) => x.key)).toEqual([
      'findings',
      'measured',
      'offered',
      'approved',
      'ordered',
      'shipped',
      'received',
      'installed',
      'checked',
      'returned',
    ]);
    expect(doneKeys(l)).toEqual(['findings', 'offered']);
    expect(l.next).toBe('measured');

    const o = owner();
    const view = (await o.get(`/api/share/${s.token}`)).body.view;
    const option = view.options[0];
    const approved = await o.post(`/api/share/${s.token}/approve`, {
      optionId: option.id,
      checksum: option.checksum,
      offer: option.offer,
      name: 'Test Owner',
      agree: true,
    });
    expect(approved.status).toBe(201);
    l = await read();
    expect(stage(l, 'approved')).toMatchObject({ done: true, detail: `Towing regrind, revision 1 · ${option.checksum}, by Test Owner` });

    const grinding = await makeShop(t, 'grinding', 'Lifecycle grinding');
    const grinder = await memberWithRole(t, grinding.shopId, 'grinder');
    const sheet = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    const issued = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: sheet.version, grinderShopId: grinding.shopId });
    expect(issued.status).toBe(201);
    let order = issued.body.order;
    l = await read();
    expect(stage(l, 'ordered')).toMatchObject({ done: true, detail: `Revision 1 · ${option.checksum} to Lifecycle grinding` });
    // The order and the approval name the same checksum.
    expect(order.checksum).toBe(option.checksum);

    const move = async (who: typeof grinder, body: Record<string, unknown>) => {
      const res = await who.post(`/api/orders/${order.id}/move`, { version: order.version, ...body });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      order = res.body.order;
    };
    await move(grinder, { to: 'quoted', quote: { priceCents: 30_000, leadTimeDays: 5 } });
    await move(grinder, { to: 'grinding' });
    expect(doneKeys(await read())).not.toContain('shipped');
    await move(grinder, { to: 'shipped', shipping: { carrier: 'Test freight', tracking: 'T-1' } });
    await move(s.builder, { to: 'received' });
    await move(s.builder, { to: 'installed' });
    l = await read();
    expect(doneKeys(l)).toEqual(['findings', 'offered', 'approved', 'ordered', 'shipped', 'received']);
    // Installed but not degreed: the stage waits for the degree-wheel reading and says so.
    expect(stage(l, 'installed')).toMatchObject({ done: false, detail: 'Installed; the cam is not degreed yet' });

    const degree = await s.builder.post(`/api/jobs/${s.jobId}/measurements`, {
      kind: 'degree',
      data: { stopBefore: 20, stopAfter: 24, checkingLift: 0.05, openingAngle: 10, closingAngle: 210 },
    });
    expect(degree.status).toBe(201);
    l = await read();
    expect(stage(l, 'installed').done).toBe(true);
    // A degree reading is not a teardown measurement.
    expect(stage(l, 'measured').done).toBe(false);

    const run = await s.builder.post(`/api/sheets/${s.sheet.id}/fit-checks`);
    expect(run.status).toBe(201);
    l = await read();
    expect(stage(l, 'checked')).toMatchObject({ done: true, at: run.body.run.createdAt });
    expect(stage(l, 'checked').detail).toContain(run.body.run.summary.label);

    const job = (await s.builder.get(`/api/jobs/${s.jobId}`)).body.job;
    expect((await s.builder.patch(`/api/jobs/${s.jobId}`, { version: job.version, status: 'delivered' })).status).toBe(200);
    l = await read();
    expect(stage(l, 'returned').done).toBe(true);
    expect(l.next).toBe('measured');
  });

  it('counts a request for a quote as no firm order, and a builder’s confirmation with its reason as one', async () => {
    const s = await sharedJob('Lifecycle quote shop');
    const grinding = await makeShop(t, 'grinding', 'Lifecycle quote grinding');
    const sheet = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    const issued = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: sheet.version, grinderShopId: grinding.shopId });
    expect(issued.status).toBe(201);
    const l = (await s.builder.get(`/api/jobs/${s.jobId}/lifecycle`)).body.lifecycle as Lifecycle;
    expect(l.stages.find((x) => x.key === 'ordered')).toMatchObject({ done: false, detail: '1 order out for a quote, none firm yet' });
    const reason = 'Fleet account: signed off by phone';
    expect((await s.builder.post(`/api/orders/${issued.body.order.id}/confirm`, { version: 1, reason })).status).toBe(200);
    const after = (await s.builder.get(`/api/jobs/${s.jobId}/lifecycle`)).body.lifecycle as Lifecycle;
    expect(after.stages.find((x) => x.key === 'ordered')).toMatchObject({ done: true, detail: expect.stringContaining(issued.body.order.checksum) });
    expect(after.stages.find((x) => x.key === 'approved')?.detail).toContain(reason);
  });

  it('is 404 for another shop’s job', async () => {
    const a = await sharedJob('Lifecycle A');
    const b = await sharedJob('Lifecycle B');
    expect((await b.builder.get(`/api/jobs/${a.jobId}/lifecycle`)).status).toBe(404);
  });
});
