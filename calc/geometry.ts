/**
 * Engine geometry: slider-crank piston motion, swept volume, displacement and
 * compression ratios. Lengths in inches, volumes in cc, angles in crank degrees.
 */
import { CC_PER_CUBIC_INCH, RAD_PER_DEG } from './constants';
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireInteger, requirePositive, requireObject } from './errors';

export interface CrankInput {
  /** Stroke, inches. */
  stroke: number;
  /** Connecting-rod length, centre to centre, inches. */
  rodLength: number;
}

/** Check stroke and rod: the rod must be longer than the crank throw (half the stroke). */
export function requireCrank(input: CrankInput, prefix?: string): { stroke: number; rodLength: number } {
  requireObject(prefix ?? 'input', input);
  const stroke = requirePositive(fieldPath(prefix, 'stroke'), input.stroke, 'in');
  const rodLength = requirePositive(fieldPath(prefix, 'rodLength'), input.rodLength, 'in');
  if (!(rodLength > stroke / 2)) {
    throw new CalcInputError(fieldPath(prefix, 'rodLength'), `must be longer than half the stroke (${stroke / 2} in) or the crank cannot turn`, rodLength);
  }
  return { stroke, rodLength };
}

/** Unchecked kernel: piston depth below TDC, inches, at crank angle in degrees. */
export function pistonDepthRaw(stroke: number, rodLength: number, crankAngleDeg: number): number {
  const r = stroke / 2;
  const t = crankAngleDeg * RAD_PER_DEG;
  const s = Math.sin(t);
  return rodLength + r - r * Math.cos(t) - Math.sqrt(rodLength * rodLength - r * r * s * s);
}

/**
 * Piston depth below TDC, inches, from the exact slider-crank relation.
 * crankAngle in crank degrees from TDC (any sign).
 */
export function pistonDepth(input: CrankInput & { crankAngle: number }, prefix?: string): number {
  requireObject(prefix ?? 'input', input);
  const { stroke, rodLength } = requireCrank(input, prefix);
  const angle = requireFinite(fieldPath(prefix, 'crankAngle'), input.crankAngle);
  return pistonDepthRaw(stroke, rodLength, angle);
}

export interface PistonMotion {
  /** Inches below TDC. */
  depth: number;
  /** d(depth)/dθ, inches per crank degree (positive while the piston descends). */
  velocity: number;
  /** d²(depth)/dθ², inches per crank degree². */
  acceleration: number;
}

/** Unchecked kernel of pistonMotion. */
export function pistonMotionRaw(stroke: number, rodLength: number, crankAngleDeg: number): PistonMotion {
  const r = stroke / 2;
  const t = crankAngleDeg * RAD_PER_DEG;
  const s = Math.sin(t);
  const c = Math.cos(t);
  const q = Math.sqrt(rodLength * rodLength - r * r * s * s);
  const depth = rodLength + r - r * c - q;
  const vRad = r * s + (r * r * s * c) / q;
  const aRad = r * c + (r * r * (c * c - s * s)) / q + (r * r * r * r * s * s * c * c) / (q * q * q);
  return { depth, velocity: vRad * RAD_PER_DEG, acceleration: aRad * RAD_PER_DEG * RAD_PER_DEG };
}

/** Piston depth, velocity and acceleration against crank angle (exact slider-crank). */
export function pistonMotion(input: CrankInput & { crankAngle: number }): PistonMotion {
  requireObject('input', input);
  const { stroke, rodLength } = requireCrank(input);
  return pistonMotionRaw(stroke, rodLength, requireFinite('crankAngle', input.crankAngle));
}

/** Area of a circle of this diameter, square inches. */
function circleArea(diameter: number): number {
  return (Math.PI / 4) * diameter * diameter;
}

/** Unchecked kernel of sweptVolume, cc. */
export function sweptVolumeRaw(bore: number, stroke: number): number {
  return circleArea(bore) * stroke * CC_PER_CUBIC_INCH;
}

/** Swept volume of one cylinder, cc, from bore and stroke in inches. */
export function sweptVolume(input: { bore: number; stroke: number }, prefix?: string): number {
  requireObject(prefix ?? 'input', input);
  const bore = requirePositive(fieldPath(prefix, 'bore'), input.bore, 'in');
  const stroke = requirePositive(fieldPath(prefix, 'stroke'), input.stroke, 'in');
  return sweptVolumeRaw(bore, stroke);
}

export interface Displacement {
  /** Whole engine, cc. */
  cc: number;
  /** Whole engine, litres. */
  liters: number;
  /** Whole engine, cubic inches. */
  cubicInches: number;
  /** One cylinder, cc. */
  perCylinderCc: number;
}

/** Engine displacement from bore and stroke (inches) and cylinder count. */
export function displacement(input: { bore: number; stroke: number; cylinders: number }, prefix?: string): Displacement {
  requireObject(prefix ?? 'input', input);
  const perCylinderCc = sweptVolume(input, prefix);
  const cylinders = requireInteger(fieldPath(prefix, 'cylinders'), input.cylinders, 1);
  const cc = perCylinderCc * cylinders;
  return { cc, liters: cc / 1000, cubicInches: cc / CC_PER_CUBIC_INCH, perCylinderCc };
}

export interface StaticCompressionInput {
  /** Cylinder bore, inches. */
  bore: number;
  /** Stroke, inches. */
  stroke: number;
  /** Head chamber volume, cc. */
  chamberCc: number;
  /** Head gasket bore, inches (at least the cylinder bore). */
  gasketBore: number;
  /** Compressed head gasket thickness, inches. */
  gasketThickness: number;
  /** Piston deck clearance, inches: positive below the deck, negative above it. */
  deckClearance: number;
  /** Piston volume, cc: positive for a dish or valve reliefs, negative for a dome. */
  pistonCc: number;
}

export interface StaticCompression {
  /** Compression ratio, (swept + clearance) / clearance. */
  ratio: number;
  /** Total clearance volume at TDC, cc. */
  clearanceCc: number;
  /** Swept volume of one cylinder, cc. */
  sweptCc: number;
}

export interface CheckedCompressionInput {
  bore: number;
  stroke: number;
  clearanceCc: number;
  sweptCc: number;
}

/** Validate compression inputs and work out the clearance volume (cc). */
export function checkCompressionInput(input: StaticCompressionInput, prefix?: string): CheckedCompressionInput {
  requireObject(prefix ?? 'input', input);
  const bore = requirePositive(fieldPath(prefix, 'bore'), input.bore, 'in');
  const stroke = requirePositive(fieldPath(prefix, 'stroke'), input.stroke, 'in');
  const chamberCc = requirePositive(fieldPath(prefix, 'chamberCc'), input.chamberCc, 'cc');
  const gasketBore = requirePositive(fieldPath(prefix, 'gasketBore'), input.gasketBore, 'in');
  if (!(gasketBore >= bore)) throw new CalcInputError(fieldPath(prefix, 'gasketBore'), `must be at least the cylinder bore (${bore} in)`, gasketBore);
  const gasketThickness = requireInRange(fieldPath(prefix, 'gasketThickness'), input.gasketThickness, {
    min: 0,
    max: 0.5,
    minOpen: true,
    unit: 'in',
  });
  const deckClearance = requireInRange(fieldPath(prefix, 'deckClearance'), input.deckClearance, {
    min: -0.5,
    max: 0.5,
    unit: 'in',
  });
  const pistonCc = requireFinite(fieldPath(prefix, 'pistonCc'), input.pistonCc);
  const clearanceCc = compressionClearanceRaw(chamberCc, gasketBore, gasketThickness, bore, deckClearance, pistonCc);
  if (!(clearanceCc > 0)) {
    throw new CalcInputError(
      fieldPath(prefix, 'pistonCc'),
      `leaves no clearance volume at TDC (${clearanceCc.toFixed(2)} cc): the dome or deck height is too large`,
      pistonCc,
    );
  }
  return { bore, stroke, clearanceCc, sweptCc: sweptVolumeRaw(bore, stroke) };
}

/** Unchecked: clearance volume at TDC, cc. */
export function compressionClearanceRaw(
  chamberCc: number,
  gasketBore: number,
  gasketThickness: number,
  bore: number,
  deckClearance: number,
  pistonCc: number,
): number {
  const gasketCc = circleArea(gasketBore) * gasketThickness * CC_PER_CUBIC_INCH;
  const deckCc = circleArea(bore) * deckClearance * CC_PER_CUBIC_INCH;
  return chamberCc + gasketCc + deckCc + pistonCc;
}

/** Static compression ratio and its volumes (cc). */
export function staticCompression(input: StaticCompressionInput, prefix?: string): StaticCompression {
  const { clearanceCc, sweptCc } = checkCompressionInput(input, prefix);
  return { ratio: (sweptCc + clearanceCc) / clearanceCc, clearanceCc, sweptCc };
}

export interface DynamicCompressionInput extends StaticCompressionInput {
  /** Connecting-rod length, inches. */
  rodLength: number;
  /**
   * Intake valve closing, crank degrees ABDC, at the checking height the
   * caller chooses (the analysis uses the advertised height). Negative = BBDC.
   */
  ivcAbdc: number;
}

export interface DynamicCompression {
  /** Trapped (dynamic) compression ratio. */
  ratio: number;
  /** Piston distance below TDC when the intake closes, inches. */
  effectiveStroke: number;
  /** Cylinder volume swept from IVC to TDC, cc. */
  trappedSweptCc: number;
}

/** Unchecked kernel of dynamicCompression. */
export function dynamicCompressionRaw(bore: number, stroke: number, rodLength: number, clearanceCc: number, ivcAbdc: number): DynamicCompression {
  const effectiveStroke = pistonDepthRaw(stroke, rodLength, 180 + ivcAbdc);
  const trappedSweptCc = circleArea(bore) * effectiveStroke * CC_PER_CUBIC_INCH;
  return { ratio: (trappedSweptCc + clearanceCc) / clearanceCc, effectiveStroke, trappedSweptCc };
}

/**
 * Dynamic (trapped) compression ratio: compression starts when the intake
 * valve closes, so the swept volume is the cylinder above the piston at IVC
 * (exact slider-crank position) instead of the full stroke.
 */
export function dynamicCompression(input: DynamicCompressionInput, prefix?: string): DynamicCompression {
  requireObject(prefix ?? 'input', input);
  const { bore, stroke, clearanceCc } = checkCompressionInput(input, prefix);
  const { rodLength } = requireCrank({ stroke, rodLength: input.rodLength }, prefix);
  const ivc = requireInRange(fieldPath(prefix, 'ivcAbdc'), input.ivcAbdc, {
    min: -90,
    max: 180,
    maxOpen: true,
    unit: '°ABDC',
  });
  return dynamicCompressionRaw(bore, stroke, rodLength, clearanceCc, ivc);
}
