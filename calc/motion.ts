/**
 * Cam follower motion laws, normalised: a rise of h = 1 over β = 1, with
 * x ∈ [0, 1]. s is displacement, v = ds/dx, a = d²s/dx², j = d³s/dx³.
 * Scale by h/β, h/β², h/β³ for a real rise h over angle β.
 */
import { CalcInputError, requireInRange } from './errors';

export type MotionLawName = 'cycloidal' | 'poly345' | 'poly4567';

export const MOTION_LAWS: readonly MotionLawName[] = ['cycloidal', 'poly345', 'poly4567'];

export interface MotionLawPoint {
  s: number;
  v: number;
  a: number;
  j: number;
}

const TWO_PI = 2 * Math.PI;

/** Check a motion-law name. */
export function requireMotionLaw(field: string, law: unknown): MotionLawName {
  if (law === 'cycloidal' || law === 'poly345' || law === 'poly4567') return law;
  throw new CalcInputError(field, `must be one of ${MOTION_LAWS.join(', ')} (got ${String(law)})`, law);
}

/** Keep rounding from pushing a displacement a hair outside [0, 1]. */
function clampUnit(s: number): number {
  return s < 0 ? 0 : s > 1 ? 1 : s;
}

/** Cycloidal displacement without cancellation near x = 0 (series below u = 0.1). */
function cycloidalRise(x: number): number {
  const u = TWO_PI * x;
  if (u < 0.1) {
    const u2 = u * u;
    return (u * u2 * (1 / 6 - u2 * (1 / 120 - u2 / 5040))) / TWO_PI;
  }
  return x - Math.sin(u) / TWO_PI;
}

/** Unchecked: displacement only. */
export function lawS(law: MotionLawName, x: number): number {
  switch (law) {
    case 'cycloidal':
      return x <= 0.5 ? cycloidalRise(x) : 1 - cycloidalRise(1 - x);
    case 'poly345':
      return clampUnit(x * x * x * (10 + x * (-15 + 6 * x)));
    case 'poly4567': {
      const x2 = x * x;
      return clampUnit(x2 * x2 * (35 + x * (-84 + x * (70 - 20 * x))));
    }
  }
}

/** Unchecked: first derivative ds/dx. */
export function lawV(law: MotionLawName, x: number): number {
  switch (law) {
    case 'cycloidal':
      return 1 - Math.cos(TWO_PI * x);
    case 'poly345': {
      const u = x * (1 - x);
      return 30 * u * u;
    }
    case 'poly4567': {
      const u = x * (1 - x);
      return 140 * u * u * u;
    }
  }
}

/** Unchecked: second derivative d²s/dx². */
export function lawA(law: MotionLawName, x: number): number {
  switch (law) {
    case 'cycloidal':
      return TWO_PI * Math.sin(TWO_PI * x);
    case 'poly345':
      return x * (60 + x * (-180 + 120 * x));
    case 'poly4567':
      return x * x * (420 + x * (-1680 + x * (2100 - 840 * x)));
  }
}

/** Unchecked: third derivative d³s/dx³. */
export function lawJ(law: MotionLawName, x: number): number {
  switch (law) {
    case 'cycloidal':
      return TWO_PI * TWO_PI * Math.cos(TWO_PI * x);
    case 'poly345':
      return 60 + x * (-360 + 360 * x);
    case 'poly4567':
      return x * (840 + x * (-5040 + x * (8400 - 4200 * x)));
  }
}

/**
 * A normalised motion law at x ∈ [0, 1]: displacement s, velocity v,
 * acceleration a and jerk j (h = 1, β = 1).
 */
export function motionLaw(law: MotionLawName, x: number): MotionLawPoint {
  const name = requireMotionLaw('law', law);
  const at = requireInRange('x', x, { min: 0, max: 1 });
  return { s: lawS(name, at), v: lawV(name, at), a: lawA(name, at), j: lawJ(name, at) };
}

/** Leading term of each law near x = 0: s ≈ c·x^p. */
const LEADING: Readonly<Record<MotionLawName, { c: number; p: number }>> = {
  cycloidal: { c: (TWO_PI * TWO_PI) / 6, p: 3 },
  poly345: { c: 10, p: 3 },
  poly4567: { c: 35, p: 4 },
};

/**
 * Unchecked inverse of s: the x ∈ [0, 1] where s(x) = target, for target in
 * [0, 1]. Every law here rises monotonically and is antisymmetric about
 * x = ½, so the lower half is solved and the upper half mirrored. Newton steps
 * start from the leading term and stay inside a shrinking bracket.
 */
export function lawInverseRaw(law: MotionLawName, target: number): number {
  if (target <= 0) return 0;
  if (target >= 1) return 1;
  if (target > 0.5) return 1 - lawInverseRaw(law, 1 - target);
  let lo = 0;
  let hi = 0.5;
  const lead = LEADING[law];
  let x = Math.min(0.5, Math.pow(target / lead.c, 1 / lead.p));
  for (let i = 0; i < 100; i++) {
    const f = lawS(law, x) - target;
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const d = lawV(law, x);
    let next = d > 0 ? x - f / d : Number.NaN;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - x) <= 1e-16 * Math.max(1, x) || hi - lo <= 1e-16) return next;
    x = next;
  }
  return x;
}

/** The x ∈ [0, 1] at which the normalised law reaches displacement s ∈ [0, 1]. */
export function motionLawInverse(law: MotionLawName, s: number): number {
  const name = requireMotionLaw('law', law);
  return lawInverseRaw(name, requireInRange('s', s, { min: 0, max: 1 }));
}

/**
 * Evaluates s, v and a together into out[0], out[1], out[2]; for hot loops
 * (no checks, no allocation: a Float64Array keeps the doubles unboxed).
 */
export type LawEvaluator = (x: number, out: Float64Array) => void;

/** One evaluator per law, resolved once so hot loops make a direct call. */
export const LAW_EVALUATORS: Readonly<Record<MotionLawName, LawEvaluator>> = Object.freeze({
  cycloidal(x: number, out: Float64Array): void {
    const u = TWO_PI * x;
    const sn = Math.sin(u);
    out[0] = u < 0.1 ? cycloidalRise(x) : x - sn / TWO_PI;
    out[1] = 1 - Math.cos(u);
    out[2] = TWO_PI * sn;
  },
  poly345(x: number, out: Float64Array): void {
    const u = x * (1 - x);
    out[0] = clampUnit(x * x * x * (10 + x * (-15 + 6 * x)));
    out[1] = 30 * u * u;
    out[2] = x * (60 + x * (-180 + 120 * x));
  },
  poly4567(x: number, out: Float64Array): void {
    const x2 = x * x;
    const u = x * (1 - x);
    out[0] = clampUnit(x2 * x2 * (35 + x * (-84 + x * (70 - 20 * x))));
    out[1] = 140 * u * u * u;
    out[2] = x2 * (420 + x * (-1680 + x * (2100 - 840 * x)));
  },
});
