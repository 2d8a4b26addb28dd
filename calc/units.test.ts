import { describe, expect, it } from 'vitest';
import { CC_PER_CUBIC_INCH } from './constants';
import { CalcInputError } from './errors';
import { ccToCubicInches, cubicInchesToCc, inchesToMm, lbfPerInchToNPerMm, lbfToNewtons, mmToInches, newtonsToLbf, nPerMmToLbfPerInch } from './units';

describe('unit conversion at the edge', () => {
  it('converts length with the exact inch', () => {
    // NIST SP 811 (2008), appendix B.8: 1 in = 2.54 cm = 25.4 mm exactly.
    expect(inchesToMm(1)).toBeCloseTo(25.4, 12);
    expect(inchesToMm(0.05)).toBeCloseTo(1.27, 12);
    expect(mmToInches(25.4)).toBeCloseTo(1, 12);
  });

  it('converts volume with the exact cubic inch', () => {
    // NIST SP 811 (2008), appendix B.8: 1 in³ = 16.387064 cm³ exactly (1 cc = 1 cm³).
    expect(cubicInchesToCc(1)).toBeCloseTo(16.387064, 9);
    expect(ccToCubicInches(16.387064)).toBeCloseTo(1, 12);
    // Independent of mathjs: the kernel's own constant is 25.4³ / 1000.
    expect(CC_PER_CUBIC_INCH).toBeCloseTo((25.4 * 25.4 * 25.4) / 1000, 12);
  });

  it('converts force with the NIST pound-force', () => {
    // NIST SP 811 (2008), appendix B.8: 1 lbf = 4.448 222 N (B.9 gives 4.4482216152605 N).
    expect(lbfToNewtons(1)).toBeCloseTo(4.4482216152605, 12);
    expect(newtonsToLbf(4.4482216152605)).toBeCloseTo(1, 12);
  });

  it('converts spring rate lbf/in to N/mm and back', () => {
    // NIST SP 811: 1 lbf/in = 4.4482216152605 N / 25.4 mm = 0.175126835... N/mm.
    // Hand-worked: 4.4482216152605 / 25.4 = 0.17512683524647...
    expect(lbfPerInchToNPerMm(1)).toBeCloseTo(0.1751268352, 9);
    expect(lbfPerInchToNPerMm(350)).toBeCloseTo(61.2943924, 6);
    expect(nPerMmToLbfPerInch(lbfPerInchToNPerMm(412.5))).toBeCloseTo(412.5, 9);
  });

  it('rejects NaN and infinite values', () => {
    expect(() => inchesToMm(Number.NaN)).toThrow(CalcInputError);
    expect(() => lbfToNewtons(Number.POSITIVE_INFINITY)).toThrow(/finite/);
  });
});
