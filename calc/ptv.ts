/**
 * Piston-to-valve sweep from a measured baseline.
 *
 * The tech measures one clearance along the valve axis with the old cam (the
 * simplest: valve closed at overlap TDC, so the free travel down to the
 * piston). For any other crank angle θ and new valve lift v(θ):
 *
 *   clearance(θ) = C₀ + cos(α)·(depth(θ) − depth(θ₀)) − (v(θ) − v₀)
 *
 * where depth is the exact slider-crank piston depth and α the valve angle
 * from the bore axis. cos α assumes the valve relief floor is square to the
 * valve stem, as reliefs are cut, so piston travel d along the bore opens the
 * gap along the stem by d·cos α. Inches and crank degrees ATDC overlap.
 */
import { RAD_PER_DEG } from './constants';
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireNonNegative, requireObject } from './errors';
import { pistonDepthRaw, requireCrank } from './geometry';

export interface PtvBaseline {
  /** Clearance measured along the valve axis, inches. */
  clearance: number;
  /** Crank angle of that measurement, degrees ATDC overlap (negative = BTDC); default 0. */
  crankAngle?: number;
  /** Valve lift of the old cam at that angle, inches; default 0 (valve closed). */
  valveLift?: number;
}

export interface SampledLift {
  /** Crank angle of the first sample, degrees ATDC overlap. */
  start: number;
  /** Crank degrees between samples. */
  step: number;
  /** Valve lift per sample, inches. */
  lift: ArrayLike<number>;
}

export interface PtvSweepInput {
  stroke: number;
  rodLength: number;
  /** Valve angle from the bore axis, degrees; default 0. */
  valveAngle?: number;
  baseline: PtvBaseline;
  /** The new valve lift curve. */
  curve: SampledLift;
  /** First crank angle of the sweep, degrees ATDC overlap; default −90. */
  from?: number;
  /** Last crank angle of the sweep; default +90. */
  to?: number;
}

export interface PtvSweep {
  /** Smallest clearance in the sweep, inches (negative = interference). */
  minClearance: number;
  /** Crank angle of the smallest clearance, degrees ATDC overlap. */
  atAngle: number;
  /** Valve lift there, inches. */
  liftAtMin: number;
  /** Piston depth there, inches below TDC. */
  pistonDepthAtMin: number;
  /** Crank angle of clearance[0]. */
  start: number;
  /** Crank degrees between samples. */
  step: number;
  /** Clearance at each swept angle, inches. */
  clearance: Float64Array;
}

export interface CheckedBaseline {
  clearance: number;
  crankAngle: number;
  valveLift: number;
}

/** Validate a baseline measurement. */
export function requireBaseline(b: PtvBaseline, prefix?: string): CheckedBaseline {
  requireObject(prefix ?? 'baseline', b);
  return {
    clearance: requireInRange(fieldPath(prefix, 'clearance'), b.clearance, { min: 0, max: 2, unit: 'in' }),
    crankAngle: requireInRange(fieldPath(prefix, 'crankAngle'), b.crankAngle ?? 0, { min: -180, max: 180 }),
    valveLift: requireNonNegative(fieldPath(prefix, 'valveLift'), b.valveLift ?? 0, 'in'),
  };
}

/** Check a valve angle from the bore axis, degrees. */
export function requireValveAngle(field: string, value: unknown): number {
  return requireInRange(field, value ?? 0, { min: 0, max: 45, maxOpen: true, unit: 'degrees' });
}

/**
 * Unchecked kernel: sweep grid indices [i0, i1] of a lift array and a piston
 * depth array on the same grid, writing clearances into `out` from index 0.
 */
export function ptvSweepRaw(
  lift: ArrayLike<number>,
  depth: ArrayLike<number>,
  start: number,
  step: number,
  i0: number,
  i1: number,
  cosAngle: number,
  baselineOffset: number,
  out: Float64Array,
): PtvSweep {
  let min = Infinity;
  let at = i0;
  for (let i = i0; i <= i1; i++) {
    const c = baselineOffset + cosAngle * (depth[i] ?? 0) - (lift[i] ?? 0);
    out[i - i0] = c;
    if (c < min) {
      min = c;
      at = i;
    }
  }
  return {
    minClearance: min,
    atAngle: start + at * step,
    liftAtMin: lift[at] ?? 0,
    pistonDepthAtMin: depth[at] ?? 0,
    start: start + i0 * step,
    step,
    clearance: out,
  };
}

/** Baseline offset C₀ − cos α·depth(θ₀) + v₀, so clearance = offset + cos α·depth − lift. */
export function baselineOffsetRaw(stroke: number, rodLength: number, cosAngle: number, b: CheckedBaseline): number {
  return b.clearance - cosAngle * pistonDepthRaw(stroke, rodLength, b.crankAngle) + b.valveLift;
}

/**
 * Piston-to-valve clearance through overlap for one valve, from a measured
 * baseline and the new valve lift curve. Reports the minimum and where it is.
 */
export function ptvSweep(input: PtvSweepInput, prefix?: string): PtvSweep {
  requireObject(prefix ?? 'input', input);
  const { stroke, rodLength } = requireCrank(input, prefix);
  const angle = requireValveAngle(fieldPath(prefix, 'valveAngle'), input.valveAngle);
  const baseline = requireBaseline(input.baseline, fieldPath(prefix, 'baseline'));
  const start = requireFinite(fieldPath(prefix, 'curve.start'), input.curve.start);
  const step = requireInRange(fieldPath(prefix, 'curve.step'), input.curve.step, { min: 0, max: 10, minOpen: true });
  const lift = input.curve.lift;
  const from = requireFinite(fieldPath(prefix, 'from'), input.from ?? -90);
  const to = requireFinite(fieldPath(prefix, 'to'), input.to ?? 90);
  if (!(to > from)) throw new CalcInputError(fieldPath(prefix, 'to'), `must be after from (${from}°)`, to);
  const i0 = Math.ceil((from - start) / step - 1e-9);
  const i1 = Math.floor((to - start) / step + 1e-9);
  if (i0 < 0 || i1 > lift.length - 1) {
    throw new CalcInputError(fieldPath(prefix, 'curve'), `must cover the sweep from ${from}° to ${to}°`, start);
  }
  const depth = new Float64Array(lift.length);
  for (let i = i0; i <= i1; i++) {
    requireFinite(fieldPath(prefix, `curve.lift[${i}]`), lift[i]);
    depth[i] = pistonDepthRaw(stroke, rodLength, start + i * step);
  }
  const cosAngle = Math.cos(angle * RAD_PER_DEG);
  const offset = baselineOffsetRaw(stroke, rodLength, cosAngle, baseline);
  return ptvSweepRaw(lift, depth, start, step, i0, i1, cosAngle, offset, new Float64Array(i1 - i0 + 1));
}
