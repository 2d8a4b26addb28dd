import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { createTestApp, makeJobBody, makeProfileBody, makeProfileSpec, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('profile library', () => {
  it('lets a builder create, list, read, edit and delete a library profile', async () => {
    const { founder } = await makeShop(t, 'repair', 'Library shop');
    const created = await founder.post('/api/profiles', makeProfileBody({ label: 'Towing' }));
    expect(created.status).toBe(201);
    const profile = created.body.profile;
    expect(profile).toMatchObject({
      jobId: null,
      sourceProfileId: null,
      label: 'Towing',
      coreNotes: 'Test core',
      spec: makeProfileSpec(),
      version: 1,
    });
    await founder.post('/api/profiles', makeProfileBody({ label: 'Stock spec' }));

    const list = await founder.get('/api/profiles');
    expect(list.body.profiles.map((p: { label: string }) => p.label)).toEqual(['Stock spec', 'Towing']);
    expect((await founder.get(`/api/profiles/${profile.id}`)).body.profile).toEqual(profile);

    const spec = makeProfileSpec({ lsa: 110 });
    const edited = await founder.patch(`/api/profiles/${profile.id}`, { version: 1, label: 'Towing, tighter LSA', spec });
    expect(edited.status).toBe(200);
    expect(edited.body.profile).toMatchObject({ label: 'Towing, tighter LSA', coreNotes: 'Test core', version: 2, spec: { lsa: 110 } });

    const removed = await founder.delete(`/api/profiles/${profile.id}`);
    expect(removed.status).toBe(204);
    expect((await founder.get(`/api/profiles/${profile.id}`)).status).toBe(404);
    expect((await founder.get('/api/profiles')).body.profiles.map((p: { label: string }) => p.label)).toEqual(['Stock spec']);

    const actions = t.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.entityId, profile.id))
      .all()
      .map((r) => r.action);
    expect(actions).toEqual(['create', 'update', 'delete']);
  });

  it('answers 409 to an edit from a stale version and keeps the first edit', async () => {
    const { founder } = await makeShop(t);
    const { body } = await founder.post('/api/profiles', makeProfileBody());
    const first = await founder.patch(`/api/profiles/${body.profile.id}`, { version: 1, coreNotes: 'First writer' });
    expect(first.status).toBe(200);
    const second = await founder.patch(`/api/profiles/${body.profile.id}`, { version: 1, coreNotes: 'Second writer' });
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/reload/i);
    expect((await founder.get(`/api/profiles/${body.profile.id}`)).body.profile).toMatchObject({
      coreNotes: 'First writer',
      version: 2,
    });
  });

  it('answers a bad profile with a 400 that names each field', async () => {
    const { founder } = await makeShop(t);
    const spec = makeProfileSpec({
      intake: { ...makeProfileSpec().intake, duration050: 400 },
      exhaust: { ...makeProfileSpec().exhaust, advertisedDuration: 200 },
    });
    const res = await founder.post('/api/profiles', { label: '', spec });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      label: 'Name the profile',
      'spec.intake.duration050': expect.stringMatching(/between 120 and 330/),
      'spec.exhaust.advertisedDuration': expect.stringMatching(/longer than the duration at 0.050/),
    });
    const patch = await founder.patch('/api/profiles/anything', { spec: { lsa: 'wide' } });
    expect(patch.status).toBe(400);
    expect(patch.body.error.fields).toHaveProperty('version');
    expect(patch.body.error.fields).toHaveProperty('spec.lsa');
    expect(patch.body.error.fields).toHaveProperty('spec.intake');
    expect((await founder.get('/api/profiles')).body.profiles).toEqual([]);
  });
});

describe('profiles on a job', () => {
  it('copies a library profile into a job, and edits the copy without touching the original', async () => {
    const { founder } = await makeShop(t, 'repair', 'Copy shop');
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const library = (await founder.post('/api/profiles', makeProfileBody({ label: 'Stock spec', coreNotes: 'Library core' }))).body.profile;

    const copied = await founder.post(`/api/jobs/${job.id}/profiles`, { fromProfileId: library.id });
    expect(copied.status).toBe(201);
    expect(copied.body.profile).toMatchObject({
      jobId: job.id,
      sourceProfileId: library.id,
      label: 'Stock spec',
      coreNotes: 'Library core',
      spec: library.spec,
      version: 1,
    });
    expect(copied.body.profile.id).not.toBe(library.id);

    const written = await founder.post(`/api/jobs/${job.id}/profiles`, makeProfileBody({ label: 'Written for this job' }));
    expect(written.status).toBe(201);
    expect(written.body.profile).toMatchObject({ jobId: job.id, sourceProfileId: null, label: 'Written for this job' });

    const listed = await founder.get(`/api/jobs/${job.id}/profiles`);
    expect(listed.body.profiles.map((p: { id: string }) => p.id)).toEqual([copied.body.profile.id, written.body.profile.id]);
    // Job profiles stay out of the library.
    expect((await founder.get('/api/profiles')).body.profiles.map((p: { id: string }) => p.id)).toEqual([library.id]);

    const edited = await founder.patch(`/api/profiles/${copied.body.profile.id}`, {
      version: 1,
      spec: makeProfileSpec({ icl: 106 }),
    });
    expect(edited.status).toBe(200);
    expect(edited.body.profile).toMatchObject({ jobId: job.id, version: 2, spec: { icl: 106 } });
    expect((await founder.get(`/api/profiles/${library.id}`)).body.profile).toEqual(library);
  });

  it('refuses to delete a job profile and to copy from anything but a library profile of the same shop', async () => {
    const { founder } = await makeShop(t);
    const other = await makeShop(t, 'repair', 'Other shop');
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const onJob = (await founder.post(`/api/jobs/${job.id}/profiles`, makeProfileBody())).body.profile;

    const del = await founder.delete(`/api/profiles/${onJob.id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toMatch(/library/);
    expect((await founder.get(`/api/profiles/${onJob.id}`)).status).toBe(200);

    expect((await founder.post(`/api/jobs/${job.id}/profiles`, { fromProfileId: onJob.id })).status).toBe(404);
    const foreign = (await other.founder.post('/api/profiles', makeProfileBody())).body.profile;
    expect((await founder.post(`/api/jobs/${job.id}/profiles`, { fromProfileId: foreign.id })).status).toBe(404);

    const bad = await founder.post(`/api/jobs/${job.id}/profiles`, { fromProfileId: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ fromProfileId: 'Choose a profile to copy' });
    expect((await founder.get(`/api/jobs/${job.id}/profiles`)).body.profiles).toHaveLength(1);
  });

  it("gives a member of another shop 404 for the shop's profiles and jobs", async () => {
    const a = await makeShop(t, 'repair', 'Profiles A');
    const b = await makeShop(t, 'repair', 'Profiles B');
    const job = (await b.founder.post('/api/jobs', makeJobBody())).body.job;
    const lib = (await b.founder.post('/api/profiles', makeProfileBody())).body.profile;
    const onJob = (await b.founder.post(`/api/jobs/${job.id}/profiles`, makeProfileBody())).body.profile;

    expect((await a.founder.get('/api/profiles')).body.profiles).toEqual([]);
    for (const id of [lib.id, onJob.id]) {
      expect((await a.founder.get(`/api/profiles/${id}`)).status).toBe(404);
      expect((await a.founder.patch(`/api/profiles/${id}`, { version: 1, label: 'Taken' })).status).toBe(404);
    }
    expect((await a.founder.delete(`/api/profiles/${lib.id}`)).status).toBe(404);
    expect((await a.founder.get(`/api/jobs/${job.id}/profiles`)).status).toBe(404);
    expect((await a.founder.post(`/api/jobs/${job.id}/profiles`, makeProfileBody())).status).toBe(404);
    expect((await b.founder.get(`/api/profiles/${lib.id}`)).body.profile).toEqual(lib);
    expect((await b.founder.get(`/api/jobs/${job.id}/profiles`)).body.profiles).toHaveLength(1);
  });

  it('lets a tech read profiles but not write them', async () => {
    const { shopId, founder } = await makeShop(t);
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const lib = (await founder.post('/api/profiles', makeProfileBody())).body.profile;
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get('/api/profiles')).body.profiles).toHaveLength(1);
    expect((await tech.get(`/api/profiles/${lib.id}`)).status).toBe(200);
    expect((await tech.get(`/api/jobs/${job.id}/profiles`)).status).toBe(200);
    expect((await tech.post('/api/profiles', makeProfileBody())).status).toBe(403);
    expect((await tech.patch(`/api/profiles/${lib.id}`, { version: 1, label: 'x' })).status).toBe(403);
    expect((await tech.delete(`/api/profiles/${lib.id}`)).status).toBe(403);
    expect((await tech.post(`/api/jobs/${job.id}/profiles`, { fromProfileId: lib.id })).status).toBe(403);
    expect((await founder.get(`/api/profiles/${lib.id}`)).body.profile).toEqual(lib);
  });

  it.each(['customer', 'grinder'] as const)('gives a %s 403 on profiles', async (role) => {
    const { shopId, founder } = await makeShop(t);
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const lib = (await founder.post('/api/profiles', makeProfileBody())).body.profile;
    const person = await memberWithRole(t, shopId, role);
    expect((await person.get('/api/profiles')).status).toBe(403);
    expect((await person.get(`/api/profiles/${lib.id}`)).status).toBe(403);
    expect((await person.get(`/api/jobs/${job.id}/profiles`)).status).toBe(403);
    expect((await person.post('/api/profiles', makeProfileBody())).status).toBe(403);
  });
});
