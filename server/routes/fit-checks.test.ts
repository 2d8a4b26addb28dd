import fs from 'node:fs';

import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_TOWING } from '@/calc/demo';
import { ptvSweep } from '@/calc/ptv';
import { schema } from '@/db';
import { demoLobesFile } from '@/db/demo-lobes';
import { demoMeasurements } from '@/db/seed';
import { createTestApp, formWith, makeEngineSpec, makeJobWithEngine, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A job with the demo engine, the towing profile on a draft sheet, and a tech. */
async function sheetOnJob(name = 'Fit-check shop') {
  const base = await makeJobWithEngine(t, name);
  const sheet = await base.founder.post(`/api/jobs/${base.jobId}/sheets`, { title: 'Towing regrind', profileId: base.profileId });
  if (sheet.status !== 201) throw new Error(JSON.stringify(sheet.body));
  const tech = await memberWithRole(t, base.shopId, 'tech');
  return { ...base, tech, sheetId: sheet.body.sheet.id as string, revisionId: sheet.body.sheet.current.id as string };
}

type Check = { id: string; subject: string; status: string; value: number; margin: number; limit: number };
const find = (checks: Check[], id: string, subject: string) => {
  const found = checks.find((c) => c.id === id && c.subject === subject);
  if (!found) throw new Error(`no ${id} check for ${subject}`);
  return found;
};

describe('fit checks', () => {
  it('skips everything not measured, with a note, and still saves the run against the revision', async () => {
    const { tech, sheetId, revisionId } = await sheetOnJob();
    const res = await tech.post(`/api/sheets/${sheetId}/fit-checks`);
    expect(res.status).toBe(201);
    expect(res.body.run).toMatchObject({ sheetId, revisionId, revisionNumber: 1, createdBy: tech.userId });
    const { results } = res.body.run;
    expect(results.checks).toEqual([]);
    expect(results.status).toBe('pass');
    expect(results.skipped.map((s: { id: string }) => s.id).sort()).toEqual(
      ['coilBind', 'degreeing', 'hydraulicPreload', 'ptvExhaust', 'ptvIntake', 'retainerToSeal', 'wornLobe'].sort(),
    );
    for (const s of results.skipped) expect(s.note).toMatch(/^not measured/);
  });

  it('runs every check on the demo measurements with the expected statuses', async () => {
    const { tech, jobId, sheetId, revisionId } = await sheetOnJob();
    for (const m of demoMeasurements) {
      const res = await tech.post(`/api/jobs/${jobId}/measurements`, { kind: m.kind, note: m.note, data: m.data });
      expect(res.status).toBe(201);
    }
    // Degree wheel: piston stops at 20° BTDC and 24° ATDC put true TDC at +2° on the wheel,
    // so the flank readings 10° and 210° are really 8° and 208°: ICL 108°, the sheet's own.
    await tech.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'degree',
      data: { stopBefore: 20, stopAfter: 24, checkingLift: 0.05, openingAngle: 10, closingAngle: 210 },
    });
    const csv = fs.readFileSync(demoLobesFile, 'utf8');
    expect((await tech.upload(`/api/jobs/${jobId}/measurements/lobes`, formWith([['file', 'lobes-demo.csv', csv, 'text/csv']]))).status).toBe(201);

    const res = await tech.post(`/api/sheets/${sheetId}/fit-checks`);
    expect(res.status).toBe(201);
    const run = res.body.run;
    expect(run.revisionId).toBe(revisionId);
    const { results } = run;
    const checks = results.checks as Check[];

    // Springs, by hand (linear spring, as in any machine-design text, e.g. Shigley, from memory):
    // valve lift = lobe lift × rocker ratio = 0.340 × 1.6 = 0.544 in (exhaust; 3E is an exhaust valve).
    // open height = installed height − lift = 1.765 − 0.544 = 1.221 in; coil-bind margin = 1.221 − 1.150 = 0.071 in,
    // under the default 0.060 + 0.020 watch band → watch. Open load = seat load + rate × lift = 121 + 320 × 0.544 = 295.08 lbf.
    const spring3E = find(checks, 'coilBind', '3E');
    expect(spring3E.value).toBeCloseTo(0.071, 6);
    expect(spring3E.status).toBe('watch');
    const row3E = results.springs.find((s: { where: string }) => s.where === '3E');
    expect(row3E.openLoad).toBeCloseTo(295.08, 6);
    expect(row3E.retainerToSealMargin).toBeCloseTo(0.62 - 0.544, 6);
    // A head-wide spring is checked at the larger of the two lifts: 1.800 − 0.544 − 1.150 = 0.106 in → pass.
    expect(find(checks, 'coilBind', 'left head').value).toBeCloseTo(0.106, 6);
    expect(find(checks, 'coilBind', 'left head').status).toBe('pass');
    expect(find(checks, 'retainerToSeal', 'right head').status).toBe('pass');

    // Preload, by hand: the base circle shrinks 1.250 → 1.200 in (diameter), so the lifter drops half that, 0.025 in;
    // 0.048 − 0.025 = 0.023 in, inside 0.020–0.060 but within 0.005 of the bottom → watch; pushrods 7.400 + 0.025 = 7.425 in.
    const preload = find(checks, 'hydraulicPreload', 'lifters');
    expect(preload.value).toBeCloseTo(0.023, 9);
    expect(preload.status).toBe('watch');
    expect(results.preload.restoredPushrodLength).toBeCloseTo(7.425, 9);

    // PTV: every clay reading is swept; the smallest prediction governs and is what the check uses.
    for (const valve of ['intake', 'exhaust'] as const) {
      const sweep = results.ptv[valve];
      const readings = demoMeasurements[0]!.data as { intake: object[]; exhaust: object[] };
      expect(readings[valve]).toContainEqual(sweep.baseline);
      expect(find(checks, valve === 'intake' ? 'ptvIntake' : 'ptvExhaust', valve).value).toBe(sweep.minClearance);
      expect(sweep.clearance).toHaveLength(361);
      expect(Math.min(...sweep.clearance)).toBe(sweep.minClearance);
    }
    expect(find(checks, 'ptvIntake', 'intake').status).toBe('pass');
    expect(find(checks, 'ptvExhaust', 'exhaust').status).toBe('pass');

    // Degreeing: measured ICL 108° against the sheet's 108° → no correction.
    expect(results.degree).toMatchObject({ trueTdcOffset: 2, measuredIcl: 108, sheetIcl: DEMO_TOWING.icl, correction: 'none' });
    expect(find(checks, 'degreeing', 'intake').status).toBe('pass');

    // Lobes: all 16 analysed; 3E about 0.012 in below the other exhausts → fail; intakes compared only with intakes.
    expect(results.lobes.analyses).toHaveLength(16);
    expect(results.lobes.worn.worn).toEqual(['3E']);
    const worn = find(checks, 'wornLobe', '3E');
    expect(worn.status).toBe('fail');
    expect(worn.value).toBeGreaterThan(0.011);
    expect(worn.value).toBeLessThan(0.013);
    expect(checks.filter((c) => c.id === 'wornLobe' && c.status !== 'pass').map((c) => c.subject)).toEqual(['3E']);
    const intake3 = results.lobes.analyses.find((a: { id: string }) => a.id === '3I').table;
    expect(intake3.maxLift).toBeCloseTo(DEMO_TOWING.intake.lobeLift - 0.028, 2); // the stock-spec core, 0.305 in
    expect(intake3.durations.map((d: { height: number }) => d.height)).toEqual([0.006, 0.05]);
    expect(intake3.durations[1].duration).toBeCloseTo(204, 0);

    expect(results.skipped).toEqual([]);
    expect(results.status).toBe('fail');
    const stored = t.db.select().from(schema.fitCheckRuns).where(eq(schema.fitCheckRuns.id, run.id)).get();
    expect(stored?.revisionId).toBe(revisionId);
    expect(stored?.results).toEqual(results);
  });

  it('uses the governing PTV reading: the one predicting the least clearance', async () => {
    const { tech, jobId, sheetId } = await sheetOnJob();
    const intake = [
      { crankAngle: -10, clearance: 0.2, valveLift: 0.046 },
      { crankAngle: 10, clearance: 0.12, valveLift: 0.098 },
    ];
    await tech.post(`/api/jobs/${jobId}/measurements`, { kind: 'ptv-baseline', data: { method: 'clay', intake, exhaust: intake } });
    const { results } = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    const sweep = results.ptv.intake;
    // Both readings are swept over the same lift curve, so the one whose baseline offset is smaller predicts less
    // clearance at every angle. calc's sweep with zero lift gives each reading's offset plus the same piston term.
    const engine = makeEngineSpec();
    const predictions = intake.map((baseline) => {
      const offsetOf = (b: typeof baseline) =>
        ptvSweep({
          stroke: engine.stroke,
          rodLength: engine.rodLength,
          valveAngle: engine.valveAngle,
          baseline: b,
          curve: { start: -90, step: 0.5, lift: new Float64Array(361) },
        });
      return offsetOf(baseline).clearance[0]!;
    });
    const governing = predictions[0]! < predictions[1]! ? intake[0] : intake[1];
    expect(sweep.baseline).toEqual(governing);
    expect(find(results.checks, 'ptvIntake', 'intake').value).toBe(sweep.minClearance);
  });

  it('binds each run to the revision it ran on and lists runs newest first', async () => {
    const { founder, tech, sheetId, revisionId } = await sheetOnJob();
    const first = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    const revised = await founder.patch(`/api/sheets/${sheetId}`, { version: 1, newRevision: true, note: 'Second look' });
    expect(revised.status).toBe(200);
    const second = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    expect(second.revisionId).toBe(revised.body.sheet.current.id);
    expect(second.revisionId).not.toBe(revisionId);
    const list = await tech.get(`/api/sheets/${sheetId}/fit-checks`);
    expect(list.body.runs.map((r: { id: string; revisionNumber: number }) => [r.id, r.revisionNumber])).toEqual([
      [second.id, 2],
      [first.id, 1],
    ]);
  });

  it('names the measurement to fix when the numbers cannot work', async () => {
    const { tech, jobId, sheetId } = await sheetOnJob();
    // A stock base circle smaller than the regrind's 1.200 in cannot be: grinding only removes metal.
    await tech.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'pushrod',
      data: { checkingLength: 7.35, plungerTravel: 0.12, targetPreload: 0.045, originalPreload: 0.05, stockBaseCircle: 1.1 },
    });
    const res = await tech.post(`/api/sheets/${sheetId}/fit-checks`);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['spec.baseCircle']);
    expect((await tech.get(`/api/sheets/${sheetId}/fit-checks`)).body.runs).toEqual([]);
  });

  it('keeps shops apart and customers and grinders out', async () => {
    const a = await sheetOnJob('Shop A');
    const b = await sheetOnJob('Shop B');
    await a.tech.post(`/api/sheets/${a.sheetId}/fit-checks`);
    expect((await b.tech.post(`/api/sheets/${a.sheetId}/fit-checks`)).status).toBe(404);
    expect((await b.tech.get(`/api/sheets/${a.sheetId}/fit-checks`)).status).toBe(404);
    for (const role of ['customer', 'grinder'] as const) {
      const person = await memberWithRole(t, a.shopId, role);
      expect((await person.post(`/api/sheets/${a.sheetId}/fit-checks`)).status).toBe(403);
      expect((await person.get(`/api/sheets/${a.sheetId}/fit-checks`)).status).toBe(403);
    }
    expect((await a.founder.get(`/api/sheets/${a.sheetId}/fit-checks`)).body.runs).toHaveLength(1);
  });

  it('keeps a blank old-cam valve lift as not measured through to the check, which says NOT RUN and names it', async () => {
    const { tech, jobId, sheetId } = await sheetOnJob();
    const saved = await tech.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'ptv-baseline',
      data: { method: 'clay', intake: [{ crankAngle: -10, clearance: 0.165 }], exhaust: [{ crankAngle: 10, clearance: 0.19, valveLift: 0.041 }] },
    });
    expect(saved.status).toBe(201);
    expect(saved.body.measurement.data.intake[0].valveLift).toBeNull();
    const { results } = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    expect(results.checks.map((c: Check) => c.id)).not.toContain('ptvIntake');
    expect(results.skipped).toContainEqual({
      id: 'ptvIntake',
      subject: 'intake',
      note: "not measured: the old cam's valve lift for intake reading 1 (at -10° ATDC)",
    });
    expect(results.checks.map((c: Check) => c.id)).toContain('ptvExhaust');
  });

  it('bases the pushrod advice on the checking pushrod at zero lash, the target preload and the base-circle cut', async () => {
    // Issue finding 5. Geometry beside calc's test (calc/regrind.test.ts, from memory): length = zero-lash length
    // + half the base-circle cut (read on the old cam) + target preload. Towing sheet base circle 1.200 in, stock 1.240 in.
    const { tech, jobId, sheetId } = await sheetOnJob();
    const reading = { plungerTravel: 0.12, originalPreload: 0.048, stockBaseCircle: 1.24, currentLength: 7.2, checkedOn: 'old-cam' };
    const first = await tech.post(`/api/jobs/${jobId}/measurements`, { kind: 'pushrod', data: { ...reading, checkingLength: 7.15, targetPreload: 0.05 } });
    expect(first.status).toBe(201);
    const before = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run.results.pushrod;
    // 7.150 + 0.020 + 0.050 = 7.220 in
    expect(before.advice.length).toBeCloseTo(7.22, 9);
    expect(before.advice.change).toBeCloseTo(0.02, 9);
    const changed = await tech.patch(`/api/measurements/${first.body.measurement.id}`, {
      version: first.body.measurement.version,
      data: { ...reading, checkingLength: 7.1, targetPreload: 0.03 },
    });
    expect(changed.status).toBe(200);
    const after = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run.results.pushrod;
    // 7.100 + 0.020 + 0.030 = 7.150 in: 0.050 in shorter than the pushrods in the engine
    expect(after.advice.length).toBeCloseTo(7.15, 9);
    expect(after.advice.change).toBeCloseTo(-0.05, 9);
    expect(after.missing).toBeNull();
  });

  it('names what the pushrod advice lacks instead of guessing which cam the checking pushrod was read on', async () => {
    const { tech, jobId, sheetId } = await sheetOnJob();
    await tech.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'pushrod',
      data: { checkingLength: 7.15, targetPreload: 0.05, plungerTravel: 0.12, stockBaseCircle: 1.24 },
    });
    const { pushrod } = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run.results;
    expect(pushrod).toEqual({ advice: null, missing: 'say which cam the checking pushrod was read on (pushrod and preload)' });
  });

  it('summarizes a run as Pass only when every check ran, and says how many ran otherwise, with who ran it', async () => {
    const { tech, jobId, sheetId } = await sheetOnJob();
    const empty = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    expect(empty.summary).toMatchObject({ status: 'incomplete', ran: 0, complete: false, label: 'No checks run yet' });
    expect(empty.createdByName).toBe('A tech');
    await tech.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'degree',
      data: { stopBefore: 20, stopAfter: 24, checkingLift: 0.05, openingAngle: 10, closingAngle: 210 },
    });
    const partial = (await tech.post(`/api/sheets/${sheetId}/fit-checks`)).body.run;
    // One degreeing check ran (and passed); PTV ×2, springs ×2, preload and lobes did not: 1 of 7.
    expect(partial.results.status).toBe('pass');
    expect(partial.summary).toMatchObject({ status: 'incomplete', ran: 1, total: 7, label: '1 of 7 checks run' });
    const listed = (await tech.get(`/api/sheets/${sheetId}/fit-checks`)).body.runs;
    expect(listed[0]).toMatchObject({ id: partial.id, summary: partial.summary, createdByName: 'A tech' });
  });
});
