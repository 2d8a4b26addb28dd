import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { demoAccounts, demoJobId, demoPassword, demoSheetId, demoStockSheetId, seedDemo } from '@/db/seed';
import { analyzeRecords, revisionResults } from '@/shared/analysis';
import { engineSchema, type EngineSpec } from '@/shared/engine';
import { profileSpecSchema, type ProfileSpec } from '@/shared/profile';
import {
  Client,
  createTestApp,
  makeEngineSpec,
  makeJobBody,
  makeJobWithEngine,
  makeProfileBody,
  makeProfileSpec,
  makeShop,
  memberWithRole,
  type TestApp,
} from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** What calc says about these values, through JSON like the API answer. */
function expectedResults(engine: unknown, spec: unknown) {
  const e: EngineSpec = engineSchema.parse(engine);
  const s: ProfileSpec = profileSpecSchema.parse(spec);
  return JSON.parse(JSON.stringify(revisionResults(analyzeRecords(e, s))));
}

/** Marks a revision issued straight in the database (issuing to a grinder comes with its own screens). */
function issue(revisionId: string) {
  t.db.$client.prepare(`update sheet_revisions set state = 'issued', issued_at = ? where id = ?`).run(Date.now(), revisionId);
}

function rawRevision(id: string) {
  return t.db.$client.prepare('select * from sheet_revisions where id = ?').get(id);
}

describe('spec sheets', () => {
  it('starts a sheet from a job profile and the engine, with calc results in revision 1', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const res = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Regrind for cylinder 3 failure', profileId, note: 'First draft' });
    expect(res.status).toBe(201);
    const sheet = res.body.sheet;
    expect(sheet).toMatchObject({ jobId, title: 'Regrind for cylinder 3 failure', version: 1 });
    expect(sheet.revisions).toHaveLength(1);
    // The history is the revisions without their results; the latest comes in full as `current`.
    const { results: _results, ...summary } = sheet.current;
    expect(sheet.revisions[0]).toEqual(summary);
    expect(sheet.current).toMatchObject({
      number: 1,
      state: 'draft',
      label: makeProfileBody().label,
      spec: makeProfileSpec(),
      engine: makeEngineSpec(),
      note: 'First draft',
      issuedAt: null,
    });
    expect(sheet.current.results).toEqual(expectedResults(makeEngineSpec(), makeProfileSpec()));
    expect(sheet.current.results.events050.overlap).toBeTypeOf('number');

    const read = await founder.get(`/api/sheets/${sheet.id}`);
    expect(read.body.sheet).toEqual(sheet);
    const list = await founder.get(`/api/jobs/${jobId}/sheets`);
    expect(list.body.sheets).toHaveLength(1);
    expect(list.body.sheets[0]).toMatchObject({ id: sheet.id, current: sheet.current });
    expect(list.body.sheets[0]).not.toHaveProperty('revisions');
  });

  it('edits a draft revision in place, recomputes its results and bumps the sheet version', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    const spec = makeProfileSpec({ intake: { ...makeProfileSpec().intake, duration050: 216 } });
    const saved = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, spec, note: 'Longer intake' });
    expect(saved.status).toBe(200);
    expect(saved.body.sheet.version).toBe(2);
    expect(saved.body.sheet.revisions).toHaveLength(1);
    expect(saved.body.sheet.current).toMatchObject({ id: sheet.current.id, number: 1, state: 'draft', spec, note: 'Longer intake' });
    expect(saved.body.sheet.current.results).toEqual(expectedResults(makeEngineSpec(), spec));
    expect(saved.body.sheet.current.results.events050.overlap).toBeGreaterThan(sheet.current.results.events050.overlap);

    const actions = t.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.entityId, sheet.id))
      .all()
      .map((r) => r.action);
    expect(actions).toEqual(['create', 'update']);
  });

  it('answers 409 to a save from a stale sheet version and keeps the first save', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    expect((await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'First writer' })).status).toBe(200);
    const stale = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'Second writer' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'conflict', message: expect.stringMatching(/reload/i) });
    const now = (await founder.get(`/api/sheets/${sheet.id}`)).body.sheet;
    expect(now).toMatchObject({ version: 2, current: { note: 'First writer' } });
    expect(now.revisions).toHaveLength(1);
  });

  it('never changes an issued revision: a save writes revision 2 and leaves revision 1 byte for byte', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId, note: 'As sent' })).body.sheet;
    const firstId = sheet.current.id as string;
    issue(firstId);
    const before = rawRevision(firstId);

    const spec = makeProfileSpec({ icl: 106 });
    const saved = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, spec, label: 'Towing, advanced' });
    expect(saved.status).toBe(200);
    const { revisions, current, version } = saved.body.sheet;
    expect(version).toBe(2);
    expect(revisions.map((r: { number: number; state: string }) => [r.number, r.state])).toEqual([
      [1, 'issued'],
      [2, 'draft'],
    ]);
    // The note belonged to revision 1: the next revision starts without it.
    expect(current).toMatchObject({ number: 2, state: 'draft', spec, label: 'Towing, advanced', note: '', issuedAt: null });
    expect(current.id).not.toBe(firstId);
    expect(current.results).toEqual(expectedResults(makeEngineSpec(), spec));
    expect(rawRevision(firstId)).toEqual(before);
    expect(revisions[0].spec).toEqual(makeProfileSpec());

    // The new draft is edited in place until it is issued too.
    const again = await founder.patch(`/api/sheets/${sheet.id}`, { version: 2, note: 'Second thoughts' });
    expect(again.body.sheet.revisions).toHaveLength(2);
    expect(again.body.sheet.current).toMatchObject({ id: current.id, number: 2, note: 'Second thoughts', spec });
    expect(rawRevision(firstId)).toEqual(before);

    const actions = t.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.entityId, sheet.id))
      .all()
      .map((r) => r.action);
    expect(actions).toEqual(['create', 'revise', 'update']);
  });

  it('keeps a draft as history when the builder asks for a new revision', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    const before = rawRevision(sheet.current.id);
    const saved = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, newRevision: true, note: 'Option B' });
    expect(saved.body.sheet.revisions.map((r: { number: number; state: string }) => [r.number, r.state])).toEqual([
      [1, 'draft'],
      [2, 'draft'],
    ]);
    expect(saved.body.sheet.current).toMatchObject({ number: 2, note: 'Option B' });
    expect(rawRevision(sheet.current.id)).toEqual(before);
  });

  it("keeps the engine snapshot until the builder asks to re-take it from the job's engine", async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    const newer = makeEngineSpec({ chamberCc: 64 });
    expect((await founder.put(`/api/jobs/${jobId}/engine`, { version: 1, engine: newer })).status).toBe(200);

    const kept = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'Note only' });
    expect(kept.body.sheet.current.engine).toEqual(makeEngineSpec());
    const refreshed = await founder.patch(`/api/sheets/${sheet.id}`, { version: 2, refreshEngine: true });
    expect(refreshed.body.sheet.current.engine).toEqual(newer);
    expect(refreshed.body.sheet.current.results).toEqual(expectedResults(newer, makeProfileSpec()));
    expect(refreshed.body.sheet.current.results.staticCompression).toBeGreaterThan(sheet.current.results.staticCompression);
  });

  it('needs the job engine and one of the job profiles to start a sheet', async () => {
    const { founder } = await makeShop(t);
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const onJob = (await founder.post(`/api/jobs/${job.id}/profiles`, makeProfileBody())).body.profile;
    const noEngine = await founder.post(`/api/jobs/${job.id}/sheets`, { title: 'Sheet', profileId: onJob.id });
    expect(noEngine.status).toBe(409);
    expect(noEngine.body.error).toMatchObject({ code: 'engine_missing', message: expect.stringMatching(/engine/) });

    await founder.put(`/api/jobs/${job.id}/engine`, { version: 0, engine: makeEngineSpec() });
    const library = (await founder.post('/api/profiles', makeProfileBody())).body.profile;
    const otherJob = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const elsewhere = (await founder.post(`/api/jobs/${otherJob.id}/profiles`, makeProfileBody())).body.profile;
    for (const profileId of [library.id, elsewhere.id, 'no-such-profile']) {
      const res = await founder.post(`/api/jobs/${job.id}/sheets`, { title: 'Sheet', profileId });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ profileId: "Choose one of this job's profiles" });
    }
    expect((await founder.get(`/api/jobs/${job.id}/sheets`)).body.sheets).toEqual([]);
  });

  it('answers bad values with a 400 that names the field, from zod and from calc', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;

    const empty = await founder.post(`/api/jobs/${jobId}/sheets`, { title: ' ', profileId });
    expect(empty.body.error.fields).toEqual({ title: 'Name the sheet' });

    const range = await founder.patch(`/api/sheets/${sheet.id}`, {
      version: 1,
      spec: makeProfileSpec({ intake: { ...makeProfileSpec().intake, duration050: 90 } }),
    });
    expect(range.status).toBe(400);
    expect(range.body.error.fields).toEqual({ 'spec.intake.duration050': expect.stringMatching(/between 120 and 330/) });

    // Lash with hydraulic lifters passes the form's ranges; calc rejects it and the answer names the sheet's field.
    const lash = await founder.patch(`/api/sheets/${sheet.id}`, {
      version: 1,
      spec: makeProfileSpec({ exhaust: { ...makeProfileSpec().exhaust, lash: 0.016 } }),
    });
    expect(lash.status).toBe(400);
    expect(lash.body.error.code).toBe('invalid_input');
    expect(Object.keys(lash.body.error.fields)).toEqual(['spec.exhaust.lash']);
    expect(lash.body.error.fields['spec.exhaust.lash']).toMatch(/hydraulic/);

    const now = (await founder.get(`/api/sheets/${sheet.id}`)).body.sheet;
    expect(now.version).toBe(1);
    expect(now.current).toEqual(sheet.current);
  });

  it("gives a member of another shop 404 for the shop's sheets", async () => {
    const a = await makeShop(t, 'repair', 'Sheets A');
    const b = await makeJobWithEngine(t, 'Sheets B');
    const sheet = (await b.founder.post(`/api/jobs/${b.jobId}/sheets`, { title: 'Sheet', profileId: b.profileId })).body.sheet;
    expect((await a.founder.get(`/api/sheets/${sheet.id}`)).status).toBe(404);
    expect((await a.founder.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'Taken' })).status).toBe(404);
    expect((await a.founder.get(`/api/jobs/${b.jobId}/sheets`)).status).toBe(404);
    expect((await a.founder.post(`/api/jobs/${b.jobId}/sheets`, { title: 'x', profileId: b.profileId })).status).toBe(404);
    expect((await a.founder.get(`/api/sheets/${sheet.id}/revisions/1`)).status).toBe(404);
    expect((await b.founder.get(`/api/sheets/${sheet.id}`)).body.sheet).toEqual(sheet);
  });

  it('lets a tech read sheets but not start or save one', async () => {
    const { shopId, founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get(`/api/sheets/${sheet.id}`)).body.sheet).toEqual(sheet);
    expect((await tech.get(`/api/jobs/${jobId}/sheets`)).body.sheets).toHaveLength(1);
    expect((await tech.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).status).toBe(403);
    const save = await tech.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'Tech edit' });
    expect(save.status).toBe(403);
    expect((await founder.get(`/api/sheets/${sheet.id}`)).body.sheet).toEqual(sheet);
  });

  it.each(['customer', 'grinder'] as const)('gives a %s 403 on sheets', async (role) => {
    const { shopId, founder, jobId, profileId } = await makeJobWithEngine(t);
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
    const person = await memberWithRole(t, shopId, role);
    expect((await person.get(`/api/sheets/${sheet.id}`)).status).toBe(403);
    expect((await person.get(`/api/jobs/${jobId}/sheets`)).status).toBe(403);
    expect((await person.patch(`/api/sheets/${sheet.id}`, { version: 1, note: 'x' })).status).toBe(403);
  });
});

describe('demo data through the API', () => {
  it('shows the demo builder the engine, both profiles and the draft sheets on the demo job', async () => {
    await seedDemo(t.db, t.app.auth);
    const builder = new Client(t.url);
    const email = demoAccounts.find((a) => a.role === 'builder')!.email;
    expect((await builder.post('/api/auth/sign-in/email', { email, password: demoPassword })).status).toBe(200);

    expect((await builder.get(`/api/jobs/${demoJobId}/engine`)).body.engine).toMatchObject({ version: 1, engine: { bore: 4.03 } });
    const onJob = (await builder.get(`/api/jobs/${demoJobId}/profiles`)).body.profiles;
    expect(onJob.map((p: { label: string }) => p.label).sort()).toEqual(['Stock-spec regrind (demo)', 'Towing regrind (demo)']);
    const library = (await builder.get('/api/profiles')).body.profiles;
    expect(onJob.map((p: { sourceProfileId: string }) => p.sourceProfileId).sort()).toEqual(library.map((p: { id: string }) => p.id).sort());

    const sheets = (await builder.get(`/api/jobs/${demoJobId}/sheets`)).body.sheets;
    // Most recently changed first: the towing sheet, then the stock-spec sheet.
    expect(sheets.map((s: { id: string }) => s.id)).toEqual([demoSheetId, demoStockSheetId]);
    const sheet = (await builder.get(`/api/sheets/${demoSheetId}`)).body.sheet;
    expect(sheet.current).toMatchObject({ number: 1, state: 'draft', label: 'Towing regrind (demo)' });
    const saved = await builder.patch(`/api/sheets/${demoSheetId}`, { version: sheet.version, newRevision: true, note: 'Demo revision 2' });
    expect(saved.status).toBe(200);
    expect(saved.body.sheet.revisions.map((r: { number: number }) => r.number)).toEqual([1, 2]);
  });
});

describe('one sheet per option, bound to its profile by id', () => {
  it('names its profile, refuses a second sheet for the same profile, and starts each other option its own sheet', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t, 'Options shop');
    const towing = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Towing', profileId })).body.sheet;
    expect(towing.profileId).toBe(profileId);

    const again = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Towing again', profileId });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'sheet_exists', message: expect.stringContaining('“Towing”') });

    // A second option whose label the first sheet's revision carries: it still gets a sheet of its own.
    const stock = (await founder.post(`/api/jobs/${jobId}/profiles`, makeProfileBody({ label: makeProfileBody().label, spec: makeProfileSpec({ icl: 110 }) })))
      .body.profile;
    const tried = makeProfileSpec({ icl: 109 });
    const created = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Stock', profileId: stock.id, spec: tried });
    expect(created.status).toBe(201);
    expect(created.body.sheet).toMatchObject({ profileId: stock.id, current: { number: 1, spec: tried } });
    expect(created.body.sheet.current.results).toEqual(expectedResults(makeEngineSpec(), tried));

    const sheets = (await founder.get(`/api/jobs/${jobId}/sheets`)).body.sheets as { id: string; profileId: string }[];
    expect(sheets.map((s) => [s.profileId, s.id]).sort()).toEqual(
      [
        [profileId, towing.id],
        [stock.id, created.body.sheet.id],
      ].sort(),
    );
    // The towing sheet is as it was: nothing was written into another option's sheet.
    expect((await founder.get(`/api/sheets/${towing.id}`)).body.sheet).toEqual(towing);
  });

  it('answers bad tried values on a new sheet with a 400 naming the spec field', async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t, 'Options bad values');
    const res = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Towing', profileId, spec: { ...makeProfileSpec(), icl: 300 } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['spec.icl']);
    expect((await founder.get(`/api/jobs/${jobId}/sheets`)).body.sheets).toEqual([]);
  });
});

describe('notes on revisions', () => {
  it("carries the profile's core notes on each revision as written, and starts each new revision without the previous note", async () => {
    const { founder, jobId, profileId } = await makeJobWithEngine(t, 'Notes shop');
    const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Towing', profileId, note: 'Rev 1 only' })).body.sheet;
    expect(sheet.current).toMatchObject({ note: 'Rev 1 only', coreNotes: makeProfileBody().coreNotes });
    issue(sheet.current.id);
    const issuedBefore = rawRevision(sheet.current.id);

    const profile = (await founder.get(`/api/profiles/${profileId}`)).body.profile;
    expect((await founder.patch(`/api/profiles/${profileId}`, { version: profile.version, coreNotes: 'Core is cracked at journal 2: new core' })).status).toBe(
      200,
    );
    const next = await founder.patch(`/api/sheets/${sheet.id}`, { version: 1, spec: makeProfileSpec({ icl: 107 }) });
    expect(next.status).toBe(200);
    expect(next.body.sheet.current).toMatchObject({ number: 2, note: '', coreNotes: 'Core is cracked at journal 2: new core' });
    // The issued revision keeps the core notes it went out with.
    expect(next.body.sheet.revisions[0]).toMatchObject({ note: 'Rev 1 only', coreNotes: makeProfileBody().coreNotes });
    expect(rawRevision(sheet.current.id)).toEqual(issuedBefore);

    // A draft asked to become a new revision leaves its note behind too.
    const noted = await founder.patch(`/api/sheets/${sheet.id}`, { version: 2, note: 'Rev 2 only' });
    const third = await founder.patch(`/api/sheets/${sheet.id}`, { version: noted.body.sheet.version, newRevision: true, spec: makeProfileSpec({ icl: 106 }) });
    expect(third.body.sheet.current).toMatchObject({ number: 3, note: '' });
    expect(third.body.sheet.revisions[1]).toMatchObject({ number: 2, note: 'Rev 2 only' });
  });

  describe('an earlier revision, fetched in full', () => {
    it('keeps the history light: each revision without results, any one of them in full by its number', async () => {
      const { founder, jobId, profileId } = await makeJobWithEngine(t);
      const created = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId, note: 'First' })).body.sheet;
      issue(created.current.id);
      const spec = makeProfileSpec({ icl: 110 });
      const saved = (await founder.patch(`/api/sheets/${created.id}`, { version: 1, spec })).body.sheet;
      issue(saved.current.id);

      const sheet = (await founder.get(`/api/sheets/${created.id}`)).body.sheet;
      expect(sheet.revisions.map((r: object) => 'results' in r)).toEqual([false, false]);
      expect(sheet.current.results).toEqual(expectedResults(makeEngineSpec(), spec));

      const first = await founder.get(`/api/sheets/${created.id}/revisions/1`);
      expect(first.status).toBe(200);
      expect(first.body.revision).toMatchObject({ id: created.current.id, number: 1, state: 'issued', note: 'First', spec: makeProfileSpec() });
      expect(first.body.revision.results).toEqual(expectedResults(makeEngineSpec(), makeProfileSpec()));
      // What supersedes it is said the same way as in the history.
      expect(first.body.revision.supersededBy).toEqual(sheet.revisions[0].supersededBy);
      expect(first.body.revision.supersededBy).toMatchObject({ number: 2 });
      const { results: _results, ...rest } = first.body.revision;
      expect(rest).toEqual(sheet.revisions[0]);

      const latest = await founder.get(`/api/sheets/${created.id}/revisions/2`);
      expect(latest.body.revision).toEqual(sheet.current);
    });

    it('answers 404 for a number the sheet does not have and 400 naming the number for one that is not a revision number', async () => {
      const { founder, jobId, profileId } = await makeJobWithEngine(t);
      const sheet = (await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Sheet', profileId })).body.sheet;
      const missing = await founder.get(`/api/sheets/${sheet.id}/revisions/2`);
      expect(missing.status).toBe(404);
      expect(missing.body.error.message).toBe('Revision not found');
      for (const bad of ['0', 'abc', '1.5', '-1']) {
        const res = await founder.get(`/api/sheets/${sheet.id}/revisions/${bad}`);
        expect(res.status).toBe(400);
        expect(res.body.error.fields).toHaveProperty('number');
      }
      expect((await founder.get(`/api/sheets/no-such-sheet/revisions/1`)).status).toBe(404);
    });
  });
});
