import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analysisToJson, analyzeProfile, createAnalysisWorkspace, pistonCurve, type AnalysisInput } from './analysis';
import { checkDegreeing, checkWornLobes } from './checks';
import { degreeCam } from './degree';
import { regrindEnvelope } from './cam-geometry';
import { DEMO_ANALYSIS_INPUT, DEMO_CORE, DEMO_ENGINE, DEMO_FEASIBILITY_INPUT, DEMO_STOCK_REGRIND, DEMO_TOWING } from './demo';
import { CalcInputError } from './errors';
import { valveEvents } from './events';
import { dynamicCompression, staticCompression } from './geometry';
import { lobeLiftAt, offsetAtLiftRaw, synthesizeLobe } from './lift-curve';
import { durationAtHeight } from './measured';
import { ptvSweep } from './ptv';

const idx = (angle: number): number => (angle + 360) / 0.5;

function withProfile(patch: Partial<typeof DEMO_TOWING>): AnalysisInput {
  return { ...DEMO_ANALYSIS_INPUT, profile: { ...DEMO_TOWING, ...patch } };
}

describe('analyzeProfile on the demo engine (demo data, invented)', () => {
  const a = analyzeProfile(DEMO_ANALYSIS_INPUT);

  it('gives events at both checking heights', () => {
    // Hand-worked for 212/220 at 0.050, LSA 112, ICL 108: IVO = 106 − 108 = −2 (2° ATDC),
    // IVC = 108 + 106 − 180 = 34 ABDC; ECL = 224 − 108 = 116; EVO = 110 + 116 − 180 = 46 BBDC;
    // EVC = 110 − 116 = −6; overlap = −8. Advertised 270/278: IVO 27, IVC 63, EVO 75, EVC 23, overlap 50.
    expect(a.events.at050).toMatchObject({ ivoBtdc: -2, ivcAbdc: 34, evoBbdc: 46, evcAtdc: -6, ecl: 116, overlap: -8, advance: 4 });
    expect(a.events.advertised).toMatchObject({ ivoBtdc: 27, ivcAbdc: 63, evoBbdc: 75, evcAtdc: 23, overlap: 50 });
    expect(a.events.advertised.intakeHeight).toBe(0.006);
    const direct = valveEvents({ intakeDuration: 212, exhaustDuration: 220, lsa: 112, icl: 108 });
    expect(a.events.at050.ivcAbdc).toBe(direct.ivcAbdc);
  });

  it('synthesizes valve curves whose checking-height durations read back from the samples', () => {
    // Valve lift = lobe × 1.6 (hydraulic): 0.333 × 1.6 = 0.5328 in at ICL; the 0.050 in tappet
    // point is 0.080 in at the valve, the 0.006 in point 0.0096 in.
    expect(a.intake.valveLift).toBeCloseTo(0.5328, 12);
    expect(a.intake.curve.lift[idx(108)]).toBeCloseTo(0.5328, 12);
    expect(a.exhaust.curve.lift[idx(-116)]).toBeCloseTo(0.544, 12);
    const table = (lift: Float64Array) => Array.from(lift, (v, i) => ({ angle: -360 + i * 0.5, lift: v }));
    expect(durationAtHeight(table(a.intake.curve.lift), 0.08)).toBeCloseTo(212, 1);
    expect(durationAtHeight(table(a.intake.curve.lift), 0.0096)).toBeCloseTo(270, 1);
    expect(durationAtHeight(table(a.exhaust.curve.lift), 0.08)).toBeCloseTo(220, 1);
    expect(a.intake.curve.count).toBe(1441);
    expect(a.intake.peakVelocity).toBeGreaterThan(0);
    expect(a.intake.peakDeceleration).toBeLessThan(0);
  });

  it('samples the piston over the whole cycle with the slider-crank values', () => {
    // Hand-worked (see geometry tests): depth at 90° for r = 1.8, l = 6 is 2.0763648 in; the
    // same at −90°, ±270°; full stroke 3.6 at ±180°; 0 at 0 and ±360°.
    for (const angle of [90, -90, 270, -270]) expect(a.piston.depth[idx(angle)]).toBeCloseTo(2.0763648, 6);
    for (const angle of [180, -180]) expect(a.piston.depth[idx(angle)]).toBeCloseTo(3.6, 12);
    for (const angle of [0, 360, -360]) expect(a.piston.depth[idx(angle)]).toBeCloseTo(0, 12);
    // before TDC the piston rises (depth falling): velocity negative; after TDC positive
    expect(a.piston.velocity[idx(-30)]).toBeLessThan(0);
    expect(a.piston.velocity[idx(30)]).toBeGreaterThan(0);
    expect(a.piston.velocity[idx(-30)]).toBeCloseTo(-(a.piston.velocity[idx(30)] ?? 0), 12);
    expect(pistonCurve({ stroke: 3.6, rodLength: 6 }).acceleration[idx(200)]).toBeCloseTo(a.piston.acceleration[idx(200)] ?? 0, 12);
  });

  it('agrees with the standalone compression functions', () => {
    const s = staticCompression(DEMO_ENGINE);
    expect(a.compression.static.ratio).toBeCloseTo(s.ratio, 12);
    // IVC at the 0.006 in valve-lift reference: 0.006 / 1.6 = 0.00375 in tappet lift on the intake lobe.
    const ivc = 108 + offsetAtLiftRaw(synthesizeLobe(DEMO_TOWING.intake), 0.006 / 1.6) - 180;
    expect(a.compression.dynamic.ivcAbdc).toBeCloseTo(ivc, 12);
    const d = dynamicCompression({ ...DEMO_ENGINE, ivcAbdc: ivc });
    expect(a.compression.dynamic.ratio).toBeCloseTo(d.ratio, 12);
    expect(a.compression.dynamic.convention).toMatch(/0\.006 in valve lift/);
    // the common figure beside it: 0.050 in closing (212/2 + 108 − 180 = 34° ABDC) + 15° = 49° ABDC
    expect(a.compression.dynamic.at050Plus15.ivcAbdc).toBeCloseTo(49, 12);
    expect(a.compression.dynamic.at050Plus15.ratio).toBeCloseTo(dynamicCompression({ ...DEMO_ENGINE, ivcAbdc: 49 }).ratio, 12);
    // displacement: 752.495 cc × 8 = 6019.96 cc (hand-worked from the sweptVolume test)
    expect(a.displacement.cc).toBeCloseTo(6019.96, 1);
  });

  it('sweeps PTV like the standalone sweep on the same curve', () => {
    const alone = ptvSweep({
      stroke: 3.6,
      rodLength: 6,
      valveAngle: 18,
      baseline: { clearance: 0.29 },
      curve: { start: -360, step: 0.5, lift: a.intake.curve.lift },
    });
    expect(a.ptv.intake?.minClearance).toBeCloseTo(alone.minClearance, 12);
    expect(a.ptv.intake?.atAngle).toBe(alone.atAngle);
    // the tightest intake point is after TDC, the tightest exhaust point before it
    expect(a.ptv.intake?.atAngle).toBeGreaterThan(0);
    expect(a.ptv.exhaust?.atAngle).toBeLessThan(0);
  });

  it('checks springs, retainer, PTV, compression and preload', () => {
    // Hand-worked: intake open height 1.800 − 0.5328 = 1.2672; coil-bind margin 1.2672 − 1.150
    // = 0.1172 in (≥ 0.080: pass). Retainer 0.640 − 0.5328 = 0.1072 in (pass).
    // Preload 0.045 − (1.240 − 1.200)/2 = 0.025 in: 0.005 inside the 0.020 minimum → pass at the edge.
    const byId = (id: string, subject: string) => a.checks.find((c) => c.id === id && c.subject === subject);
    expect(byId('coilBind', 'intake')?.value).toBeCloseTo(0.1172, 12);
    expect(byId('coilBind', 'intake')?.status).toBe('pass');
    expect(byId('retainerToSeal', 'intake')?.value).toBeCloseTo(0.1072, 12);
    expect(byId('hydraulicPreload', 'lifters')?.value).toBeCloseTo(0.025, 12);
    expect(a.preload?.restoredPushrodLength).toBeCloseTo(7.42, 12);
    expect(byId('ptvIntake', 'intake')).toBeDefined();
    expect(byId('dynamicCompression', 'engine')?.source).toMatch(/common practice/);
    expect(a.skipped).toEqual([]);
    expect(['pass', 'watch']).toContain(a.status);
  });

  it('skips PTV with a "not measured" note when there is no baseline', () => {
    const r = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, ptvBaseline: undefined });
    expect(r.ptv.intake).toBeNull();
    expect(r.checks.some((c) => c.id === 'ptvIntake' || c.id === 'ptvExhaust')).toBe(false);
    expect(r.skipped.map((s) => s.id)).toEqual(['ptvIntake', 'ptvExhaust']);
    expect(r.skipped[0]?.note).toMatch(/^not measured/);
  });

  it('skips preload on solid lifters and takes lash off the valve lift', () => {
    const r = analyzeProfile({
      ...DEMO_ANALYSIS_INPUT,
      engine: { ...DEMO_ENGINE, lifterType: 'solid-roller' },
      profile: { ...DEMO_TOWING, intake: { ...DEMO_TOWING.intake, lash: 0.018 } },
    });
    expect(r.intake.valveLift).toBeCloseTo(0.5328 - 0.018, 12);
    expect(r.preload).toBeNull();
    expect(r.skipped.find((s) => s.id === 'hydraulicPreload')?.note).toMatch(/solid/);
  });

  it('applies a shop override', () => {
    const r = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, limits: { ptvIntake: { min: 0.5 } } });
    const c = r.checks.find((x) => x.id === 'ptvIntake');
    expect(c?.status).toBe('fail');
    expect(c?.limit).toBe(0.5);
    expect(c?.source).toBe('shop setting');
    expect(r.status).toBe('fail');
  });

  it('gives the same numbers with a reused workspace', () => {
    const ws = createAnalysisWorkspace();
    analyzeProfile(withProfile({ icl: 104 }), { workspace: ws });
    const r = analyzeProfile(DEMO_ANALYSIS_INPUT, { workspace: ws });
    expect(Array.from(r.intake.curve.lift)).toEqual(Array.from(a.intake.curve.lift));
    expect(Array.from(r.piston.acceleration)).toEqual(Array.from(a.piston.acceleration));
    expect(r.ptv.exhaust?.minClearance).toBe(a.ptv.exhaust?.minClearance);
  });

  it('serializes to JSON with plain arrays', () => {
    const json = JSON.parse(JSON.stringify(analysisToJson(a)));
    expect(json.intake.curve.lift).toHaveLength(1441);
    expect(json.intake.curve.lift[idx(108)]).toBeCloseTo(0.5328, 12);
    expect(json.ptv.intake.clearance).toHaveLength(361);
  });
});

describe('analyzeProfile properties', () => {
  it('property: more rocker ratio (more valve lift) never raises the PTV minimum', () => {
    fc.assert(
      fc.property(fc.double({ min: 1.4, max: 1.7, noNaN: true }), fc.double({ min: 0.01, max: 0.15, noNaN: true }), (ratio, more) => {
        const lo = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, rockerRatioIntake: ratio, rockerRatioExhaust: ratio } });
        const hi = analyzeProfile({
          ...DEMO_ANALYSIS_INPUT,
          engine: { ...DEMO_ENGINE, rockerRatioIntake: ratio + more, rockerRatioExhaust: ratio + more },
        });
        expect(hi.ptv.intake?.minClearance ?? 0).toBeLessThan(lo.ptv.intake?.minClearance ?? 0);
        expect(hi.ptv.exhaust?.minClearance ?? 0).toBeLessThan(lo.ptv.exhaust?.minClearance ?? 0);
      }),
      { numRuns: 40 },
    );
  });

  it('property: advancing the cam (smaller ICL) lowers the intake PTV minimum', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 118 }), fc.integer({ min: 1, max: 6 }), (icl, adv) => {
        const late = analyzeProfile(withProfile({ icl }));
        const early = analyzeProfile(withProfile({ icl: icl - adv }));
        expect(early.ptv.intake?.minClearance ?? 0).toBeLessThan(late.ptv.intake?.minClearance ?? 0);
      }),
      { numRuns: 40 },
    );
  });

  it('property: overlap = IVO + EVC and CR falls as chamber volume rises', () => {
    fc.assert(
      fc.property(fc.integer({ min: 55, max: 90 }), fc.double({ min: 0.5, max: 10, noNaN: true }), (chamberCc, extra) => {
        const a = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, chamberCc } });
        const b = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, chamberCc: chamberCc + extra } });
        expect(b.compression.static.ratio).toBeLessThan(a.compression.static.ratio);
        expect(b.compression.dynamic.ratio).toBeLessThan(a.compression.dynamic.ratio);
        expect(a.events.at050.overlap).toBeCloseTo(a.events.at050.ivoBtdc + a.events.at050.evcAtdc, 12);
      }),
      { numRuns: 30 },
    );
  });

  const paths: [string, (input: AnalysisInput, v: number) => AnalysisInput][] = [
    ['engine.bore', (i, v) => ({ ...i, engine: { ...i.engine, bore: v } })],
    ['engine.stroke', (i, v) => ({ ...i, engine: { ...i.engine, stroke: v } })],
    ['engine.rodLength', (i, v) => ({ ...i, engine: { ...i.engine, rodLength: v } })],
    ['engine.chamberCc', (i, v) => ({ ...i, engine: { ...i.engine, chamberCc: v } })],
    ['engine.rockerRatioIntake', (i, v) => ({ ...i, engine: { ...i.engine, rockerRatioIntake: v } })],
    ['engine.spring.rate', (i, v) => ({ ...i, engine: { ...i.engine, spring: { ...i.engine.spring, rate: v } } })],
    ['engine.spring.retainerToSeal', (i, v) => ({ ...i, engine: { ...i.engine, spring: { ...i.engine.spring, retainerToSeal: v } } })],
    ['profile.lsa', (i, v) => ({ ...i, profile: { ...i.profile, lsa: v } })],
    ['profile.icl', (i, v) => ({ ...i, profile: { ...i.profile, icl: v } })],
    ['profile.intake.duration050', (i, v) => ({ ...i, profile: { ...i.profile, intake: { ...i.profile.intake, duration050: v } } })],
    ['profile.exhaust.lobeLift', (i, v) => ({ ...i, profile: { ...i.profile, exhaust: { ...i.profile.exhaust, lobeLift: v } } })],
    ['ptvBaseline.intake.clearance', (i, v) => ({ ...i, ptvBaseline: { ...i.ptvBaseline, intake: { clearance: v } } })],
    ['regrind.originalPreload', (i, v) => ({ ...i, regrind: { originalPreload: v, stockBaseCircle: 1.24 } })],
  ];

  it('property: every field rejects NaN and infinities with a CalcInputError naming it', () => {
    fc.assert(
      fc.property(fc.constantFrom(...paths), fc.constantFrom(Number.NaN, Infinity, -Infinity), ([field, set], bad) => {
        try {
          analyzeProfile(set(DEMO_ANALYSIS_INPUT, bad));
          expect.unreachable(`expected ${field} to be rejected`);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcInputError);
          expect((error as CalcInputError).field).toBe(field);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('rejects physically impossible engines and profiles', () => {
    const cases: [AnalysisInput, RegExp][] = [
      [{ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, rodLength: 1.7 } }, /engine.rodLength/],
      [{ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, bore: -4 } }, /engine.bore/],
      [{ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, cylinders: 0 } }, /engine.cylinders/],
      [{ ...DEMO_ANALYSIS_INPUT, engine: { ...DEMO_ENGINE, lifterType: 'mushroom' as never } }, /engine.lifterType/],
      [withProfile({ intake: { ...DEMO_TOWING.intake, duration050: 0 } }), /profile.intake.duration050/],
      [withProfile({ intake: { ...DEMO_TOWING.intake, duration050: 365 } }), /profile.intake.duration050/],
      [withProfile({ intake: { ...DEMO_TOWING.intake, lash: 0.02 } }), /profile.intake.lash: must be 0 with hydraulic/],
      [withProfile({ exhaust: { ...DEMO_TOWING.exhaust, lobeLift: 1.5 } }), /profile.exhaust.lobeLift/],
      [{ ...DEMO_ANALYSIS_INPUT, engine: undefined as never }, /engine: is required/],
    ];
    for (const [input, message] of cases) expect(() => analyzeProfile(input)).toThrow(message);
  });
});

describe('checkDegreeing and checkWornLobes', () => {
  it('grade a degreed-in cam by its ICL error', () => {
    // Common practice, no source: within 1° is fine, 1–2° worth a look, over 2° move the cam.
    expect(checkDegreeing(degreeCam({ openingAngle: 84, closingAngle: 130, sheetIcl: 106.5 })).status).toBe('pass');
    expect(checkDegreeing(degreeCam({ openingAngle: 85, closingAngle: 131, sheetIcl: 106.5 })).status).toBe('watch');
    expect(checkDegreeing(degreeCam({ openingAngle: 86, closingAngle: 134, sheetIcl: 106.5 })).status).toBe('fail');
  });

  it('flag the demo worn exhaust lobe', () => {
    // Demo data (invented): 3E sits 0.012 in under its siblings.
    const { result, checks } = checkWornLobes([
      { id: '1E', maxLift: 0.3362 },
      { id: '2E', maxLift: 0.3358 },
      { id: '3E', maxLift: 0.3241 },
      { id: '4E', maxLift: 0.3365 },
    ]);
    expect(result.worn).toEqual(['3E']);
    expect(checks.find((c) => c.subject === '3E')?.status).toBe('fail');
    expect(checks.find((c) => c.subject === '1E')?.status).toBe('pass');
  });
});

describe('dynamic compression at one reference lift (finding 3)', () => {
  it('regression: the same lobe quoted at 0.006 in or 0.020 in gives the same dynamic CR', () => {
    // Sheet B describes sheet A's intake lobe at a 0.020 in advertised height. The old rule took IVC at
    // each sheet's own advertised height, so the two differed by the ~10° between those heights.
    const shape = synthesizeLobe(DEMO_TOWING.intake);
    const advertised020 = 2 * offsetAtLiftRaw(shape, 0.02);
    const a = analyzeProfile(DEMO_ANALYSIS_INPUT);
    const b = analyzeProfile(withProfile({ intake: { ...DEMO_TOWING.intake, advertisedHeight: 0.02, advertisedDuration: advertised020 } }));
    expect(Math.abs(a.compression.dynamic.ratio - b.compression.dynamic.ratio)).toBeLessThan(0.05);
    expect(a.events.advertised.ivcAbdc - b.events.advertised.ivcAbdc).toBeGreaterThan(5);
    expect(a.checks.find((c) => c.id === 'dynamicCompression')?.rule).toMatch(/0\.006 in valve lift/);
    expect(a.compression.dynamic.source).toMatch(/SAE J604/);
  });

  it('regression: lash on solid lifters closes the valve earlier and raises dynamic CR', () => {
    const solid = { ...DEMO_ENGINE, lifterType: 'solid-roller' as const };
    const tight = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, engine: solid });
    const lashed = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, engine: solid, profile: { ...DEMO_TOWING, intake: { ...DEMO_TOWING.intake, lash: 0.02 } } });
    expect(lashed.compression.dynamic.ivcAbdc).toBeLessThan(tight.compression.dynamic.ivcAbdc - 1);
    expect(lashed.compression.dynamic.ratio).toBeGreaterThan(tight.compression.dynamic.ratio);
    expect(lashed.compression.dynamic.convention).toMatch(/lash/);
  });
});

describe('feasibility of the towing profile on the demo core (demo data, invented)', () => {
  const a = analyzeProfile(DEMO_FEASIBILITY_INPUT);
  const f = a.feasibility;

  it('cuts 1.240 − 1.200 = 0.040 in and matches the standalone envelope', () => {
    expect(f.cut).toBeCloseTo(0.04, 12);
    const core = synthesizeLobe(DEMO_CORE.exhaust);
    const cand = synthesizeLobe(DEMO_TOWING.exhaust);
    const cam = (shape: ReturnType<typeof synthesizeLobe>) => ({
      start: -180,
      step: 1,
      lift: Array.from({ length: 360 }, (_, i) => lobeLiftAt(shape, 2 * (i - 180)).lift),
    });
    // exhaust centres: towing ECL 2·112 − 108 = 116, core 2·114 − 110 = 118 crank ° BTDC, so the towing lobe sits 1 cam degree later
    const alone = regrindEnvelope({
      core: cam(core),
      candidate: cam(cand),
      baseCircle: 1.24,
      cut: 0.04,
      phase: 1,
      follower: { kind: 'roller', rollerDiameter: 0.75 },
      finishingStock: 0.005,
      step: 1,
    });
    expect(f.exhaust.envelope?.phase).toBeCloseTo(1, 12);
    expect(f.exhaust.envelope?.minMargin).toBeCloseTo(alone.minMargin, 9);
  });

  it('shows why the towing lobe does not fit at the cleanup cut', () => {
    // Nose bound (hand-worked): 0.315 + 0.020 − 0.012 − 0.005 = 0.318 in < 0.340 in towing exhaust lobe.
    expect(f.cleanup?.cleanupCut).toBeCloseTo(0.034, 12);
    expect(f.cleanup?.largestLift).toBeCloseTo(0.318, 12);
    expect(f.exhaust.envelope?.status).toBe('fail');
    expect(a.checks.find((c) => c.id === 'finishingStock' && c.subject === 'exhaust')?.status).toBe('fail');
    expect(a.checks.find((c) => c.id === 'cleanup')?.status).toBe('pass');
    expect(a.checks.find((c) => c.id === 'largestCut')?.status).toBe('pass');
    expect(a.status).toBe('fail');
  });

  it('the stock regrind fits with half the cut of margin everywhere', () => {
    const s = analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, profile: DEMO_STOCK_REGRIND });
    expect(s.feasibility.intake.envelope?.minMargin).toBeCloseTo(0.02, 12);
    expect(s.feasibility.exhaust.envelope?.status).toBe('pass');
  });

  it('reports pressure angle and curvature on both lobes against their limits', () => {
    for (const lobe of [f.intake, f.exhaust]) {
      expect(lobe.pressureAngle?.rise.value).toBeGreaterThan(10);
      expect(lobe.pressureAngle?.rise.at).toBeLessThan(0); // the rise is the opening flank
      expect(lobe.curvature?.undercut).toBe(false);
      expect(lobe.curvature?.minPitch?.at).toBeCloseTo(0, 9); // tightest at the nose
    }
    expect(a.checks.filter((c) => c.id === 'pressureAngle').map((c) => c.status)).toEqual(['pass', 'pass']);
    expect(a.checks.find((c) => c.id === 'pressureAngle')?.source).toMatch(/Norton/);
  });

  it('says what the cut does to preload and pushrods', () => {
    expect(f.lifter?.preloadLeft).toBeCloseTo(0.025, 12);
    expect(f.lifter?.restoredPushrodLength).toBeCloseTo(7.42, 12);
    expect(f.lifter?.largestCutStockPushrods).toBeCloseTo(0.05, 12);
  });

  it('serializes the margin as a plain array', () => {
    const json = analysisToJson(a);
    expect(Array.isArray(json.feasibility.exhaust.envelope?.margin)).toBe(true);
    expect(json.feasibility.exhaust.envelope?.margin).toHaveLength(360);
  });

  it('gives the same numbers with a reused workspace', () => {
    const ws = createAnalysisWorkspace();
    analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, profile: DEMO_STOCK_REGRIND }, { workspace: ws });
    const again = analyzeProfile(DEMO_FEASIBILITY_INPUT, { workspace: ws });
    expect(again.feasibility.exhaust.envelope?.minMargin).toBe(f.exhaust.envelope?.minMargin);
  });

  it('refuses a regrind base circle larger than the core, and bad grinding numbers', () => {
    expect(() => analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, regrind: undefined, profile: { ...DEMO_TOWING, baseCircle: 1.3 } })).toThrow(/profile.baseCircle/);
    expect(() => analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, grinding: { rollerDiameter: Number.NaN } })).toThrow(/grinding.rollerDiameter/);
    expect(() => analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, core: 'stock' as never })).toThrow(/^core/);
  });
});
