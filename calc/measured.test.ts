import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { analyzeLiftTable, durationAtHeight, findWornLobes, findWornLobesByKind, liftCurveFromTable, tableMaxLifts, type LiftReading } from './measured';

/** A tent-shaped lobe: lift = L(1 − |θ − c|/W), zero outside; linear interpolation is exact on it. */
function tent(L: number, c: number, W: number, step = 2): LiftReading[] {
  const out: LiftReading[] = [];
  for (let a = Math.floor(c - W - 20); a <= c + W + 20; a += step) out.push({ angle: a, lift: Math.max(0, L * (1 - Math.abs(a - c) / W)) });
  return out;
}

describe('durationAtHeight', () => {
  it('matches a hand-worked tent lobe', () => {
    // Hand-worked: lift 0.400 in, half base 150°. Lift = 0.050 where 1 − |θ−c|/150 = 0.125,
    // |θ−c| = 131.25°, so duration = 262.5°. At 0.006: 1 − 0.015 → 147.75° each side → 295.5°.
    const t = tent(0.4, 108, 150, 0.75);
    expect(durationAtHeight(t, 0.05)).toBeCloseTo(262.5, 10);
    expect(durationAtHeight(t, 0.006)).toBeCloseTo(295.5, 10);
  });

  it('works on an unsorted table', () => {
    const t = tent(0.4, 108, 150, 0.75).reverse();
    expect(durationAtHeight(t, 0.05)).toBeCloseTo(262.5, 10);
  });

  it('property: any tent gives 2W(1 − h/L)', () => {
    // Similar triangles (hand geometry, independent of the interpolation code).
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 0.7, noNaN: true }),
        fc.double({ min: 80, max: 170, noNaN: true }),
        fc.double({ min: 0.01, max: 0.15, noNaN: true }),
        (L, W, h) => {
          expect(durationAtHeight(tent(L, 100, W, 0.5), h)).toBeCloseTo(2 * W * (1 - h / L), 6);
        },
      ),
    );
  });

  it('rejects heights above the peak, open-ended tables and bad readings', () => {
    const t = tent(0.4, 108, 150);
    expect(() => durationAtHeight(t, 0.5)).toThrow(/height/);
    expect(() => durationAtHeight(t, -0.05)).toThrow(/height/);
    expect(() =>
      durationAtHeight(
        t.filter((p) => p.angle > 50),
        0.05,
      ),
    ).toThrow(/before the peak/);
    expect(() => durationAtHeight([{ angle: 0, lift: 0 }], 0.05)).toThrow(CalcInputError);
    expect(() => durationAtHeight([...t, { angle: 500, lift: Number.NaN }], 0.05)).toThrow(/lift/);
    expect(() => durationAtHeight([...t, { angle: 108, lift: 0.3 }], 0.05)).toThrow(/two readings/);
  });
});

describe('analyzeLiftTable', () => {
  it('finds max lift, centreline and durations of an off-centre tent', () => {
    // Hand-worked: tent of 0.420 in centred 110.5° (not on a reading), half base 140°.
    // Centreline crossings at 0.370 in lie 140 × 0.05/0.42 = 16.667° either side → 110.5°.
    const r = analyzeLiftTable({ points: tent(0.42, 110.5, 140, 1), heights: [0.05, 0.1] });
    expect(r.maxLift).toBeCloseTo(0.42 * (1 - 0.5 / 140), 12);
    expect(r.centerline).toBeCloseTo(110.5, 10);
    expect(r.centerlineHeight).toBeCloseTo(r.maxLift - 0.05, 12);
    // 0.050 in: 140 × (1 − 0.05/0.42) × 2 = 246.667°; 0.100 in: 140 × (1 − 0.1/0.42) × 2 = 213.333°.
    expect(r.durations[0]?.duration).toBeCloseTo(246.6667, 3);
    expect(r.durations[1]?.duration).toBeCloseTo(213.3333, 3);
    expect(r.durations[0]?.opening).toBeCloseTo(110.5 - 123.3333, 3);
  });

  it('rejects a height above the peak', () => {
    expect(() => analyzeLiftTable({ points: tent(0.3, 100, 120), heights: [0.4] })).toThrow(/heights\[0\]/);
  });
});

describe('liftCurveFromTable', () => {
  it('resamples a tent and differentiates it', () => {
    // Slope of the tent flank = L/W = 0.4/150 = 0.0026667 in/deg (hand-worked).
    const c = liftCurveFromTable({ points: tent(0.4, 100, 150), grid: { start: -100, step: 0.5, count: 801 } });
    const i = (50 - -100) / 0.5; // 50°, on the opening flank
    expect(c.lift[i]).toBeCloseTo(0.4 * (1 - 50 / 150), 10);
    expect(c.velocity[i]).toBeCloseTo(0.4 / 150, 10);
    expect(c.acceleration[i]).toBeCloseTo(0, 10);
    expect(c.maxLift).toBeCloseTo(0.4, 12);
  });
});

describe('findWornLobes', () => {
  it('flags the demo cylinder 3 exhaust lobe', () => {
    // Demo data (invented): eight exhaust lobes, 3E about 0.012 in below the others.
    const lobes = [
      { id: '1E', maxLift: 0.3362 },
      { id: '2E', maxLift: 0.3358 },
      { id: '3E', maxLift: 0.3241 },
      { id: '4E', maxLift: 0.3365 },
      { id: '5E', maxLift: 0.336 },
      { id: '6E', maxLift: 0.3359 },
      { id: '7E', maxLift: 0.3363 },
      { id: '8E', maxLift: 0.3361 },
    ];
    const r = findWornLobes({ lobes, threshold: 0.005 });
    expect(r.worn).toEqual(['3E']);
    // Hand-worked: the seven siblings of 3E sorted are .3358 .3359 .3360 .3361 .3362 .3363 .3365;
    // median .3361; shortfall .3361 − .3241 = .0120 in.
    const row = r.lobes.find((l) => l.id === '3E');
    expect(row?.siblingMedian).toBeCloseTo(0.3361, 12);
    expect(row?.shortfall).toBeCloseTo(0.012, 12);
  });

  it('uses the mean of the middle pair for an even count of siblings', () => {
    // Hand-worked: siblings of A are 0.31, 0.33, 0.30, 0.32 → sorted .30 .31 .32 .33 → median 0.315;
    // A sits 0.015 below it, over a 0.010 threshold. B's siblings .30 .33 .30 .32 → median 0.31.
    const r = findWornLobes({
      lobes: [
        { id: 'A', maxLift: 0.3 },
        { id: 'B', maxLift: 0.31 },
        { id: 'C', maxLift: 0.33 },
        { id: 'D', maxLift: 0.3 },
        { id: 'E', maxLift: 0.32 },
      ],
      threshold: 0.01,
    });
    expect(r.lobes[0]?.siblingMedian).toBeCloseTo(0.315, 12);
    expect(r.lobes[1]?.siblingMedian).toBeCloseTo(0.31, 12);
    expect(r.worn).toEqual(['A', 'D']);
  });

  it('rejects a single lobe, bad lifts and a bad threshold', () => {
    expect(() => findWornLobes({ lobes: [{ id: 'a', maxLift: 0.3 }], threshold: 0.005 })).toThrow(/lobes/);
    expect(() =>
      findWornLobes({
        lobes: [
          { id: 'a', maxLift: 0.3 },
          { id: 'b', maxLift: Number.NaN },
        ],
        threshold: 0.005,
      }),
    ).toThrow(/lobes\[1\]\.maxLift/);
    expect(() =>
      findWornLobes({
        lobes: [
          { id: 'a', maxLift: 0.3 },
          { id: 'b', maxLift: 0.3 },
        ],
        threshold: 0,
      }),
    ).toThrow(/threshold/);
  });
});

describe('findWornLobes against the stock lobe lift (finding 4)', () => {
  // Demo-like data (invented): every exhaust lobe worn about 0.010 in below a 0.340 in stock lobe.
  const allWorn = [
    { id: '1E', maxLift: 0.3301 },
    { id: '2E', maxLift: 0.3298 },
    { id: '3E', maxLift: 0.3181 },
    { id: '4E', maxLift: 0.3302 },
  ];

  it('regression: when most lobes are worn, the stock lift still flags them', () => {
    // Against siblings alone (the old rule) only 3E stands out; the rest look alike.
    expect(findWornLobes({ lobes: allWorn, threshold: 0.005 }).worn).toEqual(['3E']);
    const r = findWornLobes({ lobes: allWorn, threshold: 0.005, stockLobeLift: 0.34 });
    expect(r.worn).toEqual(['1E', '2E', '3E', '4E']);
    expect(r.stockLobeLift).toBe(0.34);
  });

  it('gives the damage depth the cleanup uses: the larger shortfall, never below 0 (hand-worked)', () => {
    const r = findWornLobes({ lobes: allWorn, threshold: 0.005, stockLobeLift: 0.34 });
    const row = (id: string) => r.lobes.find((l) => l.id === id);
    expect(row('3E')?.stockShortfall).toBeCloseTo(0.0219, 12); // 0.340 − 0.3181
    expect(row('3E')?.damageDepth).toBeCloseTo(0.0219, 12);
    expect(row('1E')?.damageDepth).toBeCloseTo(0.0099, 12); // 0.340 − 0.3301 beats 0.3301 − 0.3301 (siblings)
    const sound = findWornLobes({ lobes: [{ id: '1I', maxLift: 0.34 }], threshold: 0.005, stockLobeLift: 0.333 });
    expect(sound.lobes[0]?.damageDepth).toBe(0);
    expect(sound.worn).toEqual([]);
  });

  it('refuses a bad stock lift and non-object arguments naming the field', () => {
    expect(() => findWornLobes({ lobes: allWorn, threshold: 0.005, stockLobeLift: Number.NaN })).toThrow(/stockLobeLift/);
    expect(() => findWornLobes(undefined as never)).toThrow(CalcInputError);
    expect(() => findWornLobes({ lobes: [null as never, ...allWorn], threshold: 0.005 })).toThrow(/lobes\[0\]/);
  });
});

describe('findWornLobesByKind', () => {
  // Worked by hand (median of the other lobes of the same kind, as findWornLobes defines it):
  // 3I's siblings 0.300 and 0.302 have median 0.301, so 3I is 0.031 in short; 1I's siblings
  // 0.302 and 0.270 have median 0.286, so 1I stands 0.014 in above them.
  const lobes = [
    { id: '1I', maxLift: 0.3 },
    { id: '2I', maxLift: 0.302 },
    { id: '3I', maxLift: 0.27 },
    { id: '1E', maxLift: 0.29 },
  ];

  it('compares intakes with intakes only, and leaves a lone exhaust unjudged with the reason', () => {
    const found = findWornLobesByKind({ lobes, threshold: 0.01 });
    expect(found.worn).toEqual(['3I']);
    expect(found.lobes.map((l) => l.id)).toEqual(['1I', '2I', '3I']);
    expect(found.lobes[2]!.shortfall).toBeCloseTo(0.031, 12);
    expect(found.lobes[0]!.shortfall).toBeCloseTo(-0.014, 12);
    expect(found.unjudged).toEqual([{ id: '1E', note: 'only one exhaust lobe measured: nothing to compare it with' }]);
  });

  it('judges a lone lobe against the stock lobe lift when there is one', () => {
    // 0.295 − 0.290 = 0.005 in below stock: judged, inside a 0.010 in threshold.
    const found = findWornLobesByKind({ lobes, threshold: 0.01, stockLobeLift: 0.295 });
    expect(found.unjudged).toEqual([]);
    const exhaust = found.lobes.find((l) => l.id === '1E')!;
    expect(exhaust.stockShortfall).toBeCloseTo(0.005, 12);
    expect(exhaust.worn).toBe(false);
    // 3I is 0.025 in below stock and 0.031 in below its siblings: the deeper one is the damage.
    expect(found.lobes.find((l) => l.id === '3I')!.damageDepth).toBeCloseTo(0.031, 12);
  });

  it('takes a lobe table at its highest reading', () => {
    expect(tableMaxLifts([{ id: '1I', points: [{ lift: 0.1 }, { lift: 0.31 }, { lift: 0.2 }] }])).toEqual([{ id: '1I', maxLift: 0.31 }]);
  });
});
