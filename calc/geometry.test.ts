import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { displacement, dynamicCompression, pistonDepth, pistonMotion, staticCompression, sweptVolume } from './geometry';

const demoEngine = {
  // Demo data (invented): the 5.9 L V8 of the product's demo scenario.
  bore: 4.03,
  stroke: 3.6,
  chamberCc: 68,
  gasketBore: 4.1,
  gasketThickness: 0.04,
  deckClearance: 0.01,
  pistonCc: 5,
};

describe('pistonDepth', () => {
  it('is 0 at TDC and the full stroke at BDC', () => {
    // Definition of stroke (Heywood, Internal Combustion Engine Fundamentals, ch. 2, fig. 2-1).
    expect(pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: 0 })).toBeCloseTo(0, 12);
    expect(pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: 180 })).toBeCloseTo(3.6, 12);
    expect(pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: 360 })).toBeCloseTo(0, 12);
  });

  it('matches hand-worked right-triangle geometry at 90° and 60°', () => {
    // Hand-worked (Pythagoras on the crank-rod triangle): at 90° the crank pin is level with
    // the main journal, so the wrist pin sits sqrt(l² − r²) above it. With r = 1.8, l = 6:
    // sqrt(36 − 3.24) = 5.723635; TDC height is l + r = 7.8; depth = 7.8 − 5.723635 = 2.076365.
    expect(pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: 90 })).toBeCloseTo(2.0763648, 6);
    // At 60°: pin is r·cos60 = 0.9 up and r·sin60 = 1.558846 across; rod rises
    // sqrt(36 − 2.43) = 5.793962; depth = 7.8 − 0.9 − 5.793962 = 1.106038.
    expect(pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: 60 })).toBeCloseTo(1.1060376, 6);
  });

  it('property: crank, rod and cylinder axis close a triangle (law of cosines)', () => {
    // Independent derivation: with pin height s = l + r − depth above the main journal,
    // the rod length obeys l² = r² + s² − 2·r·s·cos θ (law of cosines). Heywood ch. 2 eq. 2.5
    // is the solved form; here we check the triangle itself.
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 5, noNaN: true }),
        fc.double({ min: 1.6, max: 3, noNaN: true }),
        fc.double({ min: -720, max: 720, noNaN: true }),
        (stroke, rodToStroke, angle) => {
          const r = stroke / 2;
          const l = stroke * rodToStroke;
          const s = l + r - pistonDepth({ stroke, rodLength: l, crankAngle: angle });
          const th = (angle * Math.PI) / 180;
          expect(r * r + s * s - 2 * r * s * Math.cos(th)).toBeCloseTo(l * l, 8);
        },
      ),
    );
  });

  it('tends to simple harmonic motion as the rod grows very long', () => {
    // Limit of the slider-crank as l/r → ∞: depth → r(1 − cos θ) (Heywood ch. 2 discussion of R).
    const d = pistonDepth({ stroke: 3.6, rodLength: 1e6, crankAngle: 75 });
    expect(d).toBeCloseTo(1.8 * (1 - Math.cos((75 * Math.PI) / 180)), 5);
  });

  it('rejects a rod no longer than half the stroke and non-finite input', () => {
    expect(() => pistonDepth({ stroke: 4, rodLength: 1.9, crankAngle: 10 })).toThrow(/rodLength/);
    expect(() => pistonDepth({ stroke: 4, rodLength: 2, crankAngle: 10 })).toThrow(CalcInputError);
    expect(() => pistonDepth({ stroke: -3.6, rodLength: 6, crankAngle: 10 })).toThrow(/stroke/);
    expect(() => pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: Number.NaN })).toThrow(/crankAngle/);
  });
});

describe('pistonMotion', () => {
  it('velocity and acceleration agree with central differences of depth', () => {
    // Independent numerical derivative of pistonDepth (step 1e-3 °).
    const h = 1e-3;
    for (const angle of [5, 37, 90, 123, 250]) {
      const m = pistonMotion({ stroke: 3.6, rodLength: 6, crankAngle: angle });
      const dp = pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: angle + h });
      const dm = pistonDepth({ stroke: 3.6, rodLength: 6, crankAngle: angle - h });
      expect(m.velocity).toBeCloseTo((dp - dm) / (2 * h), 8);
      expect(m.acceleration).toBeCloseTo((dp - 2 * m.depth + dm) / (h * h), 5);
    }
  });

  it('acceleration at TDC is r(1 + r/l) per rad²', () => {
    // From memory (standard slider-crank kinematics, e.g. Heywood ch. 2): piston acceleration at
    // TDC is r·ω²·(1 + r/l). Hand-worked: r = 1.8, l = 6 → 1.8 × 1.3 = 2.34 in/rad²;
    // per degree² multiply by (π/180)² = 3.0461742e-4 → 7.128048e-4 in/deg².
    const m = pistonMotion({ stroke: 3.6, rodLength: 6, crankAngle: 0 });
    expect(m.acceleration).toBeCloseTo(7.128048e-4, 9);
    expect(m.velocity).toBeCloseTo(0, 12);
  });
});

describe('sweptVolume and displacement', () => {
  it('matches a hand-worked cylinder', () => {
    // Hand-worked: π/4 × 4.030² = 12.755573 in²; × 3.600 in = 45.920063 in³;
    // × 16.387064 cc/in³ (NIST SP 811) = 752.4950 cc.
    expect(sweptVolume({ bore: 4.03, stroke: 3.6 })).toBeCloseTo(752.495, 3);
  });

  it('gives the familiar 350 cubic inches for a 4.000 × 3.480 in eight', () => {
    // Hand-worked: π/4 × 16 × 3.48 × 8 = 349.848 in³ (trade rounding calls it 350; common practice).
    const d = displacement({ bore: 4, stroke: 3.48, cylinders: 8 });
    expect(d.cubicInches).toBeCloseTo(349.8478, 3);
    expect(d.cc).toBeCloseTo(349.8478 * 16.387064, 1);
    expect(d.liters).toBeCloseTo(5.733, 3);
  });

  it('rejects bad bore and cylinder counts', () => {
    expect(() => sweptVolume({ bore: -4, stroke: 3.6 })).toThrow(/bore/);
    expect(() => displacement({ bore: 4, stroke: 3.6, cylinders: 2.5 })).toThrow(/cylinders/);
    expect(() => displacement({ bore: 4, stroke: 3.6, cylinders: 0 })).toThrow(/cylinders/);
  });
});

describe('staticCompression', () => {
  it('matches a hand-worked example', () => {
    // Compression ratio definition rc = (Vd + Vc)/Vc (Heywood, ch. 2, eq. 2.3).
    // Hand-worked clearance volume: chamber 68 cc; gasket π/4 × 4.100² × 0.040 in³ = 0.528102 in³
    // = 8.654037 cc; deck π/4 × 4.030² × 0.010 = 0.127556 in³ = 2.090264 cc; dish 5 cc.
    // Vc = 83.744301 cc; Vd = 752.495010 cc; rc = 836.239311 / 83.744301 = 9.98563.
    const r = staticCompression(demoEngine);
    expect(r.clearanceCc).toBeCloseTo(83.7443, 3);
    expect(r.sweptCc).toBeCloseTo(752.495, 3);
    expect(r.ratio).toBeCloseTo(9.98563, 4);
  });

  it('property: CR falls as chamber volume rises', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 40, max: 110, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: -4, max: 20, noNaN: true }),
        (chamberCc, extra, pistonCc) => {
          const a = staticCompression({ ...demoEngine, chamberCc, pistonCc });
          const b = staticCompression({ ...demoEngine, chamberCc: chamberCc + extra, pistonCc });
          expect(b.ratio).toBeLessThan(a.ratio);
        },
      ),
    );
  });

  it('property: a dome (negative pistonCc) raises CR over a dish', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 10, noNaN: true }), (cc) => {
        const dome = staticCompression({ ...demoEngine, pistonCc: -cc });
        const dish = staticCompression({ ...demoEngine, pistonCc: cc });
        expect(dome.ratio).toBeGreaterThan(dish.ratio);
      }),
    );
  });

  it('rejects impossible geometry', () => {
    expect(() => staticCompression({ ...demoEngine, gasketBore: 3.9 })).toThrow(/gasketBore/);
    expect(() => staticCompression({ ...demoEngine, chamberCc: 0 })).toThrow(/chamberCc/);
    expect(() => staticCompression({ ...demoEngine, pistonCc: -90 })).toThrow(/pistonCc/);
    expect(() => staticCompression({ ...demoEngine, gasketThickness: Number.NaN })).toThrow(/gasketThickness/);
    expect(() => staticCompression({ ...demoEngine, bore: Infinity })).toThrow(/bore/);
  });
});

describe('dynamicCompression', () => {
  it('equals the static ratio when the intake closes at BDC', () => {
    // Definition: with IVC at BDC the whole stroke is trapped (Heywood ch. 2, eq. 2.3).
    const s = staticCompression(demoEngine);
    const d = dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: 0 });
    expect(d.ratio).toBeCloseTo(s.ratio, 10);
    expect(d.effectiveStroke).toBeCloseTo(3.6, 12);
  });

  it('matches a hand-worked IVC of 60° ABDC', () => {
    // Hand-worked: IVC 60° ABDC is 240° from TDC; pin r·cos240 = −0.9 in (below the journal),
    // r·sin240 = −1.558846; rod rise sqrt(36 − 2.43) = 5.793962; pin height −0.9 + 5.793962;
    // depth = 7.8 − 4.893962 = 2.906038 in. Trapped swept = 12.755573 × 2.906038 × 16.387064
    // = 607.4386 cc; ratio = (607.4386 + 83.7443)/83.7443 = 8.25349.
    const d = dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: 60 });
    expect(d.effectiveStroke).toBeCloseTo(2.9060376, 6);
    expect(d.trappedSweptCc).toBeCloseTo(607.4386, 3);
    expect(d.ratio).toBeCloseTo(8.25349, 4);
  });

  it('property: a later intake closing traps less', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0.5, max: 20, noNaN: true }), (ivc, later) => {
        const a = dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: ivc });
        const b = dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: ivc + later });
        expect(b.ratio).toBeLessThan(a.ratio);
      }),
    );
  });

  it('rejects a short rod and impossible IVC', () => {
    expect(() => dynamicCompression({ ...demoEngine, rodLength: 1.7, ivcAbdc: 60 })).toThrow(/rodLength/);
    expect(() => dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: 200 })).toThrow(/ivcAbdc/);
    expect(() => dynamicCompression({ ...demoEngine, rodLength: 6, ivcAbdc: Number.NaN })).toThrow(/ivcAbdc/);
  });
});
