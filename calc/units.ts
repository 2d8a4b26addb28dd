/**
 * Unit conversion at the edge of calc. The kernel works in inches, cc, lbf
 * and lbf/in; the UI may show mm, cm³, N and N/mm. These helpers use mathjs
 * units and belong in forms and formatters, never inside the math.
 *
 * mathjs is built here with `create` from the unit function's factories alone, so the web
 * export's tree shaking keeps only the unit code (and what it needs) in this chunk.
 */
import { create, unitDependencies } from 'mathjs';
import { requireFinite } from './errors';

// mathjs declares its dependency maps as entries of a Record, so under noUncheckedIndexedAccess
// they read as possibly undefined; the export always exists.
const { unit } = create({ unitDependencies: unitDependencies! });

function convert(field: string, value: number, from: string, to: string): number {
  return unit(requireFinite(field, value), from).toNumber(to);
}

/** Inches to millimetres. */
export function inchesToMm(inches: number): number {
  return convert('inches', inches, 'inch', 'mm');
}

/** Millimetres to inches. */
export function mmToInches(mm: number): number {
  return convert('mm', mm, 'mm', 'inch');
}

/** Cubic inches to cc (cm³). */
export function cubicInchesToCc(cubicInches: number): number {
  return convert('cubicInches', cubicInches, 'inch^3', 'cm^3');
}

/** cc (cm³) to cubic inches. */
export function ccToCubicInches(cc: number): number {
  return convert('cc', cc, 'cm^3', 'inch^3');
}

/** Pounds-force to newtons. */
export function lbfToNewtons(lbf: number): number {
  return convert('lbf', lbf, 'lbf', 'N');
}

/** Newtons to pounds-force. */
export function newtonsToLbf(newtons: number): number {
  return convert('newtons', newtons, 'N', 'lbf');
}

/** Spring rate, lbf/in to N/mm. */
export function lbfPerInchToNPerMm(rate: number): number {
  return convert('rate', rate, 'lbf/inch', 'N/mm');
}

/** Spring rate, N/mm to lbf/in. */
export function nPerMmToLbfPerInch(rate: number): number {
  return convert('rate', rate, 'N/mm', 'lbf/inch');
}

/** The unit systems the UI offers. */
export type UnitSystem = 'imperial' | 'metric';

/** What a length, volume, force or rate shows as in each system. */
export const DISPLAY_UNITS = {
  imperial: { length: 'in', volume: 'cc', force: 'lbf', rate: 'lbf/in' },
  metric: { length: 'mm', volume: 'cm³', force: 'N', rate: 'N/mm' },
} as const;
