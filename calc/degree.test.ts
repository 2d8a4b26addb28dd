import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { centerlineFromReadings, degreeCam } from './degree';
import { lobeLiftAt, synthesizeLobe } from './lift-curve';

describe('centerlineFromReadings', () => {
  it('matches a hand-worked wheel reading', () => {
    // Equal-lift method (common practice, no source): 0.050 in before max lift at 84° ATDC and
    // 0.050 in after at 130° ATDC → centreline (84 + 130)/2 = 107° ATDC.
    expect(centerlineFromReadings({ openingAngle: 84, closingAngle: 130 })).toBeCloseTo(107, 12);
    // Readings straddling TDC: −4° (4° BTDC) and 216° ATDC → 106°.
    expect(centerlineFromReadings({ openingAngle: -4, closingAngle: 216 })).toBeCloseTo(106, 12);
  });

  it('property: recovers the centre of a synthesized symmetric lobe from any equal lift', () => {
    // Independent check: find the equal-lift angles on a lobe of known centre by bisection.
    const shape = synthesizeLobe({ duration050: 218, advertisedDuration: 274, advertisedHeight: 0.006, lobeLift: 0.34 });
    fc.assert(
      fc.property(fc.double({ min: 95, max: 120, noNaN: true }), fc.double({ min: 0.01, max: 0.3, noNaN: true }), (icl, lift) => {
        const find = (lo: number, hi: number): number => {
          // lift falls from lo (near the centre) to hi (far flank)
          for (let i = 0; i < 80; i++) {
            const mid = (lo + hi) / 2;
            if (lobeLiftAt(shape, mid).lift > lift) lo = mid;
            else hi = mid;
          }
          return (lo + hi) / 2;
        };
        const off = find(0, shape.halfEvent);
        const r = centerlineFromReadings({ openingAngle: icl - off, closingAngle: icl + off });
        expect(r).toBeCloseTo(icl, 9);
      }),
    );
  });

  it('rejects readings in the wrong order or non-finite', () => {
    expect(() => centerlineFromReadings({ openingAngle: 130, closingAngle: 84 })).toThrow(/closingAngle/);
    expect(() => centerlineFromReadings({ openingAngle: Number.NaN, closingAngle: 84 })).toThrow(/openingAngle/);
    expect(() => centerlineFromReadings({ openingAngle: -200, closingAngle: 200 })).toThrow(/360/);
  });
});

describe('degreeCam', () => {
  it('says to advance a cam that reads later than the sheet', () => {
    // Hand-worked: sheet ICL 106, measured 108 → 2° retarded → advance 2° (common practice, no source).
    const r = degreeCam({ openingAngle: 85, closingAngle: 131, sheetIcl: 106 });
    expect(r.measuredIcl).toBeCloseTo(108, 12);
    expect(r.difference).toBeCloseTo(2, 12);
    expect(r.correction).toBe('advance');
    expect(r.correctionDegrees).toBeCloseTo(2, 12);
  });

  it('says to retard a cam that reads earlier, and nothing inside tolerance', () => {
    const r = degreeCam({ openingAngle: 80, closingAngle: 128, sheetIcl: 106 });
    expect(r.measuredIcl).toBeCloseTo(104, 12);
    expect(r.correction).toBe('retard');
    const ok = degreeCam({ openingAngle: 83.5, closingAngle: 129, sheetIcl: 106, tolerance: 0.5 });
    expect(ok.difference).toBeCloseTo(0.25, 12);
    expect(ok.correction).toBe('none');
    expect(ok.correctionDegrees).toBe(0);
  });

  it('rejects a sheet ICL off the intake stroke', () => {
    expect(() => degreeCam({ openingAngle: 80, closingAngle: 128, sheetIcl: -10 })).toThrow(/sheetIcl/);
    expect(() => degreeCam({ openingAngle: 80, closingAngle: 128, sheetIcl: 106, tolerance: -1 })).toThrow(/tolerance/);
  });
});
