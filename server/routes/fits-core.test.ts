import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { resolveCheckLimits } from '@/calc/checks';
import { demoLobeCsv } from '@/db/demo-lobes';
import { demoMeasurements } from '@/db/seed';
import { parseLobeTable } from '@/server/uploads/lobe-table';
import { analyzeForJob, feasibilityResults } from '@/shared/analysis';
import { engineSchema } from '@/shared/engine';
import { jobCore } from '@/shared/job-core';
import { lobesSchema, type MeasurementData } from '@/shared/measurements';
import { profileSpecSchema } from '@/shared/profile';
import { createTestApp, formWith, makeEngineSpec, makeJobWithEngine, makeProfileSpec, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const pushrod = demoMeasurements.find((m) => m.kind === 'pushrod')!.data as MeasurementData['pushrod'];
const grinding = { rollerDiameter: { value: 0.75 }, wheelRadius: { value: 7 }, cleanupAllowance: { value: 0.005 }, largestCut: { value: 0.06 } };

/** A job whose old cam is measured: the demo lobe table, the pushrod readings, and the shop's grinding settings. */
async function measuredJob() {
  const base = await makeJobWithEngine(t, 'Core shop');
  const tech = await memberWithRole(t, base.shopId, 'tech');
  const up = await tech.upload(`/api/jobs/${base.jobId}/measurements/lobes`, formWith([['file', 'lobes-demo.csv', demoLobeCsv(), 'text/csv']]));
  expect(up.status).toBe(201);
  expect((await tech.post(`/api/jobs/${base.jobId}/measurements`, { kind: 'pushrod', data: pushrod })).status).toBe(201);
  expect((await base.founder.put('/api/shop/limits', { version: 0, limits: grinding })).status).toBe(200);
  return base;
}

describe('fits the core, served', () => {
  it("stores each new revision with calc's feasibility against the job's measured core, and the sheet serves it", async () => {
    const { founder, jobId, profileId } = await measuredJob();
    const created = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Towing', profileId });
    expect(created.status).toBe(201);
    const f = created.body.sheet.current.results.feasibility;

    // The same figures calc gives for the same core by the one shared path.
    const job = jobCore({
      measured: { lobes: lobesSchema.parse(parseLobeTable(demoLobeCsv(), 'lobes-demo.csv')), pushrod },
      limits: resolveCheckLimits(grinding),
      lifterType: 'hydraulic-roller',
    });
    const worked = analyzeForJob(engineSchema.parse(makeEngineSpec()), profileSpecSchema.parse(makeProfileSpec()), job, grinding);
    expect(f).toEqual(JSON.parse(JSON.stringify(feasibilityResults(worked.analysis, worked.job!))));

    // Cut = stock base circle − the profile's (1.250 − 1.200 in); the galled 3E lobe sets the cleanup.
    expect(f.cut).toBeCloseTo(pushrod.stockBaseCircle - 1.2, 9);
    expect(f.cleanup.limitingLobe).toBe('exhaust');
    expect(f.coreFrom).toMatch(/3E/);
    // The whole cam turn at 1°, as plain numbers (JSON keeps no Float64Array).
    expect(f.intake.envelope.margin.length).toBeGreaterThanOrEqual(360);
    expect(Array.isArray(f.intake.envelope.margin)).toBe(true);
    expect(f.lifter.lifterDrop).toBeCloseTo(f.cut / 2, 9);
    const ids = f.checks.map((c: { id: string }) => c.id);
    expect(ids).toEqual(expect.arrayContaining(['finishingStock', 'cleanup', 'largestCut', 'pressureAngle', 'undercut']));

    const read = await founder.get(`/api/sheets/${created.body.sheet.id}`);
    expect(read.body.sheet.current.results.feasibility).toEqual(f);
  });

  it('still saves a sheet whose base circle is larger than the core, and says why the core was not judged', async () => {
    const { founder, jobId } = await measuredJob();
    const big = await founder.post(`/api/jobs/${jobId}/profiles`, { label: 'Big base', coreNotes: '', spec: makeProfileSpec({ baseCircle: 1.3 }) });
    const created = await founder.post(`/api/jobs/${jobId}/sheets`, { title: 'Big', profileId: big.body.profile.id });
    expect(created.status).toBe(201);
    const f = created.body.sheet.current.results.feasibility;
    expect(f.coreFrom).toBeNull();
    expect(f.coreMissing.join(' ')).toMatch(/grinding only removes metal/);
    expect(f.checks.some((c: { id: string }) => c.id === 'finishingStock')).toBe(false);
  });

  it('keeps the new grinding settings with their sources, and refuses a negative one naming the field', async () => {
    const { founder } = await makeJobWithEngine(t, 'Settings shop');
    const empty = await founder.get('/api/shop/limits');
    expect(empty.body.resolved.largestCut.value).toBeNull();
    expect(empty.body.resolved.cleanupAllowance).toEqual({ value: 0.005, source: 'common practice, no source' });
    const saved = await founder.put('/api/shop/limits', { version: 0, limits: { largestCut: { value: 0.05 }, finishingStock: { min: 0.008 } } });
    expect(saved.status).toBe(200);
    expect(saved.body.resolved.largestCut).toEqual({ value: 0.05, source: 'shop setting' });
    expect(saved.body.resolved.finishingStock.min).toBe(0.008);
    const bad = await founder.put('/api/shop/limits', { version: 1, limits: { rollerDiameter: { value: -1 } } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['limits.rollerDiameter.value']);
  });
});
