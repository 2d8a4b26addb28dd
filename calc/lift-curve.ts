/**
 * Lift-curve synthesis from a lobe spec.
 *
 * A regrind sheet gives, per lobe, the lobe lift L, the duration D₂ at 0.050 in
 * tappet lift and the advertised duration D₁ at a lower height h₁. The curve
 * built here is symmetric about the lobe centre and hits all three exactly:
 *
 *   lift(φ) = L · s(W(τ)),   τ = 1 − |φ| / Φ  (0 at the opening point, 1 at the nose)
 *
 * - s is a full-rise motion law (cycloidal, 3-4-5 or 4-5-6-7), so the flank
 *   starts from rest, rises monotonically and reaches L at the nose;
 * - W is a smooth, monotone warp of the law's time axis, W(0) = 0, W(1) = 1,
 *   W(τ) = τ^q / (τ^q + k(1 − τ)); in logit form logit W = q·ln τ − ln(1 − τ) − ln k;
 * - Φ is half the seat-to-seat event (crank degrees from centre to zero lift).
 *
 * Let ξᵢ = s⁻¹(hᵢ / L) be where the law reaches each checking height. Hitting
 * both durations means W(1 − Dᵢ/2Φ) = ξᵢ for i = 1, 2. Subtracting the two
 * logit equations, (1 − τ₂)/(1 − τ₁) = D₂/D₁ drops out and
 *     q · ln(τ₂/τ₁) = Δ − ln(D₁/D₂),   Δ = logit ξ₂ − logit ξ₁,
 * so q > 0 exactly when the law's odds ratio e^Δ exceeds D₁/D₂. With q = 1
 * (a Möbius warp, smooth with a finite slope at both ends) Φ has the closed form
 *     Φ = a·b·(e^Δ − 1) / (b·e^Δ − a),   a = D₁/2, b = D₂/2.
 * When that Φ would give an unreal ramp (Φ − a > RAMP_MAX) Φ is capped and
 * q < 1 is solved instead; q must stay above Q_MIN so acceleration stays finite
 * at the opening point. ln k then follows from either checking point.
 *
 * Velocity and acceleration follow by the chain rule and are exact, in inches
 * per crank degree and inches per crank degree². At the nose they are zero,
 * because every law here ends its rise with v = a = 0.
 */
import { CHECKING_HEIGHT_050 } from './constants';
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireInteger, requireNonNegative, requirePositive } from './errors';
import { requireDuration } from './events';
import { LAW_EVALUATORS, lawInverseRaw, requireMotionLaw, type LawEvaluator, type MotionLawName } from './motion';

/**
 * Longest ramp the fit may use, crank degrees from the advertised point to zero
 * lift. Beyond it the ramp is held at this length and the warp exponent q
 * shrinks below 1 instead.
 */
export const RAMP_MAX = 90;
/** Smallest warp exponent: below 2/3 the acceleration would grow without bound at the opening point. */
export const Q_MIN = 0.7;
/** The law the analysis uses unless told otherwise. */
export const DEFAULT_MOTION_LAW: MotionLawName = 'poly345';

export interface LobeSpec {
  /** Duration at 0.050 in tappet lift, crank degrees. */
  duration050: number;
  /** Advertised duration at advertisedHeight, crank degrees. */
  advertisedDuration: number;
  /** Advertised checking height, inches of tappet lift (below 0.050). */
  advertisedHeight: number;
  /** Lobe (tappet) lift, inches. */
  lobeLift: number;
}

export interface LobeShape {
  law: MotionLawName;
  /** Inches. */
  lobeLift: number;
  /** Half the seat-to-seat event: crank degrees from the centre to zero lift. */
  halfEvent: number;
  /** Seat-to-seat event (lift above zero), crank degrees. */
  seatToSeat: number;
  /** Warp exponent q (1 = Möbius warp). */
  warpExponent: number;
  /** Warp constant k. */
  warpScale: number;
  duration050: number;
  advertisedDuration: number;
  advertisedHeight: number;
}

function logit(p: number): number {
  return Math.log(p / (1 - p));
}

/** Validate a lobe spec; throws CalcInputError naming the field. */
export function requireLobeSpec(input: LobeSpec, prefix?: string): LobeSpec {
  const duration050 = requireDuration(fieldPath(prefix, 'duration050'), input.duration050);
  const advertisedDuration = requireDuration(fieldPath(prefix, 'advertisedDuration'), input.advertisedDuration);
  const advertisedHeight = requireInRange(fieldPath(prefix, 'advertisedHeight'), input.advertisedHeight, {
    min: 0,
    max: CHECKING_HEIGHT_050,
    minOpen: true,
    maxOpen: true,
    unit: 'in',
  });
  const lobeLift = requireInRange(fieldPath(prefix, 'lobeLift'), input.lobeLift, {
    min: CHECKING_HEIGHT_050,
    max: 2,
    minOpen: true,
    unit: 'in',
  });
  if (!(advertisedDuration > duration050)) {
    throw new CalcInputError(
      fieldPath(prefix, 'advertisedDuration'),
      `must be longer than duration050 (${duration050}°), because it is measured at a lower height`,
      advertisedDuration,
    );
  }
  return { duration050, advertisedDuration, advertisedHeight, lobeLift };
}

/** Unchecked kernel of synthesizeLobe; throws CalcInputError when no smooth flank fits. */
export function synthesizeLobeRaw(spec: LobeSpec, law: MotionLawName, prefix?: string): LobeShape {
  const { duration050, advertisedDuration, advertisedHeight, lobeLift } = spec;
  const a = advertisedDuration / 2;
  const b = duration050 / 2;
  const xi1 = lawInverseRaw(law, advertisedHeight / lobeLift);
  const xi2 = lawInverseRaw(law, CHECKING_HEIGHT_050 / lobeLift);
  const delta = logit(xi2) - logit(xi1);
  const spread = Math.log(a / b);
  const tooLong = (): CalcInputError =>
    new CalcInputError(
      fieldPath(prefix, 'advertisedDuration'),
      `${advertisedDuration}° at ${advertisedHeight} in is too long beside ${duration050}° at 0.050 in for a ` +
        `${lobeLift} in lobe: no smooth lobe fits. Check the sheet's durations and heights` +
        (law === 'poly4567' ? ', or use the 3-4-5 law, which allows a longer ramp' : ''),
      advertisedDuration,
    );
  if (!(delta > spread)) throw tooLong();
  const e = Math.exp(delta);
  let halfEvent = (a * b * (e - 1)) / (b * e - a);
  let q = 1;
  if (!(halfEvent <= a + RAMP_MAX)) {
    halfEvent = a + RAMP_MAX;
    const t1 = 1 - a / halfEvent;
    const t2 = 1 - b / halfEvent;
    q = (delta - spread) / Math.log(t2 / t1);
    if (!(q >= Q_MIN)) throw tooLong();
  }
  const t1 = 1 - a / halfEvent;
  const lnK = q * Math.log(t1) - Math.log(1 - t1) - logit(xi1);
  return {
    law,
    lobeLift,
    halfEvent,
    seatToSeat: 2 * halfEvent,
    warpExponent: q,
    warpScale: Math.exp(lnK),
    duration050,
    advertisedDuration,
    advertisedHeight,
  };
}

/**
 * Fit a symmetric lobe to a sheet's lobe lift and its durations at both
 * checking heights. Throws CalcInputError if the numbers cannot describe one
 * smooth lobe (for example an advertised duration far too long).
 */
export function synthesizeLobe(input: LobeSpec & { law?: MotionLawName }, prefix?: string): LobeShape {
  const spec = requireLobeSpec(input, prefix);
  const law = requireMotionLaw(fieldPath(prefix, 'law'), input.law ?? DEFAULT_MOTION_LAW);
  return synthesizeLobeRaw(spec, law, prefix);
}

export interface LobePoint {
  /** Tappet lift, inches. */
  lift: number;
  /** Inches per crank degree. */
  velocity: number;
  /** Inches per crank degree². */
  acceleration: number;
}


/** Unchecked: evaluate a shape at `offset` crank degrees from its centre into `out`. */
export function evalLobeInto(shape: LobeShape, offset: number, out: LobePoint): LobePoint {
  return evalLobeWith(LAW_EVALUATORS[shape.law], shape, offset, out);
}

// Scratch for the kernel (typed arrays keep doubles unboxed: no allocation in hot loops).
const LAW = new Float64Array(3);
const KERNEL = new Float64Array(3);

/**
 * Kernel: tappet lift, velocity (closing flank) and acceleration at
 * |offset| = u < halfEvent, left in KERNEL[0], KERNEL[1], KERNEL[2].
 */
function lobeKernel(law: LawEvaluator, lobeLift: number, invPhi: number, k: number, q: number, u: number): void {
  const tau = 1 - u * invPhi;
  let w: number;
  let w1: number;
  let w2: number;
  if (q === 1) {
    const id = 1 / (k + (1 - k) * tau);
    w = tau * id;
    w1 = k * id * id;
    w2 = -2 * k * (1 - k) * id * id * id;
  } else {
    const n = Math.pow(tau, q);
    const n1 = (q * n) / tau;
    const n2 = ((q - 1) * n1) / tau;
    const dn = n + k * (1 - tau);
    const idn = 1 / dn;
    const uu = n1 * (1 - tau) + n;
    const u1 = n2 * (1 - tau);
    w = n * idn;
    w1 = k * uu * idn * idn;
    w2 = k * (u1 * dn - 2 * uu * (n1 - k)) * idn * idn * idn;
  }
  law(w, LAW);
  const s = LAW[0] ?? 0;
  const v = LAW[1] ?? 0;
  const a = LAW[2] ?? 0;
  KERNEL[0] = lobeLift * s;
  KERNEL[1] = -lobeLift * v * w1 * invPhi;
  KERNEL[2] = lobeLift * (a * w1 * w1 + v * w2) * invPhi * invPhi;
}

function evalLobeWith(law: LawEvaluator, shape: LobeShape, offset: number, out: LobePoint): LobePoint {
  const u = offset < 0 ? -offset : offset;
  if (u >= shape.halfEvent) {
    out.lift = 0;
    out.velocity = 0;
    out.acceleration = 0;
    return out;
  }
  lobeKernel(law, shape.lobeLift, 1 / shape.halfEvent, shape.warpScale, shape.warpExponent, u);
  const vel = KERNEL[1] ?? 0;
  out.lift = KERNEL[0] ?? 0;
  out.velocity = offset > 0 ? vel : offset < 0 ? -vel : 0;
  out.acceleration = KERNEL[2] ?? 0;
  return out;
}

/**
 * Tappet lift, velocity and acceleration at `offset` crank degrees from the
 * lobe centre (negative = opening flank). Inches, in/deg, in/deg².
 */
export function lobeLiftAt(shape: LobeShape, offset: number): LobePoint {
  requireFinite('offset', offset);
  return evalLobeInto(shape, offset, { lift: 0, velocity: 0, acceleration: 0 });
}

export interface CurveGrid {
  /** Crank angle of the first sample, degrees ATDC overlap (negative = before). */
  start: number;
  /** Crank degrees between samples. */
  step: number;
  /** Number of samples. */
  count: number;
}

export interface LiftCurve extends CurveGrid {
  /** Valve lift at each sample, inches. */
  lift: Float64Array;
  /** Valve velocity, inches per crank degree. */
  velocity: Float64Array;
  /** Valve acceleration, inches per crank degree². */
  acceleration: Float64Array;
  /** Crank angle of maximum lift (the lobe centre), degrees ATDC overlap. */
  centerline: number;
  /** Maximum valve lift, inches (lobe lift × rocker ratio − lash). */
  maxLift: number;
  /** Largest valve speed, inches per crank degree. */
  peakVelocity: number;
  /** Largest positive (opening-flank) acceleration, inches per crank degree². */
  peakAcceleration: number;
  /** Most negative (nose) acceleration, inches per crank degree² (≤ 0). */
  peakDeceleration: number;
}

export interface CurveBuffers {
  lift: Float64Array;
  velocity: Float64Array;
  acceleration: Float64Array;
  /**
   * Index range that may hold non-zero values from an earlier fill; outside
   * it the buffers are known to be zero. Absent means "anything may be set".
   */
  written?: { lo: number; hi: number };
}

/** Fresh zeroed buffers for one curve. */
export function createCurveBuffers(count: number): CurveBuffers {
  return {
    lift: new Float64Array(count),
    velocity: new Float64Array(count),
    acceleration: new Float64Array(count),
    written: { lo: 0, hi: -1 },
  };
}

/** Zero [from, to] of all three arrays. */
function zeroRange(out: CurveBuffers, from: number, to: number): void {
  if (to < from) return;
  out.lift.fill(0, from, to + 1);
  out.velocity.fill(0, from, to + 1);
  out.acceleration.fill(0, from, to + 1);
}

const LAW_CODE: Readonly<Record<MotionLawName, number>> = { cycloidal: 0, poly345: 1, poly4567: 2 };

/**
 * Hot loop: valve lift, velocity and acceleration for grid indices i0..i1,
 * where index i sits u = u0 + (i − i0)·du crank degrees from the lobe centre
 * (du > 0 walks down the closing flank, du < 0 down the opening flank).
 * Everything is inlined: this runs ~650 times per analysis.
 */
function fillFlank(
  code: number,
  L: number,
  invPhi: number,
  k: number,
  q: number,
  rockerRatio: number,
  lash: number,
  i0: number,
  i1: number,
  u0: number,
  du: number,
  out: CurveBuffers,
): void {
  const { lift, velocity, acceleration } = out;
  const flank = du < 0 ? 1 : -1; // closing flank: lift falls as the crank turns
  const step = du < 0 ? -du : du;
  const oneMinusK = 1 - k;
  for (let i = i0; i <= i1; i++) {
    const u = i0 === i1 ? u0 : u0 + (i - i0) * step;
    const tau = 1 - u * invPhi;
    if (tau <= 0) {
      lift[i] = 0;
      velocity[i] = 0;
      acceleration[i] = 0;
      continue;
    }
    let w: number;
    let w1: number;
    let w2: number;
    if (q === 1) {
      const id = 1 / (k + oneMinusK * tau);
      w = tau * id;
      w1 = k * id * id;
      w2 = -2 * k * oneMinusK * id * id * id;
    } else {
      const n = Math.pow(tau, q);
      const n1 = (q * n) / tau;
      const n2 = ((q - 1) * n1) / tau;
      const dn = n + k * (1 - tau);
      const idn = 1 / dn;
      const uu = n1 * (1 - tau) + n;
      w = n * idn;
      w1 = k * uu * idn * idn;
      w2 = k * (n2 * (1 - tau) * dn - 2 * uu * (n1 - k)) * idn * idn * idn;
    }
    let s: number;
    let v: number;
    let a: number;
    if (code === 1) {
      const x = w;
      const xx = x * (1 - x);
      s = x * x * x * (10 + x * (-15 + 6 * x));
      v = 30 * xx * xx;
      a = x * (60 + x * (-180 + 120 * x));
    } else if (code === 2) {
      const x = w;
      const x2 = x * x;
      const xx = x * (1 - x);
      s = x2 * x2 * (35 + x * (-84 + x * (70 - 20 * x)));
      v = 140 * xx * xx * xx;
      a = x2 * (420 + x * (-1680 + x * (2100 - 840 * x)));
    } else {
      const t = TWO_PI * w;
      const sn = Math.sin(t);
      s = t < 0.1 ? cycloidalSmall(t) : w - sn / TWO_PI;
      v = 1 - Math.cos(t);
      a = TWO_PI * sn;
    }
    const valve = rockerRatio * L * s - lash;
    if (valve > 0) {
      lift[i] = valve;
      velocity[i] = flank * rockerRatio * L * v * w1 * invPhi;
      acceleration[i] = rockerRatio * L * (a * w1 * w1 + v * w2) * invPhi * invPhi;
    } else {
      lift[i] = 0;
      velocity[i] = 0;
      acceleration[i] = 0;
    }
  }
}

const TWO_PI = 2 * Math.PI;

/** (t − sin t)/2π by series for small t (same as the cycloidal law in motion.ts). */
function cycloidalSmall(t: number): number {
  const t2 = t * t;
  return (t * t2 * (1 / 6 - t2 * (1 / 120 - t2 / 5040))) / TWO_PI;
}

/**
 * Unchecked: sample valve lift = max(0, rocker × tappet lift − lash) for a
 * lobe centred at `centerline` on a grid, writing into `out`.
 */
export function sampleValveCurveRaw(
  shape: LobeShape,
  centerline: number,
  rockerRatio: number,
  lash: number,
  grid: CurveGrid,
  out: CurveBuffers,
): LiftCurve {
  const { start, step, count } = grid;
  const { lift, velocity, acceleration } = out;
  const lo = Math.max(0, Math.ceil((centerline - shape.halfEvent - start) / step));
  const hi = Math.min(count - 1, Math.floor((centerline + shape.halfEvent - start) / step));
  // clear what an earlier fill left outside this event
  const dirty = out.written ?? { lo: 0, hi: count - 1 };
  zeroRange(out, dirty.lo, Math.min(dirty.hi, lo - 1));
  zeroRange(out, Math.max(dirty.lo, hi + 1), dirty.hi);
  const L = shape.lobeLift;
  const phi = shape.halfEvent;
  const invPhi = 1 / phi;
  const k = shape.warpScale;
  const q = shape.warpExponent;
  let peakVelocity = 0;
  let peakAcceleration = 0;
  let peakDeceleration = 0;
  // The lobe is symmetric: when the centre sits on a grid point, evaluate the
  // closing flank once and mirror it onto the opening flank (velocity flips).
  const centreIndex = (centerline - start) / step;
  const ic = Math.round(centreIndex);
  const code = LAW_CODE[shape.law];
  const mirrored = Math.abs(centreIndex - ic) < 1e-9 && ic >= lo && ic <= hi;
  if (mirrored) {
    const top = Math.min(hi, ic + Math.max(ic - lo, hi - ic));
    fillFlank(code, L, invPhi, k, q, rockerRatio, lash, ic, top, 0, step, out);
    const bottom = lo;
    for (let i = ic - 1; i >= bottom; i--) {
      const m = 2 * ic - i;
      if (m <= top) {
        lift[i] = lift[m] ?? 0;
        velocity[i] = -(velocity[m] ?? 0);
        acceleration[i] = acceleration[m] ?? 0;
      } else {
        fillFlank(code, L, invPhi, k, q, rockerRatio, lash, i, i, (ic - i) * step, -step, out);
      }
    }
  } else {
    for (let i = lo; i <= hi; i++) {
      const offset = start + i * step - centerline;
      // one point at a time; the sign of dOffset/di carries the flank direction
      fillFlank(code, L, invPhi, k, q, rockerRatio, lash, i, i, offset < 0 ? -offset : offset, offset < 0 ? -1 : 1, out);
    }
  }
  // peaks over the event (one flank is enough when it was mirrored)
  const peakFrom = mirrored ? ic : lo;
  for (let i = peakFrom; i <= hi; i++) {
    const v = velocity[i] ?? 0;
    const a = acceleration[i] ?? 0;
    const speed = v < 0 ? -v : v;
    if (speed > peakVelocity) peakVelocity = speed;
    if (a > peakAcceleration) peakAcceleration = a;
    if (a < peakDeceleration) peakDeceleration = a;
  }
  if (mirrored) {
    // points on the opening flank beyond the mirror of the closing flank
    for (let i = lo; i < 2 * ic - hi; i++) {
      const v = velocity[i] ?? 0;
      const a = acceleration[i] ?? 0;
      if (v > peakVelocity) peakVelocity = v;
      if (a > peakAcceleration) peakAcceleration = a;
      if (a < peakDeceleration) peakDeceleration = a;
    }
  }
  out.written = hi >= lo ? { lo, hi } : { lo: 0, hi: -1 };
  return {
    start,
    step,
    count,
    lift,
    velocity,
    acceleration,
    centerline,
    maxLift: rockerRatio * shape.lobeLift - lash,
    peakVelocity,
    peakAcceleration,
    peakDeceleration,
  };
}

export interface SynthesizeCurveInput extends LobeSpec {
  law?: MotionLawName;
  /** Lobe centre, crank degrees ATDC overlap (ICL for intake, −ECL for exhaust). */
  centerline: number;
  /** Rocker ratio; 1 gives tappet lift. */
  rockerRatio: number;
  /** Lash at the valve, inches; 0 for hydraulic. */
  lash: number;
  /** Sampling grid; defaults to −360…+360 crank degrees in 0.5° steps. */
  grid?: CurveGrid;
}

/** The analysis grid: a whole four-stroke cycle centred on overlap TDC at 0.5° steps. */
export const CYCLE_GRID: CurveGrid = { start: -360, step: 0.5, count: 1441 };

/** Check a sampling grid. */
export function requireGrid(grid: CurveGrid, prefix?: string): CurveGrid {
  return {
    start: requireFinite(fieldPath(prefix, 'start'), grid.start),
    step: requirePositive(fieldPath(prefix, 'step'), grid.step, 'crank degrees'),
    count: requireInteger(fieldPath(prefix, 'count'), grid.count, 2),
  };
}

/**
 * A valve lift curve (lift, velocity, acceleration) sampled on a grid,
 * synthesised from the lobe spec so that both checking-height durations and
 * the lobe lift are met exactly.
 */
export function synthesizeLiftCurve(input: SynthesizeCurveInput, prefix?: string): LiftCurve {
  const shape = synthesizeLobe(input, prefix);
  const centerline = requireInRange(fieldPath(prefix, 'centerline'), input.centerline, { min: -360, max: 360 });
  const rockerRatio = requireInRange(fieldPath(prefix, 'rockerRatio'), input.rockerRatio, { min: 0.5, max: 3 });
  const lash = requireNonNegative(fieldPath(prefix, 'lash'), input.lash, 'in');
  if (!(rockerRatio * shape.lobeLift - lash > 0)) {
    throw new CalcInputError(fieldPath(prefix, 'lash'), 'must be less than lobe lift × rocker ratio', lash);
  }
  const grid = requireGrid(input.grid ?? CYCLE_GRID, fieldPath(prefix, 'grid'));
  return sampleValveCurveRaw(shape, centerline, rockerRatio, lash, grid, createCurveBuffers(grid.count));
}
