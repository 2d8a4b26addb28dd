import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { createTestApp, makeEngineSpec, makeJobBody, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function shopWithJob(name = 'Engine shop') {
  const shop = await makeShop(t, 'repair', name);
  const job = await shop.founder.post('/api/jobs', makeJobBody());
  return { ...shop, jobId: job.body.job.id as string };
}

describe('engine on a job', () => {
  it('starts empty, is created with version 0, then read and edited', async () => {
    const { founder, jobId } = await shopWithJob();
    const empty = await founder.get(`/api/jobs/${jobId}/engine`);
    expect(empty.status).toBe(200);
    expect(empty.body).toEqual({ engine: null });

    const created = await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() });
    expect(created.status).toBe(201);
    expect(created.body.engine).toMatchObject({ jobId, version: 1, engine: makeEngineSpec() });
    expect(typeof created.body.engine.updatedAt).toBe('string');

    const read = await founder.get(`/api/jobs/${jobId}/engine`);
    expect(read.body.engine).toEqual(created.body.engine);

    const edited = await founder.put(`/api/jobs/${jobId}/engine`, {
      version: 1,
      engine: makeEngineSpec({ chamberCc: 70, firingOrder: '' }),
    });
    expect(edited.status).toBe(200);
    expect(edited.body.engine).toMatchObject({ version: 2, engine: { chamberCc: 70, firingOrder: '' } });
    expect((await founder.get(`/api/jobs/${jobId}/engine`)).body.engine.engine.chamberCc).toBe(70);

    const log = t.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(and(eq(schema.auditLog.entity, 'engine'), eq(schema.auditLog.entityId, jobId)))
      .all();
    expect(log.map((r) => r.action)).toEqual(['create', 'update']);
  });

  it('answers 409 to a stale version and keeps the first save', async () => {
    const { founder, jobId } = await shopWithJob();
    await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() });
    const first = await founder.put(`/api/jobs/${jobId}/engine`, { version: 1, engine: makeEngineSpec({ bore: 4.04 }) });
    expect(first.status).toBe(200);
    const second = await founder.put(`/api/jobs/${jobId}/engine`, { version: 1, engine: makeEngineSpec({ bore: 4.06 }) });
    expect(second.status).toBe(409);
    expect(second.body.error).toMatchObject({ code: 'conflict' });
    expect(second.body.error.message).toMatch(/reload/i);
    // A second "create" from a form opened before the engine existed is stale as well.
    const again = await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec({ bore: 4.08 }) });
    expect(again.status).toBe(409);
    expect((await founder.get(`/api/jobs/${jobId}/engine`)).body.engine).toMatchObject({ version: 2, engine: { bore: 4.04 } });
  });

  it('answers 409 when an edit names a version but no engine was ever saved', async () => {
    const { founder, jobId } = await shopWithJob();
    const res = await founder.put(`/api/jobs/${jobId}/engine`, { version: 3, engine: makeEngineSpec() });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/reload/i);
    expect((await founder.get(`/api/jobs/${jobId}/engine`)).body.engine).toBeNull();
  });

  it('answers a bad engine with a 400 that names each field', async () => {
    const { founder, jobId } = await shopWithJob();
    const res = await founder.put(`/api/jobs/${jobId}/engine`, {
      version: 0,
      engine: makeEngineSpec({
        bore: 12,
        lifterType: 'rubber',
        spring: { ...makeEngineSpec().spring, coilBindHeight: 1.9 },
        turbo: true,
      }),
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.fields).toMatchObject({
      'engine.bore': expect.stringMatching(/between 2 and 6/),
      'engine.lifterType': expect.stringMatching(/hydraulic-roller/),
      'engine.spring.coilBindHeight': expect.stringMatching(/below the installed height/),
      'engine.turbo': 'Unknown field',
    });
    const noVersion = await founder.put(`/api/jobs/${jobId}/engine`, { engine: makeEngineSpec() });
    expect(Object.keys(noVersion.body.error.fields)).toEqual(['version']);
    expect((await founder.get(`/api/jobs/${jobId}/engine`)).body.engine).toBeNull();
  });

  it("gives another shop's builder a 404 for the job's engine", async () => {
    const a = await shopWithJob('Engine shop A');
    const b = await shopWithJob('Engine shop B');
    await b.founder.put(`/api/jobs/${b.jobId}/engine`, { version: 0, engine: makeEngineSpec() });
    expect((await a.founder.get(`/api/jobs/${b.jobId}/engine`)).status).toBe(404);
    const write = await a.founder.put(`/api/jobs/${b.jobId}/engine`, { version: 1, engine: makeEngineSpec({ bore: 4.1 }) });
    expect(write.status).toBe(404);
    expect((await b.founder.get(`/api/jobs/${b.jobId}/engine`)).body.engine.engine.bore).toBe(4.03);
    expect((await a.founder.get('/api/jobs/no-such-job/engine')).status).toBe(404);
  });

  it('lets a tech read the engine but not save it', async () => {
    const { shopId, founder, jobId } = await shopWithJob();
    await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() });
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get(`/api/jobs/${jobId}/engine`)).body.engine.version).toBe(1);
    const write = await tech.put(`/api/jobs/${jobId}/engine`, { version: 1, engine: makeEngineSpec({ bore: 4.1 }) });
    expect(write.status).toBe(403);
    expect(write.body.error.code).toBe('forbidden');
    expect((await founder.get(`/api/jobs/${jobId}/engine`)).body.engine.version).toBe(1);
  });

  it.each(['customer', 'grinder'] as const)('gives a %s 403 on the engine', async (role) => {
    const { shopId, founder, jobId } = await shopWithJob();
    await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() });
    const person = await memberWithRole(t, shopId, role);
    expect((await person.get(`/api/jobs/${jobId}/engine`)).status).toBe(403);
    expect((await person.put(`/api/jobs/${jobId}/engine`, { version: 1, engine: makeEngineSpec() })).status).toBe(403);
  });

  it('answers 401 when nobody is signed in', async () => {
    const res = await fetch(`${t.url}/api/jobs/any/engine`);
    expect(res.status).toBe(401);
  });
});
