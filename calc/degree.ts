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

/** Degree-wheel readings as taken at cam install, crank degrees on the wheel. */
export interface WheelReadings {
  /** Piston stop before TDC, degrees BTDC on the wheel (a positive number). */
  stopBefore: number;
  /** Piston stop after TDC, degrees ATDC on the wheel (a positive number). */
  stopAfter: number;
  /** Opening-flank angle on the wheel, degrees ATDC, read with the pointer where the stops were read. */
  openingAngle: number;
  /** Closing-flank angle on the wheel, degrees ATDC, same pointer. */
  closingAngle: number;
}

export interface DegreeReading extends DegreeResult {
  /** Where true TDC sits on the wheel, crank degrees ATDC (positive = the wheel reads late). */
  trueTdcOffset: number;
}

/** Unchecked kernel of trueTdcOffset: halfway between the two piston stops, crank degrees ATDC on the wheel. */
export function trueTdcOffsetRaw(stopBefore: number, stopAfter: number): number {
  return (stopAfter - stopBefore) / 2;
}

/**
 * The installed intake centreline from degree-wheel readings. True TDC is
 * halfway between the piston stops (stopBefore° BTDC and stopAfter° ATDC), so
 * the wheel reads true TDC at (stopAfter − stopBefore)/2 ATDC; both flank
 * readings are moved by that offset before the centreline is taken halfway
 * between them. Crank degrees ATDC.
 */
export function installedIcl(input: WheelReadings): { trueTdcOffset: number; measuredIcl: number; openingAngle: number; closingAngle: number } {
  requireObject('input', input);
  const before = requireNonNegative('stopBefore', input.stopBefore, 'crank degrees');
  const after = requireNonNegative('stopAfter', input.stopAfter, 'crank degrees');
  const trueTdcOffset = trueTdcOffsetRaw(before, after);
  const openingAngle = requireFinite('openingAngle', input.openingAngle) - trueTdcOffset;
  const closingAngle = requireFinite('closingAngle', input.closingAngle) - trueTdcOffset;
  return { trueTdcOffset, measuredIcl: centerlineFromReadings({ openingAngle, closingAngle }), openingAngle, closingAngle };
}

/**
 * The one path from degree-wheel readings to the installed ICL and its
 * correction: installedIcl, then degreeCam against the sheet.
 */
export function degreeFromReadings(input: WheelReadings & { sheetIcl: number; tolerance?: number }): DegreeReading {
  const { trueTdcOffset, openingAngle, closingAngle } = installedIcl(input);
  const result = degreeCam({
    openingAngle,
    closingAngle,
    sheetIcl: input.sheetIcl,
    ...(input.tolerance === undefined ? {} : { tolerance: input.tolerance }),
  });
  return { ...result, trueTdcOffset };
}
