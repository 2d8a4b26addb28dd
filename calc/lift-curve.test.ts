import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import {
  createCurveBuffers,
  CYCLE_GRID,
  lobeLiftAt,
  sampleValveCurveRaw,
  synthesizeLiftCurve,
  synthesizeLobe,
  type LobeShape,
  type LobeSpec,
} from './lift-curve';
import { analyzeLiftTable, durationAtHeight } from './measured';
import { MOTION_LAWS, type MotionLawName } from './motion';

// Lobe specs in the range regrind sheets use (common practice, no source): 0.050 durations
// 160–280°, advertised 15–60° longer at 0.004–0.010 in or 10–35° longer at 0.015–0.025 in,
// lobe lift 0.25–0.50 in.
const lowHeightSpec = fc.record({
  duration050: fc.double({ min: 160, max: 280, noNaN: true }),
  extra: fc.double({ min: 15, max: 60, noNaN: true }),
  advertisedHeight: fc.double({ min: 0.004, max: 0.01, noNaN: true }),
  lobeLift: fc.double({ min: 0.25, max: 0.5, noNaN: true }),
});
const midHeightSpec = fc.record({
  duration050: fc.double({ min: 160, max: 280, noNaN: true }),
  extra: fc.double({ min: 10, max: 35, noNaN: true }),
  advertisedHeight: fc.double({ min: 0.015, max: 0.025, noNaN: true }),
  lobeLift: fc.double({ min: 0.25, max: 0.5, noNaN: true }),
});
const typicalSpec = fc.oneof(lowHeightSpec, midHeightSpec).map(
  (r): LobeSpec => ({
    duration050: r.duration050,
    advertisedDuration: r.duration050 + r.extra,
    advertisedHeight: r.advertisedHeight,
    lobeLift: r.lobeLift,
  }),
);
const law = fc.constantFrom<MotionLawName>(...MOTION_LAWS);

/** Fit, or accept only the documented "no smooth lobe fits" rejection (4-5-6-7 at the extremes). */
function fitOrReject(spec: LobeSpec, name: MotionLawName): LobeShape | null {
  try {
    return synthesizeLobe({ ...spec, law: name });
  } catch (error) {
    expect(error).toBeInstanceOf(CalcInputError);
    expect((error as CalcInputError).field).toBe('advertisedDuration');
    expect(name).toBe('poly4567');
    return null;
  }
}

describe('synthesizeLobe', () => {
  it('property: 3-4-5 and cycloidal fits always exist for typical sheets', () => {
    fc.assert(
      fc.property(typicalSpec, fc.constantFrom<MotionLawName>('poly345', 'cycloidal'), (spec, name) => {
        const shape = synthesizeLobe({ ...spec, law: name });
        expect(shape.halfEvent).toBeGreaterThan(spec.advertisedDuration / 2);
      }),
    );
  });

  it('property: hits both checking-height durations and the lobe lift exactly', () => {
    // Definition of duration at a checking height (common practice, no source): the crank
    // angle between the points where tappet lift passes that height on each flank.
    fc.assert(
      fc.property(typicalSpec, law, (spec, name) => {
        const shape = fitOrReject(spec, name);
        if (!shape) return;
        for (const sign of [-1, 1]) {
          expect(lobeLiftAt(shape, (sign * spec.advertisedDuration) / 2).lift).toBeCloseTo(spec.advertisedHeight, 12);
          expect(lobeLiftAt(shape, (sign * spec.duration050) / 2).lift).toBeCloseTo(0.05, 12);
        }
        expect(lobeLiftAt(shape, 0).lift).toBeCloseTo(spec.lobeLift, 12);
      }),
    );
  });

  it('property: symmetric, non-negative, peaks at the lobe lift and falls monotonically each side', () => {
    fc.assert(
      fc.property(
        typicalSpec,
        law,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (spec, name, f1, f2) => {
          const shape = fitOrReject(spec, name);
          if (!shape) return;
          const span = shape.halfEvent + 10;
          const near = Math.min(f1, f2) * span;
          const far = Math.max(f1, f2) * span;
          const a = lobeLiftAt(shape, near);
          const b = lobeLiftAt(shape, -near);
          expect(a.lift).toBe(b.lift);
          expect(a.velocity + b.velocity).toBe(0);
          expect(a.acceleration).toBe(b.acceleration);
          expect(a.lift).toBeGreaterThanOrEqual(0);
          expect(a.lift).toBeLessThanOrEqual(spec.lobeLift);
          expect(lobeLiftAt(shape, far).lift).toBeLessThanOrEqual(a.lift);
          expect(lobeLiftAt(shape, -far).lift).toBeLessThanOrEqual(a.lift);
        },
      ),
    );
  });

  it('property: lift and velocity are continuous (bounded steps on a fine grid, no jump at the seat)', () => {
    // Continuity check by the mean-value theorem: |Δy| ≤ max|y′|·h for a C¹ curve.
    fc.assert(
      fc.property(typicalSpec, law, (spec, name) => {
        const shape = fitOrReject(spec, name);
        if (!shape) return;
        const h = 0.02;
        const n = Math.ceil((shape.halfEvent + 2) / h);
        const pts = [];
        let maxV = 0;
        let maxA = 0;
        for (let i = -n; i <= n; i++) {
          const p = lobeLiftAt(shape, i * h);
          maxV = Math.max(maxV, Math.abs(p.velocity));
          maxA = Math.max(maxA, Math.abs(p.acceleration));
          pts.push(p);
        }
        let worstLift = 0;
        let worstVelocity = 0;
        for (let i = 1; i < pts.length; i++) {
          const p = pts[i];
          const q = pts[i - 1];
          if (!p || !q) continue;
          worstLift = Math.max(worstLift, Math.abs(p.lift - q.lift));
          worstVelocity = Math.max(worstVelocity, Math.abs(p.velocity - q.velocity));
        }
        expect(worstLift).toBeLessThanOrEqual(maxV * h * 1.001 + 1e-15);
        expect(worstVelocity).toBeLessThanOrEqual(maxA * h * 1.001 + 1e-15);
        expect(lobeLiftAt(shape, shape.halfEvent - 1e-9).lift).toBeLessThan(1e-12);
        expect(Number.isFinite(maxA)).toBe(true);
      }),
      { numRuns: 25 },
    );
  });

  it('property: velocity and acceleration agree with central differences of lift', () => {
    fc.assert(
      fc.property(typicalSpec, law, fc.double({ min: -0.97, max: 0.97, noNaN: true }), (spec, name, f) => {
        const shape = fitOrReject(spec, name);
        if (!shape) return;
        const phi = f * shape.halfEvent;
        if (Math.abs(phi) < 0.01) return;
        const h = 1e-3;
        const p = lobeLiftAt(shape, phi);
        const up = lobeLiftAt(shape, phi + h);
        const dn = lobeLiftAt(shape, phi - h);
        expect(p.velocity).toBeCloseTo((up.lift - dn.lift) / (2 * h), 8);
        expect(p.acceleration).toBeCloseTo((up.velocity - dn.velocity) / (2 * h), 8);
      }),
    );
  });

  it('rejects impossible lobe specs naming the field', () => {
    const ok = { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 };
    expect(() => synthesizeLobe({ ...ok, duration050: 0 })).toThrow(/duration050/);
    expect(() => synthesizeLobe({ ...ok, duration050: 365, advertisedDuration: 370 })).toThrow(/duration050/);
    expect(() => synthesizeLobe({ ...ok, advertisedDuration: 200 })).toThrow(/advertisedDuration/);
    expect(() => synthesizeLobe({ ...ok, advertisedHeight: 0.06 })).toThrow(/advertisedHeight/);
    expect(() => synthesizeLobe({ ...ok, lobeLift: 0.04 })).toThrow(/lobeLift/);
    expect(() => synthesizeLobe({ ...ok, lobeLift: Number.NaN })).toThrow(/lobeLift/);
    // 0.006 in duration 150° longer than at 0.050 in: no lobe of this lift has such a ramp.
    expect(() => synthesizeLobe({ ...ok, duration050: 180, advertisedDuration: 340 })).toThrow(/too long/);
  });
});

describe('synthesizeLiftCurve', () => {
  const spec = { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 };

  it('sampled tappet curve measures back to the sheet durations (0.5° grid)', () => {
    const curve = synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1, lash: 0 });
    const table = Array.from(curve.lift, (lift, i) => ({ angle: curve.start + i * curve.step, lift }));
    expect(durationAtHeight(table, 0.05)).toBeCloseTo(212, 2);
    expect(durationAtHeight(table, 0.006)).toBeCloseTo(270, 1);
    expect(Math.max(...curve.lift)).toBeCloseTo(0.333, 12);
    expect(curve.lift[(106 - curve.start) / curve.step]).toBeCloseTo(0.333, 12);
  });

  it('mirrored sampling matches point-by-point evaluation on both flanks', () => {
    const shape = synthesizeLobe(spec);
    const curve = synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1.6, lash: 0 });
    for (const angle of [-50, 0, 40.5, 100, 106, 150, 212.5, 260]) {
      const i = (angle - curve.start) / curve.step;
      const p = lobeLiftAt(shape, angle - 106);
      expect(curve.lift[i]).toBeCloseTo(1.6 * p.lift, 14);
      expect(curve.velocity[i]).toBeCloseTo(1.6 * p.velocity, 14);
      expect(curve.acceleration[i]).toBeCloseTo(1.6 * p.acceleration, 14);
    }
    expect(curve.velocity[(60 - curve.start) / curve.step]).toBeGreaterThan(0);
    expect(curve.velocity[(150 - curve.start) / curve.step]).toBeLessThan(0);
  });

  it('handles a centreline between grid points and reused buffers', () => {
    // Off-grid centre: the sampled table still measures back to the sheet and to its centre
    // (equal-lift method, common practice, no source).
    const shape = synthesizeLobe(spec);
    const buffers = createCurveBuffers(CYCLE_GRID.count);
    sampleValveCurveRaw(shape, -40, 1.5, 0, CYCLE_GRID, buffers); // leave data elsewhere first
    const curve = sampleValveCurveRaw(shape, 106.3, 1, 0, CYCLE_GRID, buffers);
    const fresh = synthesizeLiftCurve({ ...spec, centerline: 106.3, rockerRatio: 1, lash: 0 });
    expect(Array.from(curve.lift)).toEqual(Array.from(fresh.lift));
    expect(Array.from(curve.velocity)).toEqual(Array.from(fresh.velocity));
    const table = Array.from(curve.lift, (lift, i) => ({ angle: curve.start + i * curve.step, lift }));
    expect(durationAtHeight(table, 0.05)).toBeCloseTo(212, 2);
    expect(analyzeLiftTable({ points: table }).centerline).toBeCloseTo(106.3, 3);
    expect(curve.peakVelocity).toBeCloseTo(fresh.peakVelocity, 15);
  });

  it('scales by rocker ratio and takes off lash', () => {
    // Hand-worked: 0.333 × 1.5 − 0.018 = 0.4815 in at the nose.
    const curve = synthesizeLiftCurve({ ...spec, centerline: -114, rockerRatio: 1.5, lash: 0.018 });
    const nose = curve.lift[(-114 - CYCLE_GRID.start) / CYCLE_GRID.step] ?? Number.NaN;
    expect(nose).toBeCloseTo(0.4815, 12);
    expect(curve.maxLift).toBeCloseTo(0.4815, 12);
    expect(Math.min(...curve.lift)).toBe(0);
    // the valve stays shut while rocker × tappet lift is under the lash: 0.018/1.5 = 0.012 in tappet lift,
    // which lies between the 0.006 and 0.050 points, so the valve-open span is between 212 and 270°.
    let open = 0;
    for (const v of curve.lift) if (v > 0) open++;
    expect(open * 0.5).toBeGreaterThan(212);
    expect(open * 0.5).toBeLessThan(270);
  });

  it('rejects bad centreline, rocker ratio and grid', () => {
    expect(() => synthesizeLiftCurve({ ...spec, centerline: Number.NaN, rockerRatio: 1.5, lash: 0 })).toThrow(/centerline/);
    expect(() => synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: -1, lash: 0 })).toThrow(/rockerRatio/);
    expect(() => synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1.5, lash: 1 })).toThrow(/lash/);
    expect(() =>
      synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1.5, lash: 0, grid: { start: 0, step: 0, count: 10 } }),
    ).toThrow(/grid.step/);
  });
});
