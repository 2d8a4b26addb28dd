/**
 * Degreeing a cam in: intake centreline from two equal-lift readings on the
 * degree wheel, the difference from the sheet, and the correction.
 */
import { CalcInputError, requireFinite, requireNonNegative, requireObject } from './errors';
import { requireIcl } from './events';

export interface EqualLiftReadings {
  /** Crank degrees ATDC where the dial reads the chosen lift on the opening flank. */
  openingAngle: number;
  /** Crank degrees ATDC where the dial reads the same lift on the closing flank. */
  closingAngle: number;
}

/** Unchecked kernel of centerlineFromReadings. */
export function centerlineFromReadingsRaw(openingAngle: number, closingAngle: number): number {
  return (openingAngle + closingAngle) / 2;
}

/**
 * Intake centreline, crank degrees ATDC: halfway between two readings of the
 * same lift (for example 0.050 in before and after max lift) on either flank.
 */
export function centerlineFromReadings(input: EqualLiftReadings): number {
  requireObject('input', input);
  const open = requireFinite('openingAngle', input.openingAngle);
  const close = requireFinite('closingAngle', input.closingAngle);
  if (!(close > open)) {
    throw new CalcInputError('closingAngle', `must come after openingAngle (${open}°) on the wheel`, close);
  }
  if (!(close - open < 360)) {
    throw new CalcInputError('closingAngle', 'must be less than 360° after openingAngle: one lobe event fits inside two turns', close);
  }
  return centerlineFromReadingsRaw(open, close);
}

export type CamCorrection = 'advance' | 'retard' | 'none';

export interface DegreeResult {
  /** Measured intake centreline, crank degrees ATDC. */
  measuredIcl: number;
  /** The sheet's intake centreline, crank degrees ATDC. */
  sheetIcl: number;
  /** measuredIcl − sheetIcl, crank degrees; positive = installed retarded from the sheet. */
  difference: number;
  /** Which way to move the cam to reach the sheet ICL. */
  correction: CamCorrection;
  /** How far to move it, crank degrees (0 when within tolerance). */
  correctionDegrees: number;
  /** True when |difference| ≤ tolerance. */
  withinTolerance: boolean;
  /** Tolerance used, crank degrees. */
  tolerance: number;
}

/**
 * Compare the degreed-in intake centreline with the sheet and say how far to
 * advance or retard the cam. A later centreline than the sheet means the cam
 * sits retarded, so it needs advancing by the difference, and vice versa.
 */
export function degreeCam(input: EqualLiftReadings & { sheetIcl: number; tolerance?: number }): DegreeResult {
  requireObject('input', input);
  const measuredIcl = centerlineFromReadings(input);
  const sheetIcl = requireIcl('sheetIcl', input.sheetIcl);
  const tolerance = requireNonNegative('tolerance', input.tolerance ?? 0.5, 'crank degrees');
  const difference = measuredIcl - sheetIcl;
  const withinTolerance = Math.abs(difference) <= tolerance;
  return {
    measuredIcl,
    sheetIcl,
    difference,
    correction: withinTolerance ? 'none' : difference > 0 ? 'advance' : 'retard',
    correctionDegrees: withinTolerance ? 0 : Math.abs(difference),
    withinTolerance,
    tolerance,
  };
}
