import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { centerlineFromReadings, degreeCam, degreeFromReadings, installedIcl } from './degree';
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

describe('degreeFromReadings', () => {
  it('moves both flank readings by the true-TDC offset from the piston stops before taking the centreline', () => {
    // Piston-stop method (common practice, no source): stops read 20° BTDC and 22° ATDC put true TDC
    // halfway, at (22 − 20)/2 = 1° ATDC on the wheel. The flank readings 5° and 205° on that wheel are
    // really 4° and 204° ATDC, so the ICL is (4 + 204)/2 = 104° ATDC; against a 108° sheet the cam sits
    // 4° early, so it is retarded 4° (a later ICL than the sheet = retarded, common practice, no source).
    const d = degreeFromReadings({ stopBefore: 20, stopAfter: 22, openingAngle: 5, closingAngle: 205, sheetIcl: 108 });
    expect(d.trueTdcOffset).toBe(1);
    expect(d.measuredIcl).toBe(104);
    expect(d.difference).toBe(-4);
    expect(d.correction).toBe('retard');
    expect(d.correctionDegrees).toBe(4);
  });

  it('equal piston stops leave the readings as read', () => {
    // Stops 24° either side: the pointer already sits on true TDC (common practice, no source).
    expect(installedIcl({ stopBefore: 24, stopAfter: 24, openingAngle: 84, closingAngle: 130 })).toMatchObject({ trueTdcOffset: 0, measuredIcl: 107 });
  });

  it('property: shifting the wheel shifts stops and flanks alike, and the ICL does not move', () => {
    // A wheel set k° off reads every angle k° later: the BTDC stop k° smaller, the ATDC stop k° larger.
    fc.assert(
      fc.property(fc.integer({ min: -4, max: 4 }), fc.integer({ min: 10, max: 30 }), fc.integer({ min: 0, max: 40 }), (k, stop, open) => {
        const base = installedIcl({ stopBefore: stop, stopAfter: stop, openingAngle: open, closingAngle: open + 200 });
        const shifted = installedIcl({ stopBefore: stop - k, stopAfter: stop + k, openingAngle: open + k, closingAngle: open + 200 + k });
        expect(shifted.measuredIcl).toBeCloseTo(base.measuredIcl, 9);
      }),
    );
  });

  it('refuses a negative piston stop, naming it', () => {
    expect(() => installedIcl({ stopBefore: -2, stopAfter: 20, openingAngle: 5, closingAngle: 205 })).toThrow(/stopBefore/);
  });
});
