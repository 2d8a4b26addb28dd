import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { lifterSideOfCut, preloadAfterRegrind, pushrodChangeForRegrind, pushrodForPreload, regrindCleanup } from './regrind';

/** Height of a roller follower's axle above the cam centre: base-circle radius + roller radius. */
function rollerAxleHeight(baseCircleDiameter: number, rollerDiameter: number): number {
  return baseCircleDiameter / 2 + rollerDiameter / 2;
}

describe('pushrodChangeForRegrind', () => {
  it('is half the base-circle diameter reduction (roller geometry, hand-worked)', () => {
    // Hand-worked geometry: a roller of 0.700 in on a 1.260 in base circle sits with its axle
    // 0.630 + 0.350 = 0.980 in above the cam centre; on a 1.220 in regrind, 0.610 + 0.350 = 0.960 in.
    // The lifter drops 0.020 in, so the pushrod must grow 0.020 in for the 0.040 in diameter cut.
    const drop = rollerAxleHeight(1.26, 0.7) - rollerAxleHeight(1.22, 0.7);
    expect(drop).toBeCloseTo(0.02, 12);
    expect(pushrodChangeForRegrind({ baseCircleReduction: 0.04 })).toBeCloseTo(drop, 12);
  });

  it('property: matches the follower drop for any roller and base circle', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.9, max: 1.6, noNaN: true }),
        fc.double({ min: 0, max: 0.12, noNaN: true }),
        fc.double({ min: 0.5, max: 0.9, noNaN: true }),
        (base, cut, roller) => {
          const drop = rollerAxleHeight(base, roller) - rollerAxleHeight(base - cut, roller);
          expect(pushrodChangeForRegrind({ baseCircleReduction: cut })).toBeCloseTo(drop, 12);
        },
      ),
    );
  });

  it('rejects negative, huge and non-finite reductions', () => {
    expect(() => pushrodChangeForRegrind({ baseCircleReduction: -0.01 })).toThrow(/baseCircleReduction/);
    expect(() => pushrodChangeForRegrind({ baseCircleReduction: 1.2 })).toThrow(/diameter change/);
    expect(() => pushrodChangeForRegrind({ baseCircleReduction: Number.NaN })).toThrow(/finite/);
  });
});

describe('preloadAfterRegrind', () => {
  it('takes the lifter drop off the preload (hand-worked)', () => {
    // Hand-worked: 0.040 in preload; base circle 1.260 → 1.200 in (0.060 in smaller) drops the
    // lifter 0.030 in, leaving 0.010 in preload; a 7.400 in pushrod becomes 7.430 in to restore it.
    const r = preloadAfterRegrind({ originalPreload: 0.04, stockBaseCircle: 1.26, regrindBaseCircle: 1.2, pushrodLength: 7.4 });
    expect(r.baseCircleReduction).toBeCloseTo(0.06, 12);
    expect(r.newPreload).toBeCloseTo(0.01, 12);
    expect(r.pushrodIncrease).toBeCloseTo(0.03, 12);
    expect(r.restoredPushrodLength).toBeCloseTo(7.43, 12);
  });

  it('reports where the new preload sits in the plunger travel', () => {
    // Hand-worked: 0.030 in preload, 0.080 in cut → lifter drops 0.040 in → −0.010 in: the plunger is
    // fully up and the valvetrain has lash, outside a 0.120 in plunger travel's working range.
    const r = preloadAfterRegrind({ originalPreload: 0.03, stockBaseCircle: 1.26, regrindBaseCircle: 1.18, plungerTravel: 0.12 });
    expect(r.newPreload).toBeCloseTo(-0.01, 12);
    expect(r.withinPlungerTravel).toBe(false);
    expect(r.plungerTravelLeft).toBeCloseTo(0.12, 12);
    const ok = preloadAfterRegrind({ originalPreload: 0.05, stockBaseCircle: 1.26, regrindBaseCircle: 1.22, plungerTravel: 0.12 });
    expect(ok.withinPlungerTravel).toBe(true);
    expect(() => preloadAfterRegrind({ originalPreload: 0.15, stockBaseCircle: 1.26, regrindBaseCircle: 1.22, plungerTravel: 0.12 })).toThrow(
      /originalPreload/,
    );
  });

  it('rejects a regrind with a larger base circle', () => {
    expect(() => preloadAfterRegrind({ originalPreload: 0.04, stockBaseCircle: 1.2, regrindBaseCircle: 1.26 })).toThrow(/regrindBaseCircle/);
    expect(() => preloadAfterRegrind({ originalPreload: Number.NaN, stockBaseCircle: 1.2, regrindBaseCircle: 1.1 })).toThrow(/originalPreload/);
  });
});

describe('regrindCleanup', () => {
  // Hand-worked (demo data, invented): 3E galled 0.012 in deep, 0.005 in cleanup allowance.
  const lobes = [
    { id: '1E', lobeLift: 0.315, damageDepth: 0 },
    { id: '3E', lobeLift: 0.315, damageDepth: 0.012 },
  ];

  it('cuts deep enough to clean up the worst lobe: 2 × (0.012 + 0.005) = 0.034 in', () => {
    const r = regrindCleanup({ lobes, cleanupAllowance: 0.005 });
    expect(r.cleanupCut).toBeCloseTo(0.034, 15);
    expect(r.limitingLobe).toBe('3E');
    expect(r.cut).toBeCloseTo(0.034, 15);
    expect(r.largestCut).toBeNull();
    expect(r.cleanupWithinLimit).toBeNull();
  });

  it('gives the largest lift at a cut: 0.315 + 0.040/2 − 0.012 − 0.005 = 0.318 in', () => {
    const r = regrindCleanup({ lobes, cleanupAllowance: 0.005, cut: 0.04, largestCut: 0.03 });
    expect(r.largestLift).toBeCloseTo(0.318, 15);
    expect(r.largestLiftLobe).toBe('3E');
    expect(r.cleanupWithinLimit).toBe(false);
  });

  it('property: a deeper cut never shrinks the largest reachable lift', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        fc.double({ min: 0, max: 0.05, noNaN: true }),
        (c1, c2, damage) => {
          const input = { lobes: [{ id: 'x', lobeLift: 0.3, damageDepth: damage }], cleanupAllowance: 0.005 };
          const shallow = regrindCleanup({ ...input, cut: Math.min(c1, c2) });
          const deep = regrindCleanup({ ...input, cut: Math.max(c1, c2) });
          expect(deep.largestLift).toBeGreaterThanOrEqual(shallow.largestLift);
        },
      ),
    );
  });

  it('refuses missing lobes and bad numbers naming the field', () => {
    expect(() => regrindCleanup(undefined as never)).toThrow(CalcInputError);
    expect(() => regrindCleanup({ lobes: [], cleanupAllowance: 0.005 })).toThrow(/lobes/);
    expect(() => regrindCleanup({ lobes: [{ id: 'a', lobeLift: 0.3, damageDepth: -1 }], cleanupAllowance: 0.005 })).toThrow(/lobes\[0\]\.damageDepth/);
    expect(() => regrindCleanup({ lobes, cleanupAllowance: Number.NaN })).toThrow(/cleanupAllowance/);
  });
});

describe('lifterSideOfCut', () => {
  it('drops the lifter by half the cut and says how far stock pushrods go (hand-worked)', () => {
    // 0.040 in cut: drop 0.020, preload 0.045 − 0.020 = 0.025, pushrod 7.400 + 0.020 = 7.420;
    // with a 0.020 in minimum preload the stock pushrods allow 2 × (0.045 − 0.020) = 0.050 in.
    const r = lifterSideOfCut({ cut: 0.04, originalPreload: 0.045, minimumPreload: 0.02, pushrodLength: 7.4, plungerTravel: 0.12 });
    expect(r.lifterDrop).toBeCloseTo(0.02, 12);
    expect(r.preloadLeft).toBeCloseTo(0.025, 12);
    expect(r.restoredPushrodLength).toBeCloseTo(7.42, 12);
    expect(r.largestCutStockPushrods).toBeCloseTo(0.05, 12);
    expect(r.stockPushrodsOk).toBe(true);
    expect(r.plungerTravelLeft).toBeCloseTo(0.095, 12);
    expect(lifterSideOfCut({ cut: 0.06, originalPreload: 0.045, minimumPreload: 0.02 }).stockPushrodsOk).toBe(false);
  });

  it('refuses bad arguments naming the field', () => {
    expect(() => lifterSideOfCut(null as never)).toThrow(CalcInputError);
    expect(() => lifterSideOfCut({ cut: -0.01, originalPreload: 0.045, minimumPreload: 0.02 })).toThrow(/^cut/);
    expect(() => lifterSideOfCut({ cut: 0.04, originalPreload: Number.NaN, minimumPreload: 0.02 })).toThrow(/originalPreload/);
  });
});

describe('pushrodForPreload', () => {
  // Geometry (from memory): with fixed rockers, an adjustable checking pushrod set to zero lash has the
  // lifter plunger at the top of its travel; each inch of pushrod beyond that pushes the plunger down an
  // inch (the rocker does not move, so its ratio does not enter), so length = zero-lash length + preload.
  // Grinding the base circle smaller by Δd on the diameter drops the lifter Δd/2 (it rides on the radius),
  // which the pushrod must make up when the zero-lash length was read on the old cam. Setting preload from
  // a zero-lash checking pushrod is common practice, no source.
  it('adds the lifter drop and the target preload to the zero-lash length (issue finding 5, by hand)', () => {
    // Read on the old cam: 7.150 + 0.040/2 + 0.050 = 7.220 in; the 7.200 in pushrods are 0.020 in short.
    const a = pushrodForPreload({ checkingLength: 7.15, targetPreload: 0.05, baseCircleReduction: 0.04, currentLength: 7.2 });
    expect(a.lifterDrop).toBeCloseTo(0.02, 12);
    expect(a.length).toBeCloseTo(7.22, 12);
    expect(a.change).toBeCloseTo(0.02, 12);
    // The changed readings: 7.100 + 0.020 + 0.030 = 7.150 in, 0.050 in shorter than the pushrods in the engine.
    const b = pushrodForPreload({ checkingLength: 7.1, targetPreload: 0.03, baseCircleReduction: 0.04, currentLength: 7.2 });
    expect(b.length).toBeCloseTo(7.15, 12);
    expect(b.change).toBeCloseTo(-0.05, 12);
  });

  it('read on the reground cam the base circle is already in the reading', () => {
    const a = pushrodForPreload({ checkingLength: 7.352, targetPreload: 0.045, baseCircleReduction: 0 });
    expect(a).toMatchObject({ lifterDrop: 0, change: null, currentLength: null });
    expect(a.length).toBeCloseTo(7.397, 12);
  });

  it('property: each input moves the length one for one, the base-circle cut by half', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        fc.double({ min: 0.001, max: 0.05, noNaN: true }),
        (checkingLength, targetPreload, baseCircleReduction, d) => {
          const base = pushrodForPreload({ checkingLength, targetPreload, baseCircleReduction }).length;
          expect(pushrodForPreload({ checkingLength: checkingLength + d, targetPreload, baseCircleReduction }).length - base).toBeCloseTo(d, 9);
          expect(pushrodForPreload({ checkingLength, targetPreload: targetPreload + d, baseCircleReduction }).length - base).toBeCloseTo(d, 9);
          expect(pushrodForPreload({ checkingLength, targetPreload, baseCircleReduction: baseCircleReduction + d }).length - base).toBeCloseTo(d / 2, 9);
        },
      ),
    );
  });

  it('refuses a negative cut or preload, naming the field', () => {
    expect(() => pushrodForPreload({ checkingLength: 7.1, targetPreload: 0.03, baseCircleReduction: -0.01 })).toThrow(/baseCircleReduction/);
    expect(() => pushrodForPreload({ checkingLength: 7.1, targetPreload: -0.03, baseCircleReduction: 0 }, 'pushrod')).toThrow(/pushrod\.targetPreload/);
  });

  it('is what the lifter side of a cut gives as its pushrod advice', () => {
    // lifterSideOfCut builds its advice with this function; an independent hand value: 7.352 + 0.050/2 + 0.045 = 7.422 in.
    const l = lifterSideOfCut({
      cut: 0.05,
      originalPreload: 0.048,
      minimumPreload: 0.02,
      pushrodLength: 7.4,
      pushrodCheck: { checkingLength: 7.352, targetPreload: 0.045, checkedOn: 'old-cam' },
    });
    expect(l.pushrod?.length).toBeCloseTo(7.422, 12);
    expect(l.pushrod?.change).toBeCloseTo(0.022, 12);
  });
});
