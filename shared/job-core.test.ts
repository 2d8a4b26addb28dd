import { describe, expect, it } from 'vitest';

import { resolveCheckLimits } from '@/calc/checks';
import { DEMO_CORE } from '@/calc/demo';
import { demoLobeCsv, demoWornLobe } from '@/db/demo-lobes';
import { demoMeasurements } from '@/db/seed';
import { parseLobeTable } from '@/server/uploads/lobe-table';

import { jobCore } from './job-core';
import { lobesSchema, type MeasurementData } from './measurements';

const lobes = lobesSchema.parse(parseLobeTable(demoLobeCsv(), 'lobes-demo.csv'));
const pushrod = demoMeasurements.find((m) => m.kind === 'pushrod')!.data as MeasurementData['pushrod'];
const settings = resolveCheckLimits({ rollerDiameter: { value: 0.75 }, wheelRadius: { value: 7 }, largestCut: { value: 0.06 } });

describe('the job core', () => {
  it("reads the old cam's shape, phasing and damage from the measured lobe table and the stock base circle", () => {
    const job = jobCore({ measured: { lobes, pushrod }, limits: settings, lifterType: 'hydraulic-roller' });
    expect(job.missing).toEqual([]);
    const core = job.core!;
    // The demo table is generated from the demo core's stock lobes (db/demo-lobes.ts), read at 2° steps:
    // the sound lobes give those lobes back within a reading's resolution.
    expect(core.intake.duration050).toBeCloseTo(DEMO_CORE.intake.duration050, 0);
    expect(core.exhaust.advertisedDuration).toBeCloseTo(DEMO_CORE.exhaust.advertisedDuration, 0);
    expect(core.intake.lobeLift).toBeCloseTo(DEMO_CORE.intake.lobeLift, 3);
    expect(core.lsa).toBeCloseTo(DEMO_CORE.lsa, 0);
    expect(core.icl).toBeCloseTo(DEMO_CORE.icl, 0);
    expect(core.baseCircle).toBe(pushrod.stockBaseCircle);
    // The worn lobe's shortfall below its siblings is the exhaust damage; the intakes are sound.
    expect(core.damageDepth?.exhaust).toBeCloseTo(demoWornLobe.shortfall, 3);
    expect(core.damageDepth?.intake).toBe(0);
    expect(job.from).toContain(demoWornLobe.id);
  });

  it("takes the shop's grinding settings as given and leaves a setting that is not set out (never zero)", () => {
    const set = jobCore({ measured: { lobes, pushrod }, limits: settings, lifterType: 'hydraulic-roller' });
    expect(set.grinding).toEqual({ rollerDiameter: 0.75, wheelDiameter: 14, cleanupAllowance: 0.005, largestCut: 0.06 });
    const defaults = jobCore({ measured: { lobes, pushrod }, limits: resolveCheckLimits({}), lifterType: 'hydraulic-roller' });
    expect(defaults.grinding).toEqual({ cleanupAllowance: 0.005 });
    // A flat tappet has no roller: the roller setting does not apply.
    expect(jobCore({ measured: {}, limits: settings, lifterType: 'solid-flat' }).grinding.rollerDiameter).toBeUndefined();
  });

  it('names what the job lacks when there is no lobe table or no stock base circle', () => {
    expect(jobCore({ measured: {}, limits: settings, lifterType: 'hydraulic-roller' })).toMatchObject({
      core: null,
      missing: ["upload the core's lobe table (CSV)", 'record the stock base circle (pushrod and preload)'],
    });
    expect(jobCore({ measured: { lobes }, limits: settings, lifterType: 'hydraulic-roller' }).missing).toEqual([
      'record the stock base circle (pushrod and preload)',
    ]);
  });

  it('passes the preload with the old cam on for the lifter side, and leaves it out when it was not measured', () => {
    expect(jobCore({ measured: { pushrod }, limits: settings, lifterType: 'hydraulic-roller' }).regrind).toEqual({
      originalPreload: pushrod.originalPreload,
      stockBaseCircle: pushrod.stockBaseCircle,
      plungerTravel: pushrod.plungerTravel,
      pushrodLength: pushrod.currentLength,
      // The checking pushrod reading, for the pushrod advice (issue 14, finding 5).
      pushrodCheck: { checkingLength: pushrod.checkingLength, targetPreload: pushrod.targetPreload, checkedOn: 'old-cam' },
    });
    expect(jobCore({ measured: { pushrod: { ...pushrod, originalPreload: null } }, limits: settings, lifterType: 'hydraulic-roller' }).regrind).toBeUndefined();
  });

  it('refuses a table whose angles are not from overlap TDC rather than guessing the phasing', () => {
    const shifted = { ...lobes, lobes: lobes.lobes.map((l) => ({ ...l, points: l.points.map((p) => ({ ...p, angle: p.angle + 300 })) })) };
    const job = jobCore({ measured: { lobes: shifted, pushrod }, limits: settings, lifterType: 'hydraulic-roller' });
    expect(job.core).toBeNull();
    expect(job.missing[0]).toMatch(/overlap TDC/);
  });
});
