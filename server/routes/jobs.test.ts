import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createTestApp, makeJobBody, makeShop, memberWithRole, signUp, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('sign-up and sign-in', () => {
  it('signs up, signs out, and signs back in with the same password', async () => {
    const person = await signUp(t, 'Returning Person');
    expect((await person.get('/api/me')).body.user.email).toBe(person.email);
    await person.post('/api/auth/sign-out');
    expect((await person.get('/api/me')).status).toBe(401);
    const wrong = await person.post('/api/auth/sign-in/email', { email: person.email, password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    const right = await person.post('/api/auth/sign-in/email', { email: person.email, password: 'correct-horse-9' });
    expect(right.status).toBe(200);
    expect((await person.get('/api/me')).status).toBe(200);
  });

  it('opens a new session in the first shop the person belongs to', async () => {
    const { founder } = await makeShop(t, 'repair', 'Session shop');
    await founder.post('/api/auth/sign-out');
    await founder.post('/api/auth/sign-in/email', { email: founder.email, password: 'correct-horse-9' });
    const me = await founder.get('/api/me');
    expect(me.body.activeShop).toMatchObject({ name: 'Session shop', kind: 'repair', role: 'builder' });
  });

  it('answers 401 to jobs when nobody is signed in', async () => {
    const res = await fetch(`${t.url}/api/jobs`);
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: { code: 'unauthenticated' } });
  });
});

describe('jobs', () => {
  it('lets a builder create, list, read and edit a job', async () => {
    const { founder } = await makeShop(t);
    const created = await founder.post('/api/jobs', makeJobBody());
    expect(created.status).toBe(201);
    expect(created.body.job).toMatchObject({ vehicle: makeJobBody().vehicle, mileage: 161000, status: 'intake', version: 1 });
    const list = await founder.get('/api/jobs');
    expect(list.body.jobs.map((j: { id: string }) => j.id)).toEqual([created.body.job.id]);
    const edited = await founder.patch(`/api/jobs/${created.body.job.id}`, {
      version: 1,
      findings: 'Cylinder 3 exhaust lifter seized',
      status: 'teardown',
    });
    expect(edited.status).toBe(200);
    expect(edited.body.job).toMatchObject({ findings: 'Cylinder 3 exhaust lifter seized', status: 'teardown', version: 2 });
    expect((await founder.get(`/api/jobs/${created.body.job.id}`)).body.job.version).toBe(2);
  });

  it('answers 409 to an edit made from a stale version, and keeps the first edit', async () => {
    const { founder } = await makeShop(t);
    const { body } = await founder.post('/api/jobs', makeJobBody());
    const first = await founder.patch(`/api/jobs/${body.job.id}`, { version: 1, complaint: 'First writer' });
    expect(first.status).toBe(200);
    const second = await founder.patch(`/api/jobs/${body.job.id}`, { version: 1, complaint: 'Second writer' });
    expect(second.status).toBe(409);
    expect((await founder.get(`/api/jobs/${body.job.id}`)).body.job.complaint).toBe('First writer');
  });

  it("gives a member of shop A a 404 for shop B's job", async () => {
    const a = await makeShop(t, 'repair', 'Shop A');
    const b = await makeShop(t, 'repair', 'Shop B');
    const { body } = await b.founder.post('/api/jobs', makeJobBody());
    expect((await a.founder.get(`/api/jobs/${body.job.id}`)).status).toBe(404);
    expect((await a.founder.patch(`/api/jobs/${body.job.id}`, { version: 1, complaint: 'x' })).status).toBe(404);
    expect((await a.founder.get('/api/jobs')).body.jobs).toEqual([]);
  });

  it('lets a tech read but not create or edit', async () => {
    const { shopId, founder } = await makeShop(t);
    const { body } = await founder.post('/api/jobs', makeJobBody());
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get('/api/jobs')).status).toBe(200);
    expect((await tech.get(`/api/jobs/${body.job.id}`)).status).toBe(200);
    expect((await tech.post('/api/jobs', makeJobBody())).status).toBe(403);
    expect((await tech.patch(`/api/jobs/${body.job.id}`, { version: 1, complaint: 'x' })).status).toBe(403);
  });

  it.each(['customer', 'grinder'] as const)('gives a %s of a repair shop 403 on jobs', async (role) => {
    const { shopId, founder } = await makeShop(t);
    const { body } = await founder.post('/api/jobs', makeJobBody());
    const person = await memberWithRole(t, shopId, role);
    const list = await person.get('/api/jobs');
    expect(list.status).toBe(403);
    expect(list.body).toMatchObject({ error: { code: 'forbidden' } });
    expect((await person.get(`/api/jobs/${body.job.id}`)).status).toBe(403);
  });

  it('answers a bad body with a 400 that names each field', async () => {
    const { founder } = await makeShop(t);
    const res = await founder.post('/api/jobs', { vehicle: '', customerName: 42, mileage: -5, color: 'red' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['color', 'customerName', 'mileage', 'vehicle']);
    expect(res.body.error.fields.mileage).toMatch(/negative/);
    const patch = await founder.patch('/api/jobs/whatever', { status: 'flying' });
    expect(patch.status).toBe(400);
    expect(Object.keys(patch.body.error.fields).sort()).toEqual(['status', 'version']);
  });

  it('answers malformed JSON with a 400', async () => {
    const { founder } = await makeShop(t);
    const res = await founder.request('POST', '/api/jobs', '{"vehicle":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });
});

describe('shops', () => {
  it('switches the active shop only to a shop the person belongs to', async () => {
    const a = await makeShop(t, 'repair', 'Switch A');
    const b = await makeShop(t, 'grinding', 'Switch B');
    expect((await a.founder.post('/api/me/active-shop', { shopId: b.shopId })).status).toBe(403);
    const res = await a.founder.post('/api/me/active-shop', {});
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('shopId');
  });

  it('makes the founder of a grinding shop its grinder, who cannot reach jobs', async () => {
    const { founder } = await makeShop(t, 'grinding', 'Grind shop');
    const me = await founder.get('/api/me');
    expect(me.body.activeShop).toMatchObject({ kind: 'grinding', role: 'grinder' });
    expect((await founder.get('/api/jobs')).status).toBe(403);
  });
});
