import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  pitchCurvature,
  pressureAngle,
  regrindEnvelope,
  symmetricCurvatureRaw,
  symmetricPressureAngleRaw,
  type CamLobeSamples,
  type SymmetricFlank,
} from './cam-geometry';
import { CalcInputError } from './errors';
import { createLobeTable, fillLobeTableRaw, lobeLiftAt, synthesizeLobe, type LobeShape } from './lift-curve';

const RAD = 180 / Math.PI;
const TOWING_INTAKE = { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 };

/** Tappet lift of a synthesised lobe against cam degrees from its centre (a cam degree is two crank degrees). */
function camSamples(shape: LobeShape, step = 0.5, scale = 1): CamLobeSamples {
  const lift: number[] = [];
  const velocity: number[] = [];
  const acceleration: number[] = [];
  for (let theta = -180; theta < 180 - 1e-9; theta += step) {
    const p = lobeLiftAt(shape, 2 * theta);
    lift.push(scale * p.lift);
    velocity.push(scale * 2 * p.velocity);
    acceleration.push(scale * 4 * p.acceleration);
  }
  return { start: -180, step, lift, velocity, acceleration };
}

/**
 * Worked example: a circular disc of radius R turning about a point e from its
 * centre (an eccentric cam). Elementary geometry (hand-derived, law of sines in
 * the triangle cam centre, disc centre, roller centre): the roller centre runs
 * on a circle of radius R + Rr about the disc centre, so
 *   r(θ) = e·cos θ + √((R + Rr)² − e²·sin² θ),  sin φ = e·sin θ / (R + Rr),
 * the pitch radius of curvature is R + Rr and the surface radius R everywhere.
 * For a flat face the lift is e(1 + cos θ) and ρ = Rb + s + s″ = R.
 */
function eccentric(R: number, e: number, rollerRadius: number, step = 0.5): CamLobeSamples {
  const a = R + rollerRadius;
  const r = (t: number) => e * Math.cos(t) + Math.sqrt(a * a - e * e * Math.sin(t) ** 2);
  const rp = R - e + rollerRadius;
  const lift: number[] = [];
  const velocity: number[] = [];
  const acceleration: number[] = [];
  const h = 1e-4;
  for (let deg = -180; deg < 180 - 1e-9; deg += step) {
    const t = deg / RAD;
    lift.push(r(t) - rp);
    velocity.push((r(t + h) - r(t - h)) / (2 * h) / RAD);
    acceleration.push((r(t + h) - 2 * r(t) + r(t - h)) / (h * h) / (RAD * RAD));
  }
  return { start: -180, step, lift, velocity, acceleration };
}

/** The eccentric disc under a flat face: the lift is its support function less the base radius, e(1 + cos θ). */
function eccentricFlat(e: number, step = 0.5): CamLobeSamples {
  const lift: number[] = [];
  const velocity: number[] = [];
  const acceleration: number[] = [];
  for (let deg = -180; deg < 180 - 1e-9; deg += step) {
    const t = deg / RAD;
    lift.push(e * (1 + Math.cos(t)));
    velocity.push((-e * Math.sin(t)) / RAD);
    acceleration.push((-e * Math.cos(t)) / (RAD * RAD));
  }
  return { start: -180, step, lift, velocity, acceleration };
}

describe('pressureAngle', () => {
  it('matches the eccentric cam: sin φ = e·sin θ / (R + Rr) (hand-derived, law of sines)', () => {
    const R = 0.8;
    const e = 0.15;
    const Rr = 0.375;
    const lobe = eccentric(R, e, Rr);
    const result = pressureAngle({ lobe, baseCircle: 2 * (R - e), rollerDiameter: 2 * Rr });
    for (const deg of [-150, -90, -30, 10, 60, 120]) {
      const i = (deg + 180) / 0.5;
      // lift falls as θ grows on 0…180° here (the disc's far side is at θ = 0), so the sign is reversed
      expect(result.angles[i]).toBeCloseTo(-Math.asin((e * Math.sin(deg / RAD)) / (R + Rr)) * RAD, 5);
    }
    expect(result.rise.value).toBeCloseTo(Math.asin(e / (R + Rr)) * RAD, 5);
    expect(result.rise.at).toBeCloseTo(-90, 0);
    expect(result.fall.at).toBeCloseTo(90, 0);
  });

  it('falls back on central differences when no velocity is given', () => {
    const lobe = eccentric(0.8, 0.15, 0.375);
    const exact = pressureAngle({ lobe, baseCircle: 1.3, rollerDiameter: 0.75 });
    const approx = pressureAngle({ lobe: { start: lobe.start, step: lobe.step, lift: lobe.lift }, baseCircle: 1.3, rollerDiameter: 0.75 });
    expect(approx.rise.value).toBeCloseTo(exact.rise.value, 3);
  });

  it('property: pressure angle grows as the base circle shrinks', () => {
    const lobe = camSamples(synthesizeLobe(TOWING_INTAKE));
    fc.assert(
      fc.property(fc.double({ min: 0.6, max: 2, noNaN: true }), fc.double({ min: 0.01, max: 0.5, noNaN: true }), (base, less) => {
        const big = pressureAngle({ lobe, baseCircle: base, rollerDiameter: 0.75 });
        const small = pressureAngle({ lobe, baseCircle: base - less, rollerDiameter: 0.75 });
        expect(small.rise.value).toBeGreaterThan(big.rise.value);
        expect(small.fall.value).toBeGreaterThan(big.fall.value);
      }),
    );
  });

  it('refuses missing, non-object and oversized arguments naming the field', () => {
    expect(() => pressureAngle(undefined as never)).toThrow(CalcInputError);
    expect(() => pressureAngle({ lobe: 'x' as never, baseCircle: 1.2, rollerDiameter: 0.75 })).toThrow(/^lobe/);
    expect(() => pressureAngle({ lobe: { start: 0, step: 0.01, lift: new Array(20000).fill(0) }, baseCircle: 1.2, rollerDiameter: 0.75 })).toThrow(/lobe.lift/);
    expect(() => pressureAngle({ lobe: eccentric(0.8, 0.15, 0.375), baseCircle: Number.NaN, rollerDiameter: 0.75 })).toThrow(/baseCircle/);
  });
});

describe('pitchCurvature', () => {
  it('matches the eccentric cam: pitch radius R + Rr, surface radius R (hand-derived)', () => {
    const R = 0.8;
    const e = 0.15;
    const roller = pitchCurvature({ lobe: eccentric(R, e, 0.375), baseCircle: 2 * (R - e), follower: { kind: 'roller', rollerDiameter: 0.75 } });
    expect(roller.minPitch?.value).toBeCloseTo(R + 0.375, 5);
    expect(roller.minSurface.value).toBeCloseTo(R, 5);
    expect(roller.undercut).toBe(false);
    expect(roller.concave).toBeNull();
    const flat = pitchCurvature({ lobe: eccentricFlat(e), baseCircle: 2 * (R - e), follower: { kind: 'flat' } });
    expect(flat.minSurface.value).toBeCloseTo(R, 5);
    expect(flat.pitch).toBeNull();
    expect(flat.undercut).toBe(false);
  });

  it('agrees with the curvature of the pitch curve drawn in x, y (κ = (x′y″ − y′x″)/(x′² + y′²)^{3/2})', () => {
    // Plane-curve curvature of a parametric curve (any calculus text; from memory), by central differences.
    const shape = synthesizeLobe(TOWING_INTAKE);
    const rp = 0.6 + 0.375;
    const lobe = camSamples(shape, 0.25);
    const result = pitchCurvature({ lobe, baseCircle: 1.2, follower: { kind: 'roller', rollerDiameter: 0.75 } });
    const r = (deg: number) => rp + lobeLiftAt(shape, 2 * deg).lift;
    const h = 0.01;
    for (const deg of [-50, -20, 0, 15, 35]) {
      const pt = (d: number) => [r(d) * Math.cos(d / RAD), r(d) * Math.sin(d / RAD)] as const;
      const [x0, y0] = pt(deg - h);
      const [x1, y1] = pt(deg);
      const [x2, y2] = pt(deg + h);
      const xp = (x2 - x0) / (2 * h);
      const yp = (y2 - y0) / (2 * h);
      const xpp = (x2 - 2 * x1 + x0) / (h * h);
      const ypp = (y2 - 2 * y1 + y0) / (h * h);
      const kappa = (xp * ypp - yp * xpp) / (xp * xp + yp * yp) ** 1.5;
      const i = (deg + 180) / 0.25;
      expect(result.pitch?.[i]).toBeCloseTo(1 / kappa, 3);
    }
  });

  it('flags undercut on a small base circle with a big roller, and a flat tappet whose nose radius goes negative', () => {
    const lobe = camSamples(synthesizeLobe(TOWING_INTAKE));
    expect(pitchCurvature({ lobe, baseCircle: 0.3, follower: { kind: 'roller', rollerDiameter: 0.9 } }).undercut).toBe(true);
    expect(pitchCurvature({ lobe, baseCircle: 1.2, follower: { kind: 'roller', rollerDiameter: 0.75 } }).undercut).toBe(false);
    // flat face: ρ = Rb + s + s″ at the nose = 0.6 + 0.333 − (nose deceleration per rad²) < 0
    const flat = pitchCurvature({ lobe, baseCircle: 1.2, follower: { kind: 'flat' } });
    expect(flat.undercut).toBe(true);
    expect(flat.minSurface.value).toBeLessThanOrEqual(0);
    expect(flat.minSurface.at).toBeCloseTo(0, 6);
  });

  it('finds a concave flank on a tiny base circle and compares it with the grinding wheel', () => {
    const lobe = camSamples(synthesizeLobe(TOWING_INTAKE));
    const tight = pitchCurvature({ lobe, baseCircle: 0.2, follower: { kind: 'roller', rollerDiameter: 0.1 }, wheelDiameter: 20 });
    expect(tight.concave).not.toBeNull();
    expect(tight.wheelTooLarge).toBe(true);
    const small = pitchCurvature({ lobe, baseCircle: 0.2, follower: { kind: 'roller', rollerDiameter: 0.1 }, wheelDiameter: 0.001 });
    expect(small.wheelTooLarge).toBe(false);
    expect(pitchCurvature({ lobe, baseCircle: 1.2, follower: { kind: 'roller', rollerDiameter: 0.75 } }).wheelTooLarge).toBeNull();
  });

  it('refuses a follower it does not know', () => {
    const lobe = eccentric(0.8, 0.15, 0);
    expect(() => pitchCurvature({ lobe, baseCircle: 1.3, follower: { kind: 'mushroom' } as never })).toThrow(/follower.kind/);
    expect(() => pitchCurvature({ lobe, baseCircle: 1.3, follower: undefined as never })).toThrow(/follower/);
  });
});

describe('regrindEnvelope', () => {
  const core = camSamples(synthesizeLobe(TOWING_INTAKE));

  it('property: a candidate equal to the core with a zero cut has zero margin everywhere', () => {
    fc.assert(
      fc.property(fc.constantFrom<'roller' | 'flat'>('roller', 'flat'), (kind) => {
        const follower = kind === 'roller' ? { kind, rollerDiameter: 0.75 } : { kind };
        const r = regrindEnvelope({ core, candidate: core, baseCircle: 1.24, cut: 0, phase: 0, follower, finishingStock: 0 });
        for (const m of r.margin) expect(Math.abs(m)).toBeLessThan(1e-15);
        expect(r.inside).toBe(true);
        expect(r.status).toBe('pass');
      }),
      { numRuns: 4 },
    );
  });

  it('gives half the cut everywhere for the same lobe on a smaller base circle (hand-worked)', () => {
    const r = regrindEnvelope({
      core,
      candidate: core,
      baseCircle: 1.24,
      cut: 0.04,
      phase: 0,
      follower: { kind: 'roller', rollerDiameter: 0.75 },
      finishingStock: 0.005,
    });
    expect(r.minMargin).toBeCloseTo(0.02, 14);
    expect(Math.max(...r.margin)).toBeCloseTo(0.02, 14);
    expect(r.status).toBe('pass');
  });

  it('finds the nose of a higher lobe and the flank of a shifted one', () => {
    // Hand-worked: 5 % more lift is 0.01665 in more at the nose, so the margin there is 0.02 − 0.01665.
    const taller = camSamples(synthesizeLobe(TOWING_INTAKE), 0.5, 1.05);
    const r = regrindEnvelope({ core, candidate: taller, baseCircle: 1.24, cut: 0.04, phase: 0, follower: { kind: 'flat' }, finishingStock: 0.005 });
    expect(r.minMargin).toBeCloseTo(0.02 - 0.05 * 0.333, 12);
    expect(r.minAt).toBeCloseTo(0, 9);
    expect(r.status).toBe('fail');
    const shifted = regrindEnvelope({ core, candidate: core, baseCircle: 1.24, cut: 0.04, phase: 4, follower: { kind: 'flat' }, finishingStock: 0.005 });
    // moving the lobe 4 cam degrees later leaves the candidate above the core on its closing flank
    expect(shifted.minMargin).toBeLessThan(0);
    expect(shifted.minAt).toBeGreaterThan(0);
    expect(shifted.inside).toBe(false);
  });

  it('refuses a cut past the base circle and bad arguments, naming the field', () => {
    const follower = { kind: 'flat' as const };
    expect(() => regrindEnvelope({ core, candidate: core, baseCircle: 1.24, cut: 1.3, phase: 0, follower, finishingStock: 0 })).toThrow(/^cut/);
    expect(() => regrindEnvelope({ core, candidate: core, baseCircle: 1.24, cut: -0.01, phase: 0, follower, finishingStock: 0 })).toThrow(/^cut/);
    expect(() => regrindEnvelope({ core: null as never, candidate: core, baseCircle: 1.24, cut: 0, phase: 0, follower, finishingStock: 0 })).toThrow(/^core/);
    expect(() => regrindEnvelope({ core, candidate: core, baseCircle: 1.24, cut: 0, phase: Number.NaN, follower, finishingStock: 0 })).toThrow(/^phase/);
  });
});

describe('one-flank kernels of a symmetric lobe', () => {
  // The analysis samples one flank of each lobe (fillLobeTableRaw, 0.5 crank degree steps) and reads every
  // fourth entry as a cam degree; its peaks must be the ones the full scan of both flanks finds.
  const specs = fc.record({
    duration050: fc.double({ min: 190, max: 240, noNaN: true }),
    spread: fc.double({ min: 52, max: 64, noNaN: true }),
    lobeLift: fc.double({ min: 0.28, max: 0.36, noNaN: true }),
    baseCircle: fc.double({ min: 1, max: 1.3, noNaN: true }),
    roller: fc.double({ min: 0.6, max: 0.9, noNaN: true }),
  });

  function window(shape: LobeShape, reach: number): CamLobeSamples {
    const lift: number[] = [];
    const velocity: number[] = [];
    const acceleration: number[] = [];
    for (let d = -reach; d <= reach; d++) {
      const p = lobeLiftAt(shape, 2 * d);
      lift.push(p.lift);
      velocity.push(2 * p.velocity);
      acceleration.push(4 * p.acceleration);
    }
    return { start: -reach, step: 1, lift, velocity, acceleration };
  }

  it('property: pressure angle and curvature from one flank equal the full two-flank scan', () => {
    fc.assert(
      fc.property(specs, ({ duration050, spread, lobeLift, baseCircle, roller }) => {
        let shape: LobeShape;
        try {
          shape = synthesizeLobe({ duration050, advertisedDuration: duration050 + spread, advertisedHeight: 0.006, lobeLift });
        } catch {
          return; // a sheet synthesis refuses is not a lobe
        }
        const reach = Math.floor(shape.halfEvent / 2) + 1;
        const table = fillLobeTableRaw(shape, 0.5, 4 * reach + 1, createLobeTable(0));
        const flank: SymmetricFlank = {
          lift: table.lift,
          speed: table.velocity,
          acceleration: table.acceleration,
          count: table.count,
          stride: 4,
          velocityScale: 2,
          accelerationScale: 4,
        };
        const full = window(shape, reach);
        const pa = pressureAngle({ lobe: full, baseCircle, rollerDiameter: roller });
        const p = symmetricPressureAngleRaw(flank, reach, 0, 1, (baseCircle + roller) / 2);
        expect(Math.atan(p.riseTan) * RAD).toBeCloseTo(pa.rise.value, 10);
        expect(Math.atan(p.fallTan) * RAD).toBeCloseTo(pa.fall.value, 10);
        expect(p.riseAt).toBe(pa.rise.at);
        expect(p.fallAt).toBe(pa.fall.at);
        for (const follower of [{ kind: 'roller' as const, rollerDiameter: roller }, { kind: 'flat' as const }]) {
          const c = pitchCurvature({ lobe: full, baseCircle, follower });
          const x = symmetricCurvatureRaw(flank, reach, 0, 1, baseCircle / 2, follower.kind === 'roller' ? roller / 2 : 0);
          expect(x.minSurface).toBeCloseTo(c.minSurface.value, 9);
          expect(x.minSurfaceAt).toBe(c.minSurface.at);
          expect(x.undercut).toBe(c.undercut);
          if (follower.kind === 'roller') {
            expect(x.minPitch).toBeCloseTo(c.minPitch?.value ?? Number.NaN, 9);
            expect(x.concaveCurvature > 0).toBe(c.concave !== null);
            if (c.concave !== null) {
              expect(1 / x.concaveCurvature).toBeCloseTo(c.concave.value, 6);
              expect(x.concaveAt).toBe(c.concave.at);
            }
          }
        }
      }),
      { numRuns: 60 },
    );
  });
});
