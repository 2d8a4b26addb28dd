/**
 * Valve springs: open load and height, coil-bind margin, retainer-to-seal
 * margin, and the helical spring rate from wire size. Inches, lbf, lbf/in.
 */
import { CalcInputError, fieldPath, requireFinite, requireNonNegative, requirePositive, requireThat, requireObject } from './errors';

export interface SpringCheckInput {
  /** Load at installed height (valve closed), lbf. */
  seatLoad: number;
  /** Spring rate, lbf/in. */
  rate: number;
  /** Installed height, inches. */
  installedHeight: number;
  /** Solid (coil-bind) height, inches. */
  coilBindHeight: number;
  /** Net valve lift, inches. */
  valveLift: number;
}

export interface SpringCheck {
  /** Load at max lift, lbf. */
  openLoad: number;
  /** Spring height at max lift, inches. */
  openHeight: number;
  /** openHeight − coilBindHeight, inches; negative means the spring would go solid. */
  coilBindMargin: number;
}

export interface SpringSpec {
  seatLoad: number;
  rate: number;
  installedHeight: number;
  coilBindHeight: number;
}

/** Validate a spring spec (without lift). */
export function requireSpring(input: SpringSpec, prefix?: string): SpringSpec {
  requireObject(prefix ?? 'input', input);
  const seatLoad = requireNonNegative(fieldPath(prefix, 'seatLoad'), input.seatLoad, 'lbf');
  const rate = requirePositive(fieldPath(prefix, 'rate'), input.rate, 'lbf/in');
  const installedHeight = requirePositive(fieldPath(prefix, 'installedHeight'), input.installedHeight, 'in');
  const coilBindHeight = requirePositive(fieldPath(prefix, 'coilBindHeight'), input.coilBindHeight, 'in');
  if (!(coilBindHeight < installedHeight)) {
    throw new CalcInputError(fieldPath(prefix, 'coilBindHeight'), `must be less than installedHeight (${installedHeight} in)`, coilBindHeight);
  }
  return { seatLoad, rate, installedHeight, coilBindHeight };
}

/** Unchecked kernel of springCheck. */
export function springCheckRaw(spring: SpringSpec, valveLift: number): SpringCheck {
  const openHeight = spring.installedHeight - valveLift;
  return {
    openLoad: spring.seatLoad + spring.rate * valveLift,
    openHeight,
    coilBindMargin: openHeight - spring.coilBindHeight,
  };
}

/**
 * Spring load and height at max lift and the margin to coil bind (linear
 * spring). A negative margin is a result, not an input error: it means the
 * spring would stack solid before the valve reaches full lift.
 */
export function springCheck(input: SpringCheckInput, prefix?: string): SpringCheck {
  requireObject(prefix ?? 'input', input);
  const spring = requireSpring(input, prefix);
  const lift = requirePositive(fieldPath(prefix, 'valveLift'), input.valveLift, 'in');
  requireThat(lift < spring.installedHeight, fieldPath(prefix, 'valveLift'), `must be less than installedHeight (${spring.installedHeight} in)`, lift);
  return springCheckRaw(spring, lift);
}

export interface RetainerToSealInput {
  /** Clearance from the retainer underside to the top of the valve seal, valve closed, inches. */
  retainerToSeal: number;
  /** Net valve lift, inches. */
  valveLift: number;
}

/** Unchecked kernel of retainerToSealMargin. */
export function retainerToSealRaw(retainerToSeal: number, valveLift: number): number {
  return retainerToSeal - valveLift;
}

/**
 * Retainer-to-seal clearance left at max lift, inches: the installed
 * clearance less the valve lift. Negative means the retainer hits the seal.
 */
export function retainerToSealMargin(input: RetainerToSealInput, prefix?: string): { clearanceAtMaxLift: number } {
  requireObject(prefix ?? 'input', input);
  const installed = requirePositive(fieldPath(prefix, 'retainerToSeal'), input.retainerToSeal, 'in');
  const lift = requirePositive(fieldPath(prefix, 'valveLift'), input.valveLift, 'in');
  return { clearanceAtMaxLift: retainerToSealRaw(installed, lift) };
}

export interface HelicalSpringInput {
  /** Wire diameter d, inches. */
  wireDiameter: number;
  /** Mean coil diameter D, inches. */
  meanCoilDiameter: number;
  /** Number of active coils. */
  activeCoils: number;
  /** Shear modulus G, psi; default 11.5e6 for valve-spring steel. */
  shearModulus?: number;
}

/** Rate of a round-wire helical compression spring, lbf/in: k = G·d⁴ / (8·D³·N). */
export function helicalSpringRate(input: HelicalSpringInput): number {
  requireObject('input', input);
  const d = requirePositive('wireDiameter', input.wireDiameter, 'in');
  const D = requirePositive('meanCoilDiameter', input.meanCoilDiameter, 'in');
  requireThat(D > d, 'meanCoilDiameter', `must be larger than wireDiameter (${d} in)`, D);
  const n = requirePositive('activeCoils', input.activeCoils);
  const g = requirePositive('shearModulus', requireFinite('shearModulus', input.shearModulus ?? 11.5e6), 'psi');
  return (g * d ** 4) / (8 * D ** 3 * n);
}
