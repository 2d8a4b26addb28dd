/**
 * Lift-curve synthesis from a lobe spec: a single-dwell lobe.
 *
 * A regrind sheet gives, per lobe, the lobe lift L, the duration D₂ at 0.050 in
 * tappet lift and the advertised duration D₁ at a lower height h₁. A cam lobe
 * rises and falls with no dwell at the top (a single-dwell cam), so the curve
 * here is one symmetric function of the offset φ from the lobe centre, not a
 * rise law mirrored at the nose:
 *
 *   lift(φ) = L · g(m)³,   m = 1 − ψ²,   ψ = |φ| / Φ ∈ [0, 1],
 *   g(m) = k·m / (1 + (k − 1)·m)   (a Möbius warp: g(0) = 0, g(1) = 1, increasing).
 *
 * With k = 1, g(m) = m and lift = L(1 − ψ²)³ = L·64x³(1 − x)³ over the event
 * x ∈ [0, 1]: the 3-4-5-6 polynomial for a symmetric single-dwell rise and fall,
 * s = h[64(θ/β)³ − 192(θ/β)⁴ + 192(θ/β)⁵ − 64(θ/β)⁶] (R. L. Norton, "Design of
 * Machinery", single-dwell cam design with polynomials; also Norton, "Cam Design
 * and Manufacturing Handbook", ch. 3; from memory). The warp k bends its time
 * axis so that the lobe meets two checking heights.
 *
 * Properties (each is a test):
 * - lift, velocity and acceleration are zero at the seat (ψ = 1) and the jerk
 *   there is finite, L·(−8·g‴ …) = 48·L·k³/Φ³ in magnitude;
 * - the function depends on ψ² only, so it is smooth through the nose:
 *   acceleration there is −6L/(kΦ²), the same from both flanks;
 * - G(m) = g(m)³ is convex in m exactly when k ≤ 2, and a convex G puts the
 *   largest deceleration exactly at the nose (lift″(ψ) = −2G′(m) + 4ψ²G″(m) ≥ −2G′(1)).
 *   Sheets needing k > 2 are refused.
 *
 * Fit: let rᵢ = (hᵢ/L)^⅓ and cᵢ = 1 − rᵢ, so each checking point needs
 * 1 − g(mᵢ) = rᵢ with ψᵢ = Dᵢ/(2Φ). In logit form logit(1 − g) = logit(ψ²) − ln k,
 * so both points give, with a = D₁/2, b = D₂/2, E = exp(logit c₁ − logit c₂):
 *     Φ² = a²b²(E − 1) / (E·b² − a²),   ln k = logit(a²/Φ²) − logit c₁.
 * A fit exists only when E·b² > a² (else the advertised duration is too long for
 * the lift). Both durations and the lobe lift are then met exactly.
 *
 * Velocity and acceleration follow by the chain rule and are exact, in inches
 * per crank degree and inches per crank degree².
 */
import { CHECKING_HEIGHT_050 } from './constants';
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireInteger, requireNonNegative, requireObject, requirePositive } from './errors';
import { requireDuration } from './events';

/**
 * Longest ramp the fit may use, crank degrees from the advertised point to zero
 * lift. A sheet that needs more is refused.
 */
export const RAMP_MAX = 90;
/** Largest warp constant: above 2 the lobe's largest deceleration leaves the nose. */
export const WARP_MAX = 2;
/**
 * Plausibility bound on tappet acceleration (either sign), inches per crank
 * degree² (0.0005 in/crank°² = 0.002 in/cam°²). Lobewright's own bound, no
 * source: several times the fastest lobes in the range regrind sheets use.
 * A sheet whose lobe would need more is refused.
 */
export const LOBE_ACCELERATION_MAX = 0.0005;

/** The one lobe law synthesis uses: the single-dwell 3-4-5-6 polynomial with a Möbius warp. */
export type LobeLawName = 'single-dwell-3456';
export const LOBE_LAW: LobeLawName = 'single-dwell-3456';

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
  law: LobeLawName;
  /** Inches. */
  lobeLift: number;
  /** Half the seat-to-seat event: crank degrees from the centre to zero lift. */
  halfEvent: number;
  /** Seat-to-seat event (lift above zero), crank degrees. */
  seatToSeat: number;
  /** Warp constant k (1 = the plain 3-4-5-6 polynomial). */
  warpScale: number;
  duration050: number;
  advertisedDuration: number;
  advertisedHeight: number;
  /** Largest tappet speed, inches per crank degree. */
  peakVelocity: number;
  /** Largest positive tappet acceleration, inches per crank degree². */
  peakAcceleration: number;
  /** Where it falls, crank degrees from the lobe centre (on the closing flank; mirrored on the opening one). */
  peakAccelerationAt: number;
  /** Largest deceleration, inches per crank degree² (negative; at the nose). */
  peakDeceleration: number;
  /** Where it falls, crank degrees from the lobe centre (0 = the nose). */
  peakDecelerationAt: number;
}

function logit(p: number): number {
  return Math.log(p / (1 - p));
}

/** Validate a lobe spec; throws CalcInputError naming the field. */
export function requireLobeSpec(input: LobeSpec, prefix?: string): LobeSpec {
  requireObject(prefix ?? 'spec', input);
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

/**
 * The lobe law, the one place it is written: G = g(m)³ at ψ ∈ [0, 1) times
 * `liftScale` into `lift[j]` and, unless `velocity` is null, dG/dψ times
 * `velocityScale` into `velocity[j]` and d²G/dψ² times `accelerationScale`
 * into `acceleration[j]` (G is 1 at the nose, ψ = 1 at the seat; scales of
 * L, L/Φ and L/Φ² give inches, in/crank° and in/crank°²). Scalar callers pass
 * one-element arrays. A plain function of numbers and typed arrays, so it
 * inlines into hot loops.
 */
export function lobeLawInto(
  k: number,
  psi: number,
  liftScale: number,
  velocityScale: number,
  accelerationScale: number,
  lift: Float64Array,
  velocity: Float64Array | null,
  acceleration: Float64Array | null,
  j: number,
): void {
  const p2 = psi * psi;
  const m = 1 - p2;
  const km1 = k - 1;
  const iD = 1 / (1 + km1 * m);
  const q = k * iD;
  const g = m * q;
  const g2 = g * g;
  lift[j] = liftScale * g2 * g;
  if (velocity === null || acceleration === null) return;
  // g′(m) = k/(1 + (k − 1)m)², g″(m) = −2k(k − 1)/(1 + (k − 1)m)³, and with dm/dψ = −2ψ:
  // dG/dψ = 3g²·g′·(−2ψ),  d²G/dψ² = 6g·g′·(4ψ²·g′ − g·(1 + 4(k − 1)ψ²/(1 + (k − 1)m)))
  const gm = q * iD;
  velocity[j] = velocityScale * (-6 * psi * g2 * gm);
  acceleration[j] = accelerationScale * (6 * g * gm * (4 * p2 * gm - g * (1 + 4 * km1 * p2 * iD)));
}

// Scratch for scalar evaluations (typed arrays keep doubles unboxed: no allocation in hot loops).
const K0 = new Float64Array(1);
const K1 = new Float64Array(1);
const K2 = new Float64Array(1);

/** Normalised acceleration d²G/dψ² at ψ. */
function accelAt(k: number, psi: number): number {
  lobeLawInto(k, psi, 1, 1, 1, K0, K1, K2, 0);
  return K2[0] ?? 0;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/**
 * Peaks of the normalised lobe: the largest d²G/dψ² (a coarse scan, then
 * golden-section refinement; it is single-peaked on the flank) and the
 * largest speed −dG/dψ, which sits where d²G/dψ² crosses zero between the
 * nose (negative) and that peak (Illinois false position).
 */
function lobePeaks(k: number): { accel: number; accelPsi: number; speed: number; speedPsi: number } {
  const n = 12;
  let best = -Infinity;
  let bestI = n;
  for (let i = 1; i < n; i++) {
    const v = accelAt(k, i / n);
    if (v > best) {
      best = v;
      bestI = i;
    }
  }
  let lo = (bestI - 1) / n;
  let hi = (bestI + 1) / n;
  let x1 = hi - GOLDEN * (hi - lo);
  let x2 = lo + GOLDEN * (hi - lo);
  let f1 = accelAt(k, x1);
  let f2 = accelAt(k, x2);
  while (hi - lo > 1e-7) {
    if (f1 > f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - GOLDEN * (hi - lo);
      f1 = accelAt(k, x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + GOLDEN * (hi - lo);
      f2 = accelAt(k, x2);
    }
  }
  const accelPsi = (lo + hi) / 2;
  const accel = accelAt(k, accelPsi);
  // zero of the acceleration in (0, accelPsi): Illinois false position
  let a = 0;
  let fa = accelAt(k, 0);
  let b = accelPsi;
  let fb = accel;
  let side = 0;
  let x = b;
  for (let i = 0; i < 60 && b - a > 1e-12; i++) {
    x = (a * fb - b * fa) / (fb - fa);
    const fx = accelAt(k, x);
    if (fx === 0) break;
    if (fx < 0) {
      a = x;
      fa = fx;
      if (side === -1) fb /= 2;
      side = -1;
    } else {
      b = x;
      fb = fx;
      if (side === 1) fa /= 2;
      side = 1;
    }
  }
  lobeLawInto(k, x, 1, 1, 1, K0, K1, K2, 0);
  return { accel, accelPsi, speed: -(K1[0] ?? 0), speedPsi: x };
}

/** The sheet's numbers in words, for refusals. */
function sheetWords(spec: LobeSpec): string {
  return `${spec.advertisedDuration}° at ${spec.advertisedHeight} in beside ${spec.duration050}° at 0.050 in for a ${spec.lobeLift} in lobe`;
}

/** The refusal when the advertised duration is too long for the difference in height. */
function rampTooLong(spec: LobeSpec, prefix: string | undefined): CalcInputError {
  return new CalcInputError(
    fieldPath(prefix, 'advertisedDuration'),
    `${sheetWords(spec)}: the advertised duration is too long for the difference in height (the ramp would pass ${RAMP_MAX}°), ` +
      `so no smooth lobe fits. Check advertisedDuration, duration050 and advertisedHeight`,
    spec.advertisedDuration,
  );
}

/** Unchecked kernel of synthesizeLobe; throws CalcInputError when no smooth lobe fits. */
export function synthesizeLobeRaw(spec: LobeSpec, prefix?: string): LobeShape {
  const { duration050, advertisedDuration, advertisedHeight, lobeLift } = spec;
  const a = advertisedDuration / 2;
  const b = duration050 / 2;
  const c1 = 1 - Math.cbrt(advertisedHeight / lobeLift);
  const c2 = 1 - Math.cbrt(CHECKING_HEIGHT_050 / lobeLift);
  const e = Math.exp(logit(c1) - logit(c2));
  if (!(e * b * b > a * a)) throw rampTooLong(spec, prefix);
  const phi2 = (a * a * b * b * (e - 1)) / (e * b * b - a * a);
  const halfEvent = Math.sqrt(phi2);
  if (!(halfEvent - a <= RAMP_MAX)) throw rampTooLong(spec, prefix);
  const k = Math.exp(logit((a * a) / phi2) - logit(c1));
  if (!(k <= WARP_MAX)) {
    throw new CalcInputError(
      fieldPath(prefix, 'advertisedDuration'),
      `${sheetWords(spec)}: advertisedDuration and duration050 are too close for the difference in height, ` +
        `so the lobe would need its hardest deceleration on the flanks instead of at the nose. Check both durations and advertisedHeight`,
      advertisedDuration,
    );
  }
  const scale = lobeLift / phi2;
  const peakDeceleration = (-6 * lobeLift) / (k * phi2);
  const peaks = lobePeaks(k);
  const peakAcceleration = peaks.accel * scale;
  if (!(peakAcceleration <= LOBE_ACCELERATION_MAX && -peakDeceleration <= LOBE_ACCELERATION_MAX)) {
    const worst = Math.max(peakAcceleration, -peakDeceleration);
    throw new CalcInputError(
      fieldPath(prefix, 'lobeLift'),
      `${sheetWords(spec)}: the lobe would need ${worst.toExponential(2)} in/crank°² of tappet acceleration, past the ` +
        `${LOBE_ACCELERATION_MAX} in/crank°² a real lobe stays under. Check lobeLift, duration050 and advertisedDuration`,
      lobeLift,
    );
  }
  return {
    law: LOBE_LAW,
    lobeLift,
    halfEvent,
    seatToSeat: 2 * halfEvent,
    warpScale: k,
    duration050,
    advertisedDuration,
    advertisedHeight,
    peakVelocity: (peaks.speed * lobeLift) / halfEvent,
    peakAcceleration,
    peakAccelerationAt: peaks.accelPsi * halfEvent,
    peakDeceleration,
    peakDecelerationAt: 0,
  };
}

/**
 * Fit a symmetric single-dwell lobe to a sheet's lobe lift and its durations at
 * both checking heights (shape `{ duration050, advertisedDuration, advertisedHeight, lobeLift }`,
 * crank degrees and inches of tappet lift). Throws CalcInputError naming the
 * field if the numbers cannot describe one smooth lobe.
 */
export function synthesizeLobe(input: LobeSpec, prefix?: string): LobeShape {
  return synthesizeLobeRaw(requireLobeSpec(input, prefix), prefix);
}

/**
 * Crank degrees from the lobe centre at which tappet lift falls to `height`
 * inches (0 < height < lobeLift): the closed-form inverse of the lobe.
 */
export function offsetAtLiftRaw(shape: LobeShape, height: number): number {
  const r = Math.cbrt(height / shape.lobeLift);
  const k = shape.warpScale;
  // lift = L·g(m)³, so g(m) = r  ⇔  m = r / (k − (k − 1)·r)
  const m = r / (k - (k - 1) * r);
  return shape.halfEvent * Math.sqrt(Math.max(0, 1 - m));
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
  const u = offset < 0 ? -offset : offset;
  if (u >= shape.halfEvent) {
    out.lift = 0;
    out.velocity = 0;
    out.acceleration = 0;
    return out;
  }
  const invPhi = 1 / shape.halfEvent;
  const L = shape.lobeLift;
  lobeLawInto(shape.warpScale, u * invPhi, L, L * invPhi, L * invPhi * invPhi, K0, K1, K2, 0);
  const vel = K1[0] ?? 0; // d/d|φ|: negative on the way down from the nose
  out.lift = K0[0] ?? 0;
  out.velocity = offset > 0 ? vel : offset < 0 ? -vel : 0;
  out.acceleration = K2[0] ?? 0;
  return out;
}

/**
 * Tappet lift, velocity and acceleration at `offset` crank degrees from the
 * lobe centre (negative = opening flank). Inches, in/deg, in/deg².
 */
export function lobeLiftAt(shape: LobeShape, offset: number): LobePoint {
  requireObject('shape', shape);
  requirePositive('shape.halfEvent', shape.halfEvent, 'crank degrees');
  requirePositive('shape.lobeLift', shape.lobeLift, 'in');
  requireInRange('shape.warpScale', shape.warpScale, { min: 0, max: WARP_MAX, minOpen: true });
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
  /** Largest positive (flank) acceleration, inches per crank degree². */
  peakAcceleration: number;
  /** Most negative (nose) acceleration, inches per crank degree² (≤ 0). */
  peakDeceleration: number;
}

/**
 * One flank of a lobe sampled once, from the nose outwards: entry j lies
 * j × step crank degrees from the lobe centre. Every curve of a lobe (the
 * valve curve on the cycle grid, the cam-degree samples for pressure angle,
 * curvature and the envelope) reads these entries instead of evaluating the
 * law again: the lobe is symmetric, so the other flank is the mirror image.
 */
export interface LobeTable {
  /** The shape last sampled into the table (null before the first fill). */
  shape: LobeShape | null;
  /** Crank degrees between entries. */
  step: number;
  /** Entries filled. */
  count: number;
  /** True when the entries reach the seat: every entry from `count` on is zero. */
  seated: boolean;
  /** Tappet lift, inches. */
  lift: Float64Array;
  /** d lift / d|φ|, inches per crank degree (0 or negative: the lift falls away from the nose). */
  velocity: Float64Array;
  /** d² lift / dφ², inches per crank degree². */
  acceleration: Float64Array;
}

/** An empty table with room for `capacity` entries. */
export function createLobeTable(capacity: number): LobeTable {
  return {
    shape: null,
    step: 0,
    count: 0,
    seated: false,
    lift: new Float64Array(capacity),
    velocity: new Float64Array(capacity),
    acceleration: new Float64Array(capacity),
  };
}

/**
 * Unchecked: sample `count` entries of `shape`'s flank, `step` crank degrees
 * apart, into `table` (grown when too small; the table that holds them is
 * returned). Entries at or past the seat are zero.
 */
export function fillLobeTableRaw(shape: LobeShape, step: number, count: number, table: LobeTable): LobeTable {
  const out = table.lift.length >= count ? table : createLobeTable(count);
  const { lift, velocity, acceleration } = out;
  const invPhi = 1 / shape.halfEvent;
  const k = shape.warpScale;
  const L = shape.lobeLift;
  const vScale = L * invPhi;
  const aScale = vScale * invPhi;
  let seated = false;
  for (let j = 0; j < count; j++) {
    const psi = j * step * invPhi;
    if (psi >= 1) {
      lift[j] = 0;
      velocity[j] = 0;
      acceleration[j] = 0;
      seated = true;
      continue;
    }
    lobeLawInto(k, psi, L, vScale, aScale, lift, velocity, acceleration, j);
  }
  out.shape = shape;
  out.step = step;
  out.count = count;
  out.seated = seated;
  return out;
}

/**
 * The table holding at least `count` entries of `shape`'s flank at `step`:
 * `table` itself when it already does (same shape object, same step), else
 * refilled. Shapes are never changed once made, so the same object means the
 * same lobe.
 */
export function lobeTableRaw(shape: LobeShape, step: number, count: number, table: LobeTable): LobeTable {
  if (table.shape === shape && table.step === step && (table.count >= count || table.seated)) return table;
  return fillLobeTableRaw(shape, step, count, table);
}

/**
 * Unchecked: tappet lift (inches) of a lobe sampled round one whole turn of
 * `lift.length` samples, `crankStep` crank degrees apart, with its centre at
 * (fractional) index `centre`; the event wraps past the ends.
 */
export function fillTurnLiftRaw(shape: LobeShape, centre: number, crankStep: number, lift: Float64Array): void {
  const count = lift.length;
  lift.fill(0);
  const half = shape.halfEvent / crankStep; // samples from the centre to the seat
  const invPhi = 1 / shape.halfEvent;
  const L = shape.lobeLift;
  const k = shape.warpScale;
  const from = Math.ceil(centre - half);
  const to = Math.floor(centre + half);
  for (let j = from; j <= to; j++) {
    const d = j - centre;
    const u = d < 0 ? -d : d;
    if (u >= half) continue;
    const i = j < 0 ? j + count : j >= count ? j - count : j;
    lobeLawInto(k, crankStep * u * invPhi, L, 0, 0, lift, null, null, i);
  }
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
  /** The flank the last fill sampled (when the lobe centre sat on a grid point). */
  table?: LobeTable;
}

/** Fresh zeroed buffers for one curve. */
export function createCurveBuffers(count: number): CurveBuffers {
  return {
    lift: new Float64Array(count),
    velocity: new Float64Array(count),
    acceleration: new Float64Array(count),
    written: { lo: 0, hi: -1 },
    table: createLobeTable(Math.ceil(count / 2) + 1),
  };
}

/** Zero [from, to] of all three arrays. */
function zeroRange(out: CurveBuffers, from: number, to: number): void {
  if (to < from) return;
  out.lift.fill(0, from, to + 1);
  out.velocity.fill(0, from, to + 1);
  out.acceleration.fill(0, from, to + 1);
}

/**
 * Valve lift, velocity and acceleration at grid index i from a tappet lift s,
 * its speed away from the nose sv (d s / d|φ|) and acceleration sa; `flank`
 * is +1 on the closing flank (after the centre), −1 on the opening flank.
 */
function setValve(
  lift: Float64Array,
  velocity: Float64Array,
  acceleration: Float64Array,
  i: number,
  s: number,
  sv: number,
  sa: number,
  flank: number,
  rockerRatio: number,
  lash: number,
): void {
  const valve = rockerRatio * s - lash;
  if (valve > 0) {
    lift[i] = valve;
    velocity[i] = flank * rockerRatio * sv;
    acceleration[i] = rockerRatio * sa;
  } else {
    lift[i] = 0;
    velocity[i] = 0;
    acceleration[i] = 0;
  }
}

/**
 * Unchecked: sample valve lift = max(0, rocker × tappet lift − lash) for a
 * lobe centred at `centerline` on a grid, writing into `out`.
 */
export function sampleValveCurveRaw(shape: LobeShape, centerline: number, rockerRatio: number, lash: number, grid: CurveGrid, out: CurveBuffers): LiftCurve {
  const { start, step, count } = grid;
  const { lift, velocity, acceleration } = out;
  const lo = Math.max(0, Math.ceil((centerline - shape.halfEvent - start) / step));
  const hi = Math.min(count - 1, Math.floor((centerline + shape.halfEvent - start) / step));
  // clear what an earlier fill left outside this event
  const dirty = out.written ?? { lo: 0, hi: count - 1 };
  zeroRange(out, dirty.lo, Math.min(dirty.hi, lo - 1));
  zeroRange(out, Math.max(dirty.lo, hi + 1), dirty.hi);
  // The lobe is symmetric: when the centre sits on a grid point, sample one
  // flank once and write both from it (velocity flips sign).
  const centreIndex = (centerline - start) / step;
  const ic = Math.round(centreIndex);
  if (Math.abs(centreIndex - ic) < 1e-9 && ic >= lo && ic <= hi) {
    // one entry more than the grid needs, past the seat, so the table is whole for the cam geometry
    const table = fillLobeTableRaw(shape, step, Math.max(ic - lo, hi - ic) + 2, out.table ?? createLobeTable(0));
    out.table = table;
    const tl = table.lift;
    const tv = table.velocity;
    const ta = table.acceleration;
    const up = hi - ic;
    const down = ic - lo;
    const reach = up > down ? up : down;
    for (let d = 0; d <= reach; d++) {
      const valve = rockerRatio * (tl[d] ?? 0) - lash;
      const open = valve > 0;
      const v = open ? valve : 0;
      const sv = open ? rockerRatio * (tv[d] ?? 0) : 0;
      const sa = open ? rockerRatio * (ta[d] ?? 0) : 0;
      if (d <= up) {
        lift[ic + d] = v;
        velocity[ic + d] = sv;
        acceleration[ic + d] = sa;
      }
      if (d <= down) {
        lift[ic - d] = v;
        velocity[ic - d] = d === 0 ? sv : -sv;
        acceleration[ic - d] = sa;
      }
    }
  } else {
    const L = shape.lobeLift;
    const invPhi = 1 / shape.halfEvent;
    const k = shape.warpScale;
    for (let i = lo; i <= hi; i++) {
      const offset = start + i * step - centerline;
      const u = offset < 0 ? -offset : offset;
      const psi = u * invPhi;
      if (psi >= 1) {
        setValve(lift, velocity, acceleration, i, 0, 0, 0, 1, rockerRatio, lash);
        continue;
      }
      lobeLawInto(k, psi, L, L * invPhi, L * invPhi * invPhi, K0, K1, K2, 0);
      setValve(lift, velocity, acceleration, i, K0[0] ?? 0, K1[0] ?? 0, K2[0] ?? 0, offset < 0 ? -1 : 1, rockerRatio, lash);
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
    // exact peaks of the lobe (the valve is open wherever they fall: they lie well above the lash)
    peakVelocity: rockerRatio * shape.peakVelocity,
    peakAcceleration: rockerRatio * shape.peakAcceleration,
    peakDeceleration: rockerRatio * shape.peakDeceleration,
  };
}

export interface SynthesizeCurveInput extends LobeSpec {
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

/** Most samples any grid or table may have (0.05° steps over a whole four-stroke cycle). */
export const GRID_MAX = 14401;

/** Check a sampling grid: finite start, positive step, 2 to GRID_MAX samples. */
export function requireGrid(grid: CurveGrid, prefix?: string): CurveGrid {
  requireObject(prefix ?? 'grid', grid);
  const count = requireInteger(fieldPath(prefix, 'count'), grid.count, 2);
  if (count > GRID_MAX) throw new CalcInputError(fieldPath(prefix, 'count'), `must be at most ${GRID_MAX} samples (got ${count})`, count);
  const start = requireInRange(fieldPath(prefix, 'start'), grid.start, { min: -1e4, max: 1e4, unit: 'degrees' });
  const step = requireInRange(fieldPath(prefix, 'step'), grid.step, { min: 0, max: 360, minOpen: true, unit: 'degrees' });
  return { start, step, count };
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
