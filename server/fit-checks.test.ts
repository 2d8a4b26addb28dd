import { describe, expect, it } from 'vitest';

import { correctionText, degreeReadout, iclText, revisionName } from '@/lib/degree-readout';
import type { EngineSpec } from '@/shared/engine';
import type { ProfileSpec } from '@/shared/profile';
import { makeEngineSpec, makeProfileSpec } from '@/tests/fixtures';

import { runFitChecks } from './fit-checks';

const engine = makeEngineSpec() as EngineSpec;
const spec = makeProfileSpec() as ProfileSpec;

describe('one ICL from one set of degree-wheel readings', () => {
  it('the measurements read-out and the fit check give the same ICL and correction', () => {
    // Issue finding 4: stops 20° BTDC / 22° ATDC, flanks 5° and 205° on the wheel, sheet ICL 108°.
    // Hand-worked (piston-stop method, common practice, no source): true TDC 1° ATDC on the wheel,
    // ICL (4 + 204)/2 = 104.0° ATDC, 4.0° earlier than the sheet: retard 4.0°.
    const readings = { stopBefore: 20, stopAfter: 22, openingAngle: 5, closingAngle: 205 };
    const name = revisionName('Towing regrind', 1);
    const live = degreeReadout(readings, { icl: spec.icl, name });
    const run = runFitChecks({ engine, spec, measured: { degree: { ...readings, checkingLift: 0.05, table: [] } }, limits: {} });
    expect(run.degree).not.toBeNull();
    expect(live.icl).toBe('104.0° ATDC');
    expect(iclText(run.degree!)).toBe(live.icl);
    expect(live.comparison).toBe('4.0° earlier than Towing regrind rev 1 (108.0°): retard the cam 4.0°.');
    expect(correctionText(run.degree!, name)).toBe(live.comparison);
    expect(live.reading).toEqual(run.degree);
  });
});

describe('a blank old-cam valve lift in the PTV baseline', () => {
  it('is not measured, never zero: the valve check does not run and names the reading that lacks it', () => {
    const baseline = {
      method: 'clay' as const,
      intake: [
        { crankAngle: -10, clearance: 0.205, valveLift: 0.046 },
        { crankAngle: 10, clearance: 0.19, valveLift: null },
      ],
      exhaust: [{ crankAngle: -10, clearance: 0.178, valveLift: 0.101 }],
    };
    const run = runFitChecks({ engine, spec, measured: { 'ptv-baseline': baseline }, limits: {} });
    expect(run.checks.find((c) => c.id === 'ptvIntake')).toBeUndefined();
    expect(run.ptv.intake).toBeNull();
    expect(run.skipped).toContainEqual({
      id: 'ptvIntake',
      subject: 'intake',
      note: "not measured: the old cam's valve lift for intake reading 2 (at 10° ATDC)",
    });
    // The exhaust, fully measured, still runs.
    expect(run.checks.find((c) => c.id === 'ptvExhaust')?.value).toBe(run.ptv.exhaust?.minClearance);
  });
});
