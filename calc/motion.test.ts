import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { MOTION_LAWS, motionLaw, motionLawInverse, type MotionLawName } from './motion';

function peaks(law: MotionLawName): { v: number; a: number; j: number } {
  let v = 0;
  let a = 0;
  let j = 0;
  const n = 200000;
  for (let i = 0; i <= n; i++) {
    const p = motionLaw(law, i / n);
    v = Math.max(v, Math.abs(p.v));
    a = Math.max(a, Math.abs(p.a));
    j = Math.max(j, Math.abs(p.j));
  }
  return { v, a, j };
}

describe('motionLaw', () => {
  it('every law rises from 0 to 1 and starts and ends at rest', () => {
    // Boundary conditions of a full rise (Norton, Cam Design and Manufacturing Handbook, ch. 3;
    // Rothbart, Cam Design Handbook, ch. 2) — from memory.
    for (const law of MOTION_LAWS) {
      const start = motionLaw(law, 0);
      const end = motionLaw(law, 1);
      expect(start.s).toBeCloseTo(0, 14);
      expect(end.s).toBeCloseTo(1, 14);
      expect(start.v).toBeCloseTo(0, 12);
      expect(end.v).toBeCloseTo(0, 12);
      expect(start.a).toBeCloseTo(0, 12);
      expect(end.a).toBeCloseTo(0, 12);
      expect(motionLaw(law, 0.5).s).toBeCloseTo(0.5, 14);
    }
  });

  it('cycloidal peak coefficients: v = 2, a = 2π, j = 4π²', () => {
    // Rothbart, Cam Design Handbook, ch. 2, table of dimensionless peak factors; Norton ch. 3
    // (from memory): cycloidal Cv = 2.000, Ca = 6.283, Cj = 39.48.
    const p = peaks('cycloidal');
    expect(p.v).toBeCloseTo(2, 6);
    expect(p.a).toBeCloseTo(6.283, 3);
    expect(p.j).toBeCloseTo(39.478, 3);
  });

  it('3-4-5 polynomial peak coefficients: v 1.875, a 5.7735, j 60', () => {
    // Rothbart ch. 2 / Norton ch. 3 (from memory): 3-4-5 Cv = 1.875, Ca = 5.7735, Cj = 60.
    const p = peaks('poly345');
    expect(p.v).toBeCloseTo(1.875, 6);
    expect(p.a).toBeCloseTo(5.7735, 4);
    expect(p.j).toBeCloseTo(60, 6);
  });

  it('4-5-6-7 polynomial peak coefficients: v 2.1875, a 7.5132, j 52.5', () => {
    // Rothbart ch. 2 / Norton ch. 3 (from memory): 4-5-6-7 Cv = 2.1875, Ca = 7.5132, Cj = 52.5.
    const p = peaks('poly4567');
    expect(p.v).toBeCloseTo(2.1875, 6);
    expect(p.a).toBeCloseTo(7.5132, 4);
    expect(p.j).toBeCloseTo(52.5, 3);
  });

  it('property: v, a and j are the derivatives of s, a and v (central differences)', () => {
    // Independent numerical differentiation, not the closed forms.
    const h = 1e-5;
    fc.assert(
      fc.property(fc.constantFrom(...MOTION_LAWS), fc.double({ min: 0.001, max: 0.999, noNaN: true }), (law, x) => {
        const p = motionLaw(law, x);
        const up = motionLaw(law, x + h);
        const dn = motionLaw(law, x - h);
        expect(p.v).toBeCloseTo((up.s - dn.s) / (2 * h), 6);
        expect(p.a).toBeCloseTo((up.v - dn.v) / (2 * h), 5);
        expect(p.j).toBeCloseTo((up.a - dn.a) / (2 * h), 3);
      }),
    );
  });

  it('property: s is antisymmetric about the midpoint, s(x) + s(1 − x) = 1', () => {
    // Symmetry of a full-rise law with equal end conditions (Norton ch. 3, from memory).
    fc.assert(
      fc.property(fc.constantFrom(...MOTION_LAWS), fc.double({ min: 0, max: 1, noNaN: true }), (law, x) => {
        expect(motionLaw(law, x).s + motionLaw(law, 1 - x).s).toBeCloseTo(1, 12);
      }),
    );
  });

  it('property: the inverse finds x back from s', () => {
    fc.assert(
      fc.property(fc.constantFrom(...MOTION_LAWS), fc.double({ min: 0, max: 1, noNaN: true }), (law, x) => {
        const s = motionLaw(law, x).s;
        expect(motionLaw(law, motionLawInverse(law, s)).s).toBeCloseTo(s, 13);
      }),
    );
  });

  it('rejects x outside [0, 1], NaN and unknown laws', () => {
    expect(() => motionLaw('poly345', 1.2)).toThrow(CalcInputError);
    expect(() => motionLaw('poly345', -0.1)).toThrow(/x/);
    expect(() => motionLaw('cycloidal', Number.NaN)).toThrow(/finite/);
    expect(() => motionLaw('harmonic' as MotionLawName, 0.5)).toThrow(/law/);
    expect(() => motionLawInverse('poly4567', 1.5)).toThrow(/s/);
  });
});
