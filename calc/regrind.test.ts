import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { preloadAfterRegrind, pushrodChangeForRegrind } from './regrind';

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
