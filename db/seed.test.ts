import fs from 'node:fs';

import { asc, count, eq, isNull } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';

import { DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { createAuth } from '@/server/auth';
import { createMailer } from '@/server/mail';
import { resolveCheckLimits } from '@/calc/checks';
import { analyzeColumn } from '@/lib/compare-analysis';
import { latestMeasured } from '@/lib/compare-selection';
import { jobMeasurements, latestMeasurements } from '@/server/store/measurements';
import { jobProfiles } from '@/server/store/profiles';
import { loadShopLimits } from '@/server/store/shop-limits';
import { analyzeForJob, revisionResults } from '@/shared/analysis';
import { coreView } from '@/shared/fits-core';
import { jobCore } from '@/shared/job-core';
import { engineSchema } from '@/shared/engine';
import { defaultChecklistLabels } from '@/shared/measurements';
import { profileSpecSchema } from '@/shared/profile';
import { unitConverter } from '@/state/units';

import { demoLobeCsv, demoLobeIds, demoLobesFile } from './demo-lobes';
import { openDb, schema } from './index';
import { demoAccounts, demoJobId, demoShopLimits, demoSheetId, demoStockSheetId, seedDemo } from './seed';

describe('demo seed', () => {
  it('writes both shops, one person per role and the demo job, and adds nothing on a second run', async () => {
    const db = openDb(':memory:');
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) });
    await seedDemo(db, auth);
    await seedDemo(db, auth);
    expect(db.select({ n: count() }).from(schema.shops).get()?.n).toBe(2);
    expect(db.select({ n: count() }).from(schema.users).get()?.n).toBe(demoAccounts.length);
    const roles = db
      .select({ role: schema.memberships.role })
      .from(schema.memberships)
      .all()
      .map((r) => r.role);
    expect(roles.sort()).toEqual(['builder', 'customer', 'grinder', 'tech']);
    const job = db.select().from(schema.jobs).where(eq(schema.jobs.id, demoJobId)).get();
    expect(job?.mileage).toBe(161000);
    expect(job?.vehicle).toMatch(/demo/);
  });
});

describe('demo comparison data', () => {
  it('gives the demo job its engine, both demo profiles from the library, and a draft sheet for each, once', async () => {
    const db = openDb(':memory:');
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) });
    await seedDemo(db, auth);
    await seedDemo(db, auth);

    const engines = db.select().from(schema.engines).all();
    expect(engines).toHaveLength(1);
    const engine = engines[0]!;
    expect(engine.jobId).toBe(demoJobId);
    expect(engineSchema.parse(engine.spec)).toEqual(engine.spec);
    expect(engine.spec).toMatchObject({ bore: 4.03, stroke: 3.6, rodLength: 6, chamberCc: 68, cylinders: 8 });
    expect(engine.spec.firingOrder).toMatch(/^\d(-\d)+$/);

    const library = db.select().from(schema.camProfiles).where(isNull(schema.camProfiles.jobId)).orderBy(asc(schema.camProfiles.label)).all();
    expect(library.map((p) => p.label)).toEqual(['Stock-spec regrind (demo)', 'Towing regrind (demo)']);
    expect(library.map((p) => p.spec)).toEqual([profileSpecSchema.parse(DEMO_STOCK_REGRIND), profileSpecSchema.parse(DEMO_TOWING)]);
    for (const p of library) expect(p.coreNotes).toMatch(/^Demo data\./);

    const onJob = db.select().from(schema.camProfiles).where(eq(schema.camProfiles.jobId, demoJobId)).orderBy(asc(schema.camProfiles.label)).all();
    expect(onJob).toHaveLength(2);
    onJob.forEach((copy, i) => {
      expect(copy.sourceProfileId).toBe(library[i]!.id);
      expect({ label: copy.label, spec: copy.spec, coreNotes: copy.coreNotes }).toEqual({
        label: library[i]!.label,
        spec: library[i]!.spec,
        coreNotes: library[i]!.coreNotes,
      });
    });

    const sheets = db.select().from(schema.specSheets).orderBy(asc(schema.specSheets.id)).all();
    expect(sheets.map((s) => [s.id, s.jobId])).toEqual([
      [demoStockSheetId, demoJobId],
      [demoSheetId, demoJobId],
    ]);
    const revisions = db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.sheetId, demoSheetId)).all();
    expect(revisions).toHaveLength(1);
    const rev = revisions[0]!;
    expect(rev).toMatchObject({ number: 1, state: 'draft', label: 'Towing regrind (demo)', engine: engine.spec });
    expect(rev.spec).toEqual(library[1]!.spec);
    // Worked out against the job's core (its lobe table and stock base circle) and the shop's settings, as saving does.
    const job = jobCore({
      measured: latestMeasurements(db, 'demo-shop-juniper-flats', demoJobId),
      limits: resolveCheckLimits(demoShopLimits),
      lifterType: engine.spec.lifterType,
    });
    const worked = analyzeForJob(engine.spec, rev.spec, job, demoShopLimits);
    expect(rev.results).toEqual(JSON.parse(JSON.stringify(revisionResults(worked.analysis, worked.job))));
    // The damaged cylinder 3 exhaust lobe (0.012 in) sets the cleanup cut; the towing lobes stand outside the old ones at that cut.
    const f = rev.results.feasibility!;
    expect(f.coreFrom).toMatch(/3E 0\.012 in/);
    expect(f.cut).toBeCloseTo(1.25 - 1.2, 9);
    expect(f.cleanup?.limitingLobe).toBe('exhaust');
    expect(f.checks.find((c) => c.id === 'finishingStock' && c.subject === 'intake')?.status).toBe('fail');
  });
});

describe('one answer to "fits the core?" on the demo job', () => {
  it("the compare screen's path (listed measurements, the shop's limits, the job's profile) gives each stored demo sheet's headline and margins", async () => {
    const db = openDb(':memory:');
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) });
    await seedDemo(db, auth);
    const shopId = 'demo-shop-juniper-flats';
    const engine = db.select().from(schema.engines).where(eq(schema.engines.jobId, demoJobId)).get()!.spec;
    const limits = loadShopLimits(db, shopId).limits;
    // What the client holds: the job's measurement list and the shop's limits, as the API sends them.
    const job = jobCore({
      measured: latestMeasured(jobMeasurements(db, shopId, demoJobId)),
      limits: resolveCheckLimits(limits),
      lifterType: engine.lifterType,
    });
    for (const sheetId of [demoSheetId, demoStockSheetId]) {
      const rev = db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.sheetId, sheetId)).get()!;
      const profile = jobProfiles(db, shopId, demoJobId).find((p) => p.label === rev.label)!;
      const column = analyzeColumn(engine, profile, undefined, unitConverter(null, 'imperial', 'cc'), { job, limits });
      const stored = rev.results.feasibility!;
      expect(column.feasibility?.intake.envelope?.minMargin).toBe(stored.intake.envelope?.minMargin);
      expect(column.feasibility?.exhaust.envelope?.minAt).toBe(stored.exhaust.envelope?.minAt);
      expect(coreView(column.feasibility!).headline).toBe(coreView(stored).headline);
    }
  });
});

describe('demo measurements, checklist and lobe table', () => {
  it('gives the demo job its PTV baseline, springs, pushrod readings, lobe table and checklist once', async () => {
    const db = openDb(':memory:');
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) });
    await seedDemo(db, auth);
    await seedDemo(db, auth);
    const rows = db.select().from(schema.measurements).where(eq(schema.measurements.jobId, demoJobId)).all();
    expect(rows.map((r) => r.kind).sort()).toEqual(['lobes', 'ptv-baseline', 'pushrod', 'springs']);
    const lobes = rows.find((r) => r.kind === 'lobes')!.data as { lobes: { id: string }[] };
    expect(lobes.lobes.map((l) => l.id)).toEqual(demoLobeIds);
    for (const r of rows) expect(r.note).toMatch(/^Demo data\./);
    const ptv = rows.find((r) => r.kind === 'ptv-baseline')!.data as { intake: { crankAngle: number }[]; exhaust: { crankAngle: number }[] };
    expect(ptv.intake.map((x) => x.crankAngle)).toEqual([-10, 10]);
    expect(ptv.exhaust.map((x) => x.crankAngle)).toEqual([-10, 10]);
    const items = db.select().from(schema.checklistItems).where(eq(schema.checklistItems.jobId, demoJobId)).orderBy(asc(schema.checklistItems.position)).all();
    expect(items.map((i) => i.label)).toEqual([...defaultChecklistLabels]);
  });

  it('ships the demo lobe table exactly as its generator writes it: 16 lobes, labelled demo data', () => {
    const text = fs.readFileSync(demoLobesFile, 'utf8');
    expect(text).toBe(demoLobeCsv());
    expect(text.split('\n')[0]).toMatch(/^# Lobewright demo data \(invented\)/);
    expect(text.split('\n')[1]).toBe(['angle', ...demoLobeIds].join(','));
    expect(demoLobeIds).toHaveLength(16);
  });
});
