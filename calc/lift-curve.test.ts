import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import {
  createCurveBuffers,
  CYCLE_GRID,
  GRID_MAX,
  LOBE_ACCELERATION_MAX,
  lobeLiftAt,
  offsetAtLiftRaw,
  RAMP_MAX,
  sampleValveCurveRaw,
  synthesizeLiftCurve,
  synthesizeLobe,
  type LobeShape,
  type LobeSpec,
} from './lift-curve';
import { analyzeLiftTable, durationAtHeight } from './measured';

// Lobe specs in the range regrind sheets use (common practice, no source): 0.050 durations
// 180–240°, advertised 45–65° longer at 0.004–0.008 in or 26–32° longer at 0.018–0.022 in,
// lobe lift 0.33–0.50 in.
const lowHeightSpec = fc.record({
  duration050: fc.double({ min: 180, max: 240, noNaN: true }),
  extra: fc.double({ min: 45, max: 65, noNaN: true }),
  advertisedHeight: fc.double({ min: 0.004, max: 0.008, noNaN: true }),
  lobeLift: fc.double({ min: 0.33, max: 0.5, noNaN: true }),
});
const midHeightSpec = fc.record({
  duration050: fc.double({ min: 180, max: 240, noNaN: true }),
  extra: fc.double({ min: 26, max: 32, noNaN: true }),
  advertisedHeight: fc.double({ min: 0.018, max: 0.022, noNaN: true }),
  lobeLift: fc.double({ min: 0.33, max: 0.5, noNaN: true }),
});
const typicalSpec = fc.oneof(lowHeightSpec, midHeightSpec).map((r): LobeSpec => ({
  duration050: r.duration050,
  advertisedDuration: r.duration050 + r.extra,
  advertisedHeight: r.advertisedHeight,
  lobeLift: r.lobeLift,
}));

/** Central differences (common practice, no source): f′ ≈ (f(x+h) − f(x−h)) / 2h. */
function centralDiff(f: (x: number) => number, x: number, h: number): number {
  return (f(x + h) - f(x - h)) / (2 * h);
}

describe('synthesizeLobe', () => {
  it('property: a fit exists for every typical sheet', () => {
    fc.assert(
      fc.property(typicalSpec, (spec) => {
        const shape = synthesizeLobe(spec);
        expect(shape.halfEvent).toBeGreaterThan(spec.advertisedDuration / 2);
        expect(shape.halfEvent - spec.advertisedDuration / 2).toBeLessThanOrEqual(RAMP_MAX);
      }),
    );
  });

  it('property: hits both checking-height durations and the lobe lift exactly', () => {
    // Definition of duration at a checking height (common practice, no source): the crank
    // angle between the points where tappet lift passes that height on each flank.
    fc.assert(
      fc.property(typicalSpec, (spec) => {
        const shape = synthesizeLobe(spec);
        for (const sign of [-1, 1]) {
          expect(lobeLiftAt(shape, (sign * spec.advertisedDuration) / 2).lift).toBeCloseTo(spec.advertisedHeight, 12);
          expect(lobeLiftAt(shape, (sign * spec.duration050) / 2).lift).toBeCloseTo(0.05, 12);
        }
        expect(lobeLiftAt(shape, 0).lift).toBeCloseTo(spec.lobeLift, 12);
      }),
    );
  });

  it('with k = 1 is the published single-dwell 3-4-5-6 polynomial', () => {
    // Norton, Design of Machinery, single-dwell polynomial (from memory):
    // s = h[64(θ/β)³ − 192(θ/β)⁴ + 192(θ/β)⁵ − 64(θ/β)⁶] over the whole event β.
    const shape: LobeShape = { ...synthesizeLobe({ duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 }), warpScale: 1 };
    const beta = shape.seatToSeat;
    for (const x of [0.05, 0.2, 0.37, 0.5, 0.61, 0.9]) {
      const offset = x * beta - shape.halfEvent;
      const poly = 0.333 * (64 * x ** 3 - 192 * x ** 4 + 192 * x ** 5 - 64 * x ** 6);
      expect(lobeLiftAt(shape, offset).lift).toBeCloseTo(poly, 13);
    }
    // Norton's nose acceleration of this polynomial: s″(β/2) = −24h/β² (hand-derived from the polynomial).
    expect(lobeLiftAt(shape, 0).acceleration).toBeCloseTo((-24 * 0.333) / (beta * beta), 15);
  });

  it('finding 1 (regression): the nose has a real deceleration, continuous from both flanks', () => {
    // The old rise laws ended with zero acceleration, so the nose read 0 in/deg².
    const shape = synthesizeLobe({ duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 });
    const nose = lobeLiftAt(shape, 0).acceleration;
    expect(nose).toBeLessThan(-1e-5);
    // continuity through the nose: both sides approach the nose value
    expect(lobeLiftAt(shape, 1e-6).acceleration).toBeCloseTo(nose, 12);
    expect(lobeLiftAt(shape, -1e-6).acceleration).toBeCloseTo(nose, 12);
    expect(shape.peakDeceleration).toBeCloseTo(nose, 15);
    expect(shape.peakDecelerationAt).toBe(0);
  });

  it('property: the largest deceleration is at the nose, and jerk stays finite', () => {
    fc.assert(
      fc.property(typicalSpec, fc.double({ min: 0, max: 1, noNaN: true }), (spec, f) => {
        const shape = synthesizeLobe(spec);
        const nose = lobeLiftAt(shape, 0).acceleration;
        const at = lobeLiftAt(shape, f * shape.halfEvent).acceleration;
        expect(at).toBeGreaterThanOrEqual(nose * (1 + 1e-9));
        // Jerk by central differences of the exact acceleration. Bound: (48·k³ + 60/k²)·L/Φ³, the seat's
        // 48·L·k³/Φ³ (module doc) plus a term for the nose of a small-k lobe. Lobewright's own bound, no source:
        // a scan of |d³G/dψ³| over ψ ∈ [0, 1) and k ∈ [0.02, 2] peaks at 0.954 of it (k = 2, at the seat).
        const k = shape.warpScale;
        const jerk = centralDiff((x) => lobeLiftAt(shape, x).acceleration, Math.min(f, 0.999) * shape.halfEvent, 1e-4);
        expect(Number.isFinite(jerk)).toBe(true);
        expect(Math.abs(jerk)).toBeLessThan(((48 * k ** 3 + 60 / k ** 2) * spec.lobeLift) / shape.halfEvent ** 3);
      }),
    );
  });

  it('property: symmetric, non-negative, peaks at the lobe lift and falls monotonically each side', () => {
    fc.assert(
      fc.property(typicalSpec, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (spec, f1, f2) => {
        const shape = synthesizeLobe(spec);
        const span = shape.halfEvent + 10;
        const near = Math.min(f1, f2) * span;
        const far = Math.max(f1, f2) * span;
        const a = lobeLiftAt(shape, near);
        const b = lobeLiftAt(shape, -near);
        expect(a.lift).toBe(b.lift);
        expect(a.velocity + b.velocity).toBe(0);
        expect(a.acceleration).toBe(b.acceleration);
        expect(a.lift).toBeGreaterThanOrEqual(0);
        expect(a.lift).toBeLessThanOrEqual(spec.lobeLift * (1 + 1e-12));
        expect(lobeLiftAt(shape, far).lift).toBeLessThanOrEqual(a.lift);
        expect(lobeLiftAt(shape, -far).lift).toBeLessThanOrEqual(a.lift);
      }),
    );
  });

  it('property: lift, velocity and acceleration are continuous (bounded steps, no jump at the seat)', () => {
    // Continuity check by the mean-value theorem: |Δy| ≤ max|y′|·h for a C¹ curve.
    fc.assert(
      fc.property(typicalSpec, (spec) => {
        const shape = synthesizeLobe(spec);
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
        let worstAcceleration = 0;
        for (let i = 1; i < pts.length; i++) {
          const p = pts[i];
          const q = pts[i - 1];
          if (!p || !q) continue;
          worstLift = Math.max(worstLift, Math.abs(p.lift - q.lift));
          worstVelocity = Math.max(worstVelocity, Math.abs(p.velocity - q.velocity));
          worstAcceleration = Math.max(worstAcceleration, Math.abs(p.acceleration - q.acceleration));
        }
        expect(worstLift).toBeLessThanOrEqual(maxV * h * 1.001 + 1e-15);
        expect(worstVelocity).toBeLessThanOrEqual(maxA * h * 1.001 + 1e-15);
        // acceleration steps shrink with h (finite jerk): under 1% of the peak per 0.02°
        expect(worstAcceleration).toBeLessThan(0.01 * maxA);
        expect(lobeLiftAt(shape, shape.halfEvent - 1e-9).lift).toBeLessThan(1e-12);
        expect(Math.abs(lobeLiftAt(shape, shape.halfEvent - 1e-6).acceleration)).toBeLessThan(1e-9);
      }),
      { numRuns: 25 },
    );
  });

  it('property: velocity and acceleration agree with central differences of lift', () => {
    fc.assert(
      fc.property(typicalSpec, fc.double({ min: -0.97, max: 0.97, noNaN: true }), (spec, f) => {
        const shape = synthesizeLobe(spec);
        const phi = f * shape.halfEvent;
        const h = 1e-3;
        const p = lobeLiftAt(shape, phi);
        expect(p.velocity).toBeCloseTo(
          centralDiff((x) => lobeLiftAt(shape, x).lift, phi, h),
          8,
        );
        expect(p.acceleration).toBeCloseTo(
          centralDiff((x) => lobeLiftAt(shape, x).velocity, phi, h),
          8,
        );
      }),
    );
  });

  it('property: offsetAtLiftRaw inverts the lobe', () => {
    fc.assert(
      fc.property(typicalSpec, fc.double({ min: 0.001, max: 0.999, noNaN: true }), (spec, f) => {
        const shape = synthesizeLobe(spec);
        const offset = offsetAtLiftRaw(shape, f * spec.lobeLift);
        expect(lobeLiftAt(shape, offset).lift).toBeCloseTo(f * spec.lobeLift, 12);
        expect(offsetAtLiftRaw(shape, 0.05)).toBeCloseTo(spec.duration050 / 2, 9);
      }),
    );
  });

  it('reports peaks that match a fine scan of the lobe', () => {
    const shape = synthesizeLobe({ duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 });
    let maxA = 0;
    let maxV = 0;
    for (let x = 0; x <= shape.halfEvent; x += 0.01) {
      const p = lobeLiftAt(shape, x);
      maxA = Math.max(maxA, p.acceleration);
      maxV = Math.max(maxV, Math.abs(p.velocity));
    }
    expect(shape.peakAcceleration).toBeCloseTo(maxA, 10);
    expect(shape.peakVelocity).toBeCloseTo(maxV, 10);
    expect(lobeLiftAt(shape, shape.peakAccelerationAt).acceleration).toBeCloseTo(shape.peakAcceleration, 14);
  });

  it('finding 2 (regression): refuses durations 212° and 212.001° naming the fields', () => {
    // The old fit accepted this sheet with a peak acceleration near 5.8e4 in/deg².
    let thrown: unknown = null;
    try {
      synthesizeLobe({ duration050: 212, advertisedDuration: 212.001, advertisedHeight: 0.006, lobeLift: 0.333 });
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(CalcInputError);
    expect((thrown as CalcInputError).field).toBe('advertisedDuration');
    expect((thrown as CalcInputError).message).toMatch(/too close/);
    expect((thrown as CalcInputError).message).toMatch(/duration050/);
  });

  it('refuses a lobe past the acceleration bound, naming the fields', () => {
    // 0.8 in of lift in 150° at 0.050 in: far past LOBE_ACCELERATION_MAX.
    expect(() => synthesizeLobe({ duration050: 150, advertisedDuration: 176, advertisedHeight: 0.02, lobeLift: 0.8 })).toThrow(
      /lobeLift.*acceleration.*duration050/,
    );
    const shape = synthesizeLobe({ duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 });
    expect(shape.peakAcceleration).toBeLessThan(LOBE_ACCELERATION_MAX);
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
    expect(() => synthesizeLobe(undefined as never)).toThrow(CalcInputError);
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
    expect(() => synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1.5, lash: 0, grid: { start: 0, step: 0, count: 10 } })).toThrow(/grid.step/);
  });

  it('finding 5 (regression): refuses a grid past GRID_MAX samples', () => {
    // The old check had no upper bound, so a caller could ask for any allocation.
    expect(() => synthesizeLiftCurve({ ...spec, centerline: 106, rockerRatio: 1.5, lash: 0, grid: { start: 0, step: 0.01, count: GRID_MAX + 1 } })).toThrow(
      /grid.count/,
    );
  });
});
