import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { synthesizeLiftCurve } from './lift-curve';
import { ptvSweep } from './ptv';

const grid = { start: -360, step: 0.5, count: 1441 };
const flat = (v: number) => new Float64Array(grid.count).fill(v);

describe('ptvSweep', () => {
  it('with the valve shut, the tightest point is TDC at the baseline clearance', () => {
    // Hand-worked: no lift, baseline 0.200 in at TDC → min 0.200 in at 0°.
    const r = ptvSweep({ stroke: 3.6, rodLength: 6, baseline: { clearance: 0.2 }, curve: { ...grid, lift: flat(0) } });
    expect(r.minClearance).toBeCloseTo(0.2, 12);
    expect(r.atAngle).toBe(0);
    expect(r.clearance.length).toBe(361);
  });

  it('adds piston depth along the valve axis (hand-worked at 90° ATDC)', () => {
    // Hand-worked: piston depth at 90° with r = 1.8, l = 6 is 2.076365 in (see geometry test).
    // Baseline 0.150 in at TDC, valve shut, valve angle 0 → clearance at 90° = 2.226365 in.
    const r = ptvSweep({ stroke: 3.6, rodLength: 6, baseline: { clearance: 0.15 }, curve: { ...grid, lift: flat(0) } });
    expect(r.clearance[r.clearance.length - 1]).toBeCloseTo(2.2263648, 6);
  });

  it('projects piston travel onto an inclined valve (coordinate geometry)', () => {
    // Independent coordinate check: valve stem direction n = (sin α, −cos α) in the (x, y)
    // plane of the bore, relief floor square to n. Drop the floor by d along −y and intersect
    // the stem line with the moved floor: the gap along the stem grows by (0, −d)·n = d·cos α.
    const alpha = (14 * Math.PI) / 180;
    const n = [Math.sin(alpha), -Math.cos(alpha)] as const;
    const d = 2.0763648; // piston depth at 90°, r = 1.8, l = 6
    const grow = 0 * n[0] + -d * n[1];
    const r = ptvSweep({ stroke: 3.6, rodLength: 6, valveAngle: 14, baseline: { clearance: 0.15 }, curve: { ...grid, lift: flat(0) } });
    expect(r.clearance[r.clearance.length - 1]).toBeCloseTo(0.15 + grow, 6);
  });

  it('uses a baseline taken off TDC with the old cam partly open', () => {
    // Hand-worked: checking springs read 0.120 in at 10° ATDC with the old cam at 0.100 in lift.
    // Piston depth at 10°: r·cos10 = 1.772654, r·sin10 = 0.312567, sqrt(36 − 0.097698) = 5.991853,
    // depth = 7.8 − 1.772654 − 5.991853 = 0.035493 in. With the valve shut at TDC the gap is
    // 0.120 + 0.100 − 0.035493 = 0.184507 in; at 10° with the same 0.100 in lift it is 0.120 in.
    const lift = flat(0);
    lift[(10 - grid.start) / grid.step] = 0.1;
    const r = ptvSweep({
      stroke: 3.6,
      rodLength: 6,
      baseline: { clearance: 0.12, crankAngle: 10, valveLift: 0.1 },
      curve: { ...grid, lift },
    });
    expect(r.clearance[180]).toBeCloseTo(0.184507, 6);
    expect(r.clearance[200]).toBeCloseTo(0.12, 12);
    expect(r.minClearance).toBeCloseTo(0.12, 12);
    expect(r.atAngle).toBe(10);
  });

  it('property: more lift everywhere never raises the minimum clearance', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.2, noNaN: true }), fc.double({ min: 1, max: 1.3, noNaN: true }), (extra, scale) => {
        const base = synthesizeLiftCurve({
          duration050: 220,
          advertisedDuration: 276,
          advertisedHeight: 0.006,
          lobeLift: 0.34,
          centerline: 106,
          rockerRatio: 1.6,
          lash: 0,
        });
        const more = base.lift.map((v) => v * scale + (v > 0 ? extra : 0));
        const a = ptvSweep({ stroke: 3.6, rodLength: 6, baseline: { clearance: 0.25 }, curve: base });
        const b = ptvSweep({ stroke: 3.6, rodLength: 6, baseline: { clearance: 0.25 }, curve: { ...base, lift: more } });
        expect(b.minClearance).toBeLessThanOrEqual(a.minClearance + 1e-15);
      }),
    );
  });

  it('property: intake clearance falls as the cam advances (smaller ICL)', () => {
    const spec = { duration050: 224, advertisedDuration: 280, advertisedHeight: 0.006, lobeLift: 0.35, rockerRatio: 1.6, lash: 0 };
    fc.assert(
      fc.property(fc.double({ min: 98, max: 118, noNaN: true }), fc.double({ min: 0.5, max: 8, noNaN: true }), (icl, advance) => {
        const late = synthesizeLiftCurve({ ...spec, centerline: icl });
        const early = synthesizeLiftCurve({ ...spec, centerline: icl - advance });
        const a = ptvSweep({ stroke: 3.6, rodLength: 6, valveAngle: 15, baseline: { clearance: 0.3 }, curve: late });
        const b = ptvSweep({ stroke: 3.6, rodLength: 6, valveAngle: 15, baseline: { clearance: 0.3 }, curve: early });
        expect(b.minClearance).toBeLessThan(a.minClearance);
      }),
    );
  });

  it('rejects bad baselines, angles and curves', () => {
    const ok = { stroke: 3.6, rodLength: 6, baseline: { clearance: 0.2 }, curve: { ...grid, lift: flat(0) } };
    expect(() => ptvSweep({ ...ok, baseline: { clearance: -0.1 } })).toThrow(/baseline.clearance/);
    expect(() => ptvSweep({ ...ok, baseline: { clearance: Number.NaN } })).toThrow(/baseline.clearance/);
    expect(() => ptvSweep({ ...ok, valveAngle: 60 })).toThrow(/valveAngle/);
    expect(() => ptvSweep({ ...ok, rodLength: 1 })).toThrow(/rodLength/);
    expect(() => ptvSweep({ ...ok, from: -400 })).toThrow(CalcInputError);
    expect(() => ptvSweep({ ...ok, from: 10, to: 0 })).toThrow(/to/);
    const bad = flat(0);
    bad[720] = Number.NaN;
    expect(() => ptvSweep({ ...ok, curve: { ...grid, lift: bad } })).toThrow(/lift\[720\]/);
  });
});
