/**
 * Cam-surface geometry from a lobe's tappet lift against cam angle: pressure
 * angle (in-line translating roller follower), radius of curvature of the
 * pitch curve and of the cam surface (roller or flat tappet), and the
 * material margin between a core lobe and a candidate ground from it.
 *
 * Units: inches, cam degrees (a cam turns once per two crank turns, so a cam
 * degree is two crank degrees). Lift derivatives are taken per cam degree in
 * the inputs and converted to per radian inside.
 *
 * Formulas (R. L. Norton, "Cam Design and Manufacturing Handbook", ch. 7 and
 * "Design of Machinery", §8.7–8.8, from memory), with Rp = Rb + Rr the prime
 * circle, s lift, s′ = ds/dθ and s″ = d²s/dθ² per radian:
 * - pressure angle, in-line roller: φ = atan(s′ / (Rp + s));
 * - pitch curve of a radial follower is the polar curve r(θ) = Rp + s(θ), so its
 *   radius of curvature is the polar formula ρ = (r² + r′²)^{3/2} / (r² + 2r′² − r·r″);
 *   the cam surface is the pitch curve offset inward by the roller radius,
 *   ρ_surface = ρ_pitch − Rr (convex when ρ_pitch > 0);
 * - flat-faced follower: ρ = Rb + s + s″.
 */
import { CalcInputError, fieldPath, requireFinite, requireInRange, requireObject, requirePositive } from './errors';

const RAD = 180 / Math.PI; // cam degrees per radian

/** Most samples one lobe table may have (0.025 cam degree over a whole turn). */
export const LOBE_SAMPLES_MAX = 14400;

/** A surface flatter than this is drawn as straight: radius arrays are clipped to ±RADIUS_CLIP inches. */
export const RADIUS_CLIP = 100;

/**
 * Tappet lift sampled against cam angle. Angles are in any frame the caller
 * likes (usually cam degrees from the lobe centre, or half the crank angle
 * ATDC overlap); results report angles in the same frame.
 */
export interface CamLobeSamples {
  /** Cam degrees of the first sample. */
  start: number;
  /** Cam degrees between samples (more than 0, at most 5). */
  step: number;
  /** Tappet lift at each sample, inches; 0 on the base circle. 3 to LOBE_SAMPLES_MAX samples. */
  lift: ArrayLike<number>;
  /** ds/dθ, inches per cam degree, one per sample. Optional: central differences of lift otherwise. */
  velocity?: ArrayLike<number>;
  /** d²s/dθ², inches per cam degree², one per sample. Optional: central differences otherwise. */
  acceleration?: ArrayLike<number>;
}

/** Which follower rides the lobe. */
export type CamFollower = { kind: 'roller'; rollerDiameter: number } | { kind: 'flat' };

interface CheckedSamples {
  start: number;
  step: number;
  n: number;
  lift: Float64Array;
  velocity: Float64Array;
  acceleration: Float64Array;
}

function requireArray(field: string, value: unknown, n?: number): ArrayLike<number> {
  const ok = Array.isArray(value) || value instanceof Float64Array;
  if (!ok) throw new CalcInputError(field, 'must be a list of numbers', value);
  const arr = value as ArrayLike<number>;
  if (n === undefined) {
    if (arr.length < 3 || arr.length > LOBE_SAMPLES_MAX) {
      throw new CalcInputError(field, `must have 3 to ${LOBE_SAMPLES_MAX} samples (got ${arr.length})`, arr.length);
    }
  } else if (arr.length !== n) {
    throw new CalcInputError(field, `must have one value per lift sample (${n}, got ${arr.length})`, arr.length);
  }
  for (let i = 0; i < arr.length; i++) requireFinite(`${field}[${i}]`, arr[i]);
  return arr;
}

/** Validate a lobe table and fill in missing derivatives by central differences (periodic ends are not assumed). */
export function requireCamLobe(input: CamLobeSamples, prefix: string): CheckedSamples {
  requireObject(prefix, input);
  const start = requireInRange(fieldPath(prefix, 'start'), input.start, { min: -720, max: 720, unit: 'cam degrees' });
  const step = requireInRange(fieldPath(prefix, 'step'), input.step, { min: 0, max: 5, minOpen: true, unit: 'cam degrees' });
  const liftIn = requireArray(fieldPath(prefix, 'lift'), input.lift);
  const n = liftIn.length;
  if ((n - 1) * step > 360) {
    throw new CalcInputError(fieldPath(prefix, 'lift'), `covers ${((n - 1) * step).toFixed(1)} cam degrees: one turn (360) at most`, n);
  }
  const lift = Float64Array.from(liftIn);
  for (let i = 0; i < n; i++) {
    const v = lift[i] ?? 0;
    if (v < 0 || v > 2) throw new CalcInputError(`${fieldPath(prefix, 'lift')}[${i}]`, `must be 0 to 2 in (got ${v})`, v);
  }
  const velocity = new Float64Array(n);
  const acceleration = new Float64Array(n);
  if (input.velocity !== undefined) velocity.set(requireArray(fieldPath(prefix, 'velocity'), input.velocity, n));
  else differentiate(lift, step, velocity);
  if (input.acceleration !== undefined) acceleration.set(requireArray(fieldPath(prefix, 'acceleration'), input.acceleration, n));
  else if (input.velocity !== undefined) differentiate(velocity, step, acceleration);
  else secondDifference(lift, step, acceleration);
  return { start, step, n, lift, velocity, acceleration };
}

/** Central first differences (one-sided at the ends). */
function differentiate(y: Float64Array, h: number, out: Float64Array): void {
  const n = y.length;
  for (let i = 0; i < n; i++) {
    const up = y[Math.min(n - 1, i + 1)] ?? 0;
    const dn = y[Math.max(0, i - 1)] ?? 0;
    const span = (Math.min(n - 1, i + 1) - Math.max(0, i - 1)) * h;
    out[i] = (up - dn) / span;
  }
}

/** Central second differences (copied from the neighbour at the ends). */
function secondDifference(y: Float64Array, h: number, out: Float64Array): void {
  const n = y.length;
  for (let i = 1; i < n - 1; i++) out[i] = ((y[i + 1] ?? 0) - 2 * (y[i] ?? 0) + (y[i - 1] ?? 0)) / (h * h);
  out[0] = out[1] ?? 0;
  out[n - 1] = out[n - 2] ?? 0;
}

// ---------------------------------------------------------------------------
// Pressure angle

export interface FlankPeak {
  /** Degrees (pressure angle) or inches (radius). */
  value: number;
  /** Cam degrees, in the input's frame. */
  at: number;
}

export interface PressureAngleResult {
  /** Pressure angle at each sample, degrees: positive on the rise, negative on the fall. */
  angles: Float64Array;
  /** Largest pressure angle on the rise (lift increasing with cam angle), degrees, and where. */
  rise: FlankPeak;
  /** Largest pressure angle on the fall, degrees (as a positive number), and where. */
  fall: FlankPeak;
}

/** tan of the pressure angle of an in-line roller follower: s′ / (Rp + s), s′ per radian (velocity in/cam°). */
function pressureTan(lift: number, velocity: number, primeRadius: number): number {
  return (velocity * RAD) / (primeRadius + lift);
}

/** Pressure-angle peaks as tangents, and the cam angles where they fall. */
export interface PressurePeaks {
  riseTan: number;
  riseAt: number;
  fallTan: number;
  fallAt: number;
}

/** Unchecked kernel: pressure angles into `out`, peaks returned. Lengths inches, velocity in/cam°. */
export function pressureAngleRaw(
  lift: ArrayLike<number>,
  velocity: ArrayLike<number>,
  from: number,
  to: number,
  start: number,
  step: number,
  primeRadius: number,
  out: Float64Array | null,
): PressurePeaks {
  let riseTan = 0;
  let riseAt = start + from * step;
  let fallTan = 0;
  let fallAt = riseAt;
  for (let i = from; i <= to; i++) {
    const t = pressureTan(lift[i] ?? 0, velocity[i] ?? 0, primeRadius);
    if (out) out[i] = t;
    if (t > riseTan) {
      riseTan = t;
      riseAt = start + i * step;
    } else if (-t > fallTan) {
      fallTan = -t;
      fallAt = start + i * step;
    }
  }
  return { riseTan, riseAt, fallTan, fallAt };
}

/**
 * Pressure angle along the rise and the fall of an in-line translating roller
 * follower. Argument: `{ lobe: CamLobeSamples, baseCircle, rollerDiameter }`,
 * base circle and roller as diameters in inches. Returns degrees at each
 * sample and the largest on each flank with its cam angle.
 */
export function pressureAngle(input: { lobe: CamLobeSamples; baseCircle: number; rollerDiameter: number }): PressureAngleResult {
  requireObject('input', input);
  const lobe = requireCamLobe(input.lobe, 'lobe');
  const baseCircle = requireInRange('baseCircle', input.baseCircle, { min: 0, max: 6, minOpen: true, unit: 'in' });
  const roller = requireInRange('rollerDiameter', input.rollerDiameter, { min: 0, max: 4, minOpen: true, unit: 'in' });
  const angles = new Float64Array(lobe.n);
  const p = pressureAngleRaw(lobe.lift, lobe.velocity, 0, lobe.n - 1, lobe.start, lobe.step, (baseCircle + roller) / 2, angles);
  for (let i = 0; i < lobe.n; i++) angles[i] = Math.atan(angles[i] ?? 0) * RAD;
  return {
    angles,
    rise: { value: Math.atan(p.riseTan) * RAD, at: p.riseAt },
    fall: { value: Math.atan(p.fallTan) * RAD, at: p.fallAt },
  };
}

// ---------------------------------------------------------------------------
// Radius of curvature

export interface CurvatureResult {
  follower: 'roller' | 'flat';
  /** Signed radius of the pitch curve at each sample, inches (roller only; + convex), clipped to ±RADIUS_CLIP. */
  pitch: Float64Array | null;
  /** Signed radius of the cam surface at each sample, inches (+ convex), clipped to ±RADIUS_CLIP. */
  surface: Float64Array;
  /** Smallest convex pitch radius and where (roller only). */
  minPitch: FlankPeak | null;
  /** Smallest convex surface radius and where; ≤ 0 means a cusp or undercut. */
  minSurface: FlankPeak;
  /** Tightest concave surface radius (as a positive number) and where; null when no flank is concave. */
  concave: FlankPeak | null;
  /** Undercut: a convex pitch radius smaller than the roller radius, or a non-positive flat-tappet radius. */
  undercut: boolean;
  /** A concave flank tighter than the grinding wheel's radius; null without a wheel diameter. */
  wheelTooLarge: boolean | null;
}

/** Per-lobe extremes from the kernel. */
export interface CurvatureExtremes {
  minPitch: number;
  minPitchAt: number;
  minSurface: number;
  minSurfaceAt: number;
  /** Largest concave curvature magnitude of the surface, 1/in (0 = none). */
  concaveCurvature: number;
  concaveAt: number;
  undercut: boolean;
}

function clip(r: number): number {
  return r > RADIUS_CLIP ? RADIUS_CLIP : r < -RADIUS_CLIP ? -RADIUS_CLIP : r;
}

const RAD2 = RAD * RAD;

/**
 * Signed curvature of the pitch curve r(θ) = Rp + s(θ), 1/in (+ convex), by the
 * polar formula κ = (r² + 2r′² − r·r″) / (r² + r′²)^{3/2}; velocity in/cam°, acceleration in/cam°².
 */
function pitchKappa(primeRadius: number, lift: number, velocity: number, acceleration: number): number {
  const r = primeRadius + lift;
  const r1 = velocity * RAD;
  const r2 = acceleration * RAD2;
  const num = r * r + r1 * r1;
  return (num + r1 * r1 - r * r2) / (num * Math.sqrt(num));
}

/** A concave pitch (κ < 0) gives a surface radius of magnitude |ρ| + Rr: curvature 1/(1/|κ| + Rr), 1/in. */
function concaveSurfaceKappa(kappa: number, rollerRadius: number): number {
  return -kappa / (1 - kappa * rollerRadius);
}

/** Flat-faced follower: surface radius ρ = Rb + s + s″, inches (acceleration in/cam°²). */
function flatRadius(baseRadius: number, lift: number, acceleration: number): number {
  return baseRadius + lift + acceleration * RAD2;
}

/** The kernels' running extremes as CurvatureExtremes. */
function curvatureExtremes(
  rollerRadius: number,
  maxKappa: number,
  maxKappaAt: number,
  concaveKappa: number,
  concaveAt: number,
  minFlat: number,
  minFlatAt: number,
): CurvatureExtremes {
  if (rollerRadius > 0) {
    const minPitch = maxKappa > 0 ? 1 / maxKappa : Infinity;
    return {
      minPitch,
      minPitchAt: maxKappaAt,
      minSurface: minPitch - rollerRadius,
      minSurfaceAt: maxKappaAt,
      concaveCurvature: concaveKappa,
      concaveAt,
      undercut: minPitch < rollerRadius,
    };
  }
  return {
    minPitch: Infinity,
    minPitchAt: minFlatAt,
    minSurface: minFlat,
    minSurfaceAt: minFlatAt,
    concaveCurvature: 0,
    concaveAt: minFlatAt,
    undercut: !(minFlat > 0),
  };
}

/**
 * Unchecked kernel. Roller when `rollerRadius > 0`, flat tappet when 0.
 * Velocity in/cam°, acceleration in/cam°². Fills `pitchOut`/`surfaceOut` when given.
 */
export function curvatureRaw(
  lift: ArrayLike<number>,
  velocity: ArrayLike<number>,
  acceleration: ArrayLike<number>,
  from: number,
  to: number,
  start: number,
  step: number,
  baseRadius: number,
  rollerRadius: number,
  pitchOut: Float64Array | null,
  surfaceOut: Float64Array | null,
): CurvatureExtremes {
  let maxKappa = 0; // largest convex pitch (or flat surface) curvature, 1/in
  let maxKappaAt = start + from * step;
  let concaveKappa = 0; // largest concave surface curvature magnitude
  let concaveAt = maxKappaAt;
  let minFlat = Infinity;
  let minFlatAt = maxKappaAt;
  const rp = baseRadius + rollerRadius;
  for (let i = from; i <= to; i++) {
    const s = lift[i] ?? 0;
    if (rollerRadius > 0) {
      const kappa = pitchKappa(rp, s, velocity[i] ?? 0, acceleration[i] ?? 0);
      if (kappa > maxKappa) {
        maxKappa = kappa;
        maxKappaAt = start + i * step;
      }
      if (kappa < 0) {
        const c = concaveSurfaceKappa(kappa, rollerRadius);
        if (c > concaveKappa) {
          concaveKappa = c;
          concaveAt = start + i * step;
        }
      }
      if (pitchOut || surfaceOut) {
        const rho = kappa === 0 ? Infinity : 1 / kappa;
        if (pitchOut) pitchOut[i] = clip(rho);
        if (surfaceOut) surfaceOut[i] = clip(rho - rollerRadius);
      }
    } else {
      const rho = flatRadius(baseRadius, s, acceleration[i] ?? 0);
      if (rho < minFlat) {
        minFlat = rho;
        minFlatAt = start + i * step;
      }
      if (surfaceOut) surfaceOut[i] = clip(rho);
    }
  }
  return curvatureExtremes(rollerRadius, maxKappa, maxKappaAt, concaveKappa, concaveAt, minFlat, minFlatAt);
}

/**
 * One flank of a lobe that is symmetric about its nose, sampled outwards from
 * the nose: entry j·stride of each array lies j·step cam degrees from the
 * centre (entries from `count` on are zero: the base circle). Lift in inches;
 * `speed` is d lift / d|θ| and `acceleration` d² lift / dθ² in any angle unit,
 * times `velocityScale` and `accelerationScale` to give in/cam° and in/cam°².
 */
export interface SymmetricFlank {
  lift: ArrayLike<number>;
  speed: ArrayLike<number>;
  acceleration: ArrayLike<number>;
  count: number;
  stride: number;
  velocityScale: number;
  accelerationScale: number;
}

/**
 * Unchecked: pressureAngleRaw over centre − reach·step … centre + reach·step
 * of a symmetric lobe, from one flank. The opening flank (before the centre)
 * rises, the closing flank falls with the same angle negated, so each sample
 * is computed once; peaks and their angles are the ones the full scan finds
 * (the first in increasing cam angle among equal values).
 */
export function symmetricPressureAngleRaw(flank: SymmetricFlank, reach: number, centre: number, step: number, primeRadius: number): PressurePeaks {
  const { lift, speed, count, stride, velocityScale } = flank;
  let riseTan = 0;
  let riseAt = centre - reach * step;
  let fallTan = 0;
  let fallAt = riseAt;
  for (let d = 0; d <= reach; d++) {
    const j = d * stride;
    if (j >= count) break; // the base circle: no pressure angle
    // the opening flank's angle (the closing flank's is the same, negated)
    const t = pressureTan(lift[j] ?? 0, -velocityScale * (speed[j] ?? 0), primeRadius);
    if (t > riseTan || (t === riseTan && t > 0)) {
      riseTan = t;
      riseAt = centre - d * step;
    }
    if (t > fallTan) {
      fallTan = t;
      fallAt = centre + d * step;
    }
  }
  return { riseTan, riseAt, fallTan, fallAt };
}

/**
 * Unchecked: curvatureRaw over centre − reach·step … centre + reach·step of a
 * symmetric lobe, from one flank (curvature is the same on both flanks). The
 * extremes and their angles are the ones the full scan finds: the first in
 * increasing cam angle, which is on the opening flank.
 */
export function symmetricCurvatureRaw(
  flank: SymmetricFlank,
  reach: number,
  centre: number,
  step: number,
  baseRadius: number,
  rollerRadius: number,
): CurvatureExtremes {
  const { lift, speed, acceleration, count, stride, velocityScale, accelerationScale } = flank;
  let maxKappa = 0;
  let maxKappaAt = centre - reach * step;
  let concaveKappa = 0;
  let concaveAt = maxKappaAt;
  let minFlat = Infinity;
  let minFlatAt = maxKappaAt;
  const rp = baseRadius + rollerRadius;
  for (let d = 0; d <= reach; d++) {
    const j = d * stride;
    const inside = j < count;
    const s = inside ? (lift[j] ?? 0) : 0;
    const v = inside ? velocityScale * (speed[j] ?? 0) : 0;
    const a = inside ? accelerationScale * (acceleration[j] ?? 0) : 0;
    const at = centre - d * step;
    if (rollerRadius > 0) {
      const kappa = pitchKappa(rp, s, v, a);
      if (kappa > maxKappa || (kappa === maxKappa && kappa > 0)) {
        maxKappa = kappa;
        maxKappaAt = at;
      }
      if (kappa < 0) {
        const c = concaveSurfaceKappa(kappa, rollerRadius);
        if (c >= concaveKappa) {
          concaveKappa = c;
          concaveAt = at;
        }
      }
    } else {
      const rho = flatRadius(baseRadius, s, a);
      if (rho <= minFlat) {
        minFlat = rho;
        minFlatAt = at;
      }
    }
  }
  return curvatureExtremes(rollerRadius, maxKappa, maxKappaAt, concaveKappa, concaveAt, minFlat, minFlatAt);
}

/**
 * Radius of curvature along a lobe. Argument:
 * `{ lobe: CamLobeSamples, baseCircle, follower: { kind: 'roller', rollerDiameter } | { kind: 'flat' }, wheelDiameter? }`,
 * diameters in inches. Returns signed radii (inches, + convex) at each sample,
 * the smallest with its cam angle, and the undercut and grinding-wheel flags.
 */
export function pitchCurvature(input: { lobe: CamLobeSamples; baseCircle: number; follower: CamFollower; wheelDiameter?: number }): CurvatureResult {
  requireObject('input', input);
  const lobe = requireCamLobe(input.lobe, 'lobe');
  const baseCircle = requireInRange('baseCircle', input.baseCircle, { min: 0, max: 6, minOpen: true, unit: 'in' });
  requireObject('follower', input.follower);
  const kindIn: unknown = input.follower.kind;
  if (kindIn !== 'roller' && kindIn !== 'flat') throw new CalcInputError('follower.kind', 'must be roller or flat', kindIn);
  const kind = kindIn;
  const rollerRadius =
    input.follower.kind === 'roller'
      ? requireInRange('follower.rollerDiameter', input.follower.rollerDiameter, { min: 0, max: 4, minOpen: true, unit: 'in' }) / 2
      : 0;
  const wheel = input.wheelDiameter === undefined ? null : requirePositive('wheelDiameter', input.wheelDiameter, 'in');
  const pitch = kind === 'roller' ? new Float64Array(lobe.n) : null;
  const surface = new Float64Array(lobe.n);
  const x = curvatureRaw(lobe.lift, lobe.velocity, lobe.acceleration, 0, lobe.n - 1, lobe.start, lobe.step, baseCircle / 2, rollerRadius, pitch, surface);
  return curvatureResult(kind, x, wheel, pitch, surface);
}

/** Shape the kernel's extremes as a CurvatureResult (arrays given or empty). */
export function curvatureResult(
  kind: 'roller' | 'flat',
  x: CurvatureExtremes,
  wheelDiameter: number | null,
  pitch: Float64Array | null = null,
  surface: Float64Array = new Float64Array(0),
): CurvatureResult {
  const concave = x.concaveCurvature > 0 ? { value: 1 / x.concaveCurvature, at: x.concaveAt } : null;
  return {
    follower: kind,
    pitch,
    surface,
    minPitch: kind === 'roller' ? { value: clip(x.minPitch), at: x.minPitchAt } : null,
    minSurface: { value: clip(x.minSurface), at: x.minSurfaceAt },
    concave,
    undercut: x.undercut,
    wheelTooLarge: wheelDiameter === null ? null : concave !== null && concave.value < wheelDiameter / 2,
  };
}

// ---------------------------------------------------------------------------
// Regrind envelope

export interface EnvelopeResult {
  /** Cam degrees of margin[0], in the core's frame. */
  start: number;
  /** Cam degrees between margin samples. */
  step: number;
  /**
   * Material margin at each cam angle, inches on the radius: core (lift + base
   * radius) minus candidate (lift + base radius − cut/2). Negative = the
   * candidate pokes out of the core there.
   */
  margin: Float64Array;
  /** Smallest margin, inches, and its cam angle (core frame). */
  minMargin: number;
  minAt: number;
  /** True when the candidate lies inside the core everywhere (margin ≥ 0). */
  inside: boolean;
  /** Finishing stock the margin was judged against, inches. */
  finishingStock: number;
  /** pass when the smallest margin is at least the finishing stock. */
  status: 'pass' | 'fail';
  /** The rule in words. */
  criterion: string;
}

/** Linear interpolation in a sampled lobe, 0 (base circle) outside it. */
function liftAt(lobe: CheckedSamples, angle: number): number {
  const x = (angle - lobe.start) / lobe.step;
  if (!(x >= 0) || x > lobe.n - 1) return 0;
  const i = Math.min(lobe.n - 2, Math.floor(x));
  const f = x - i;
  return (lobe.lift[i] ?? 0) * (1 - f) + (lobe.lift[i + 1] ?? 0) * f;
}

/** Wrap a cam angle into [centre − 180, centre + 180). */
function wrap(angle: number, centre: number): number {
  return angle - 360 * Math.floor((angle - centre + 180) / 360);
}

export const ENVELOPE_CRITERION =
  'For convex cams without undercut, one cam fits inside the other exactly when its pitch curve (roller: the cam ' +
  "dilated by the roller, a monotone operation) or its support function (flat tappet) lies inside the other's; " +
  'for an in-line follower both are lift plus base-circle radius at each cam angle, so the margin is ' +
  '(Rb + s_core(θ)) − (Rb − cut/2 + s_candidate(θ − phase)).';

/**
 * Does a candidate lobe fit inside the core's once the base circle is cut?
 *
 * Argument: `{ core: CamLobeSamples, candidate: CamLobeSamples, baseCircle, cut, phase, follower, finishingStock, step? }`:
 * both lobes' tappet lift in cam degrees, each in its own frame centred on its
 * own lobe centre (0 = nose); `baseCircle` the core's base-circle diameter and
 * `cut` the reduction of that diameter, inches; `phase` the candidate's lobe
 * centre minus the core's, cam degrees (the change in lobe centreline);
 * `finishingStock` inches on the radius; `step` cam degrees between margin
 * samples over the whole turn (default 0.5).
 *
 * Geometry (derived in ENVELOPE_CRITERION): for a roller, the cam surface is
 * the pitch region eroded by the roller disc B, K = P ⊖ B and P = K ⊕ B. Dilation
 * is monotone, and for convex K erosion undoes it, so K₁ ⊆ K₂ ⇔ P₁ ⊆ P₂. A
 * radial follower's pitch region is star-shaped about the cam centre with
 * radius Rb + Rr + s(θ), so inclusion is Rb₁ + s₁(θ) ≤ Rb₂ + s₂(θ) at every θ
 * (Rr cancels). For a flat face, Rb + s(θ) is the support function h(θ) of the
 * cam, and convex K₁ ⊆ K₂ ⇔ h₁ ≤ h₂ everywhere (R. Schneider, "Convex Bodies:
 * the Brunn–Minkowski Theory", §1.7, from memory); the smallest support gap is
 * then the smallest normal gap between the surfaces. For a roller the radial
 * gap overstates the normal gap by 1/cos(pressure angle).
 */
export function regrindEnvelope(input: {
  core: CamLobeSamples;
  candidate: CamLobeSamples;
  baseCircle: number;
  cut: number;
  phase: number;
  follower: CamFollower;
  finishingStock: number;
  step?: number;
}): EnvelopeResult {
  requireObject('input', input);
  const core = requireCamLobe(input.core, 'core');
  const candidate = requireCamLobe(input.candidate, 'candidate');
  const baseCircle = requireInRange('baseCircle', input.baseCircle, { min: 0, max: 6, minOpen: true, unit: 'in' });
  const cut = requireInRange('cut', input.cut, { min: 0, max: baseCircle, maxOpen: true, unit: 'in' });
  const phase = requireInRange('phase', input.phase, { min: -180, max: 180, unit: 'cam degrees' });
  requireObject('follower', input.follower);
  const kind: unknown = input.follower.kind;
  if (kind !== 'roller' && kind !== 'flat') throw new CalcInputError('follower.kind', 'must be roller or flat', kind);
  const finishingStock = requireInRange('finishingStock', input.finishingStock, { min: 0, max: 0.5, unit: 'in' });
  const step = requireInRange('step', input.step ?? 0.5, { min: 0.01, max: 5, unit: 'cam degrees' });
  const count = Math.floor(360 / step);
  const margin = new Float64Array(count);
  const start = -180;
  let minMargin = Infinity;
  let minAt = start;
  for (let i = 0; i < count; i++) {
    const theta = start + i * step;
    const m = cut / 2 + liftAt(core, wrap(theta, 0)) - liftAt(candidate, wrap(theta - phase, 0));
    margin[i] = m;
    if (m < minMargin) {
      minMargin = m;
      minAt = theta;
    }
  }
  return envelopeResult(start, step, margin, minMargin, minAt, finishingStock);
}

/** Shape an envelope result. */
export function envelopeResult(start: number, step: number, margin: Float64Array, minMargin: number, minAt: number, finishingStock: number): EnvelopeResult {
  return {
    start,
    step,
    margin,
    minMargin,
    minAt,
    inside: minMargin >= -1e-12,
    finishingStock,
    status: minMargin >= finishingStock - 1e-12 ? 'pass' : 'fail',
    criterion: ENVELOPE_CRITERION,
  };
}
