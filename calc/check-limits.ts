/**
 * The limits each fit check is judged against: Lobewright's defaults (trade rules of
 * thumb, each with its source) and a shop's overrides merged into them. The rules that
 * use them are in ./checks.ts, which re-exports all of this.
 */
import { CalcInputError, requireFinite, requireNonNegative, requireObject } from './errors';

/** Value must be at least `min`; within `watchBand` above it is "watch". */
export interface MinimumRule {
  min: number;
  watchBand: number;
  source: string;
}

/** Value must be at most `max`; within `watchBand` below it is "watch". */
export interface MaximumRule {
  max: number;
  watchBand: number;
  source: string;
}

/** A number the shop sets for its grinding (not a pass/fail rule); null = not set, so what needs it is NOT RUN. */
export interface SettingValue {
  value: number | null;
  source: string;
}

/** Value must lie in [min, max]; within `watchBand` of either end is "watch". */
export interface RangeRule {
  min: number;
  max: number;
  watchBand: number;
  source: string;
}

export interface CheckLimits {
  /** Coil-bind margin at max lift, inches. */
  coilBind: MinimumRule;
  /** Retainer-to-seal clearance at max lift, inches. */
  retainerToSeal: MinimumRule;
  /** Intake piston-to-valve clearance, inches. */
  ptvIntake: MinimumRule;
  /** Exhaust piston-to-valve clearance, inches. */
  ptvExhaust: MinimumRule;
  /** Hydraulic lifter preload, inches of plunger travel. */
  hydraulicPreload: RangeRule;
  /** Dynamic compression ratio for pump fuel. */
  dynamicCompression: MaximumRule;
  /** Degreed-in ICL difference from the sheet, crank degrees (absolute). */
  degreeing: MaximumRule;
  /** Worn lobe: max lift below the median of its siblings or the stock lobe lift, inches. */
  wornLobe: MaximumRule;
  /** Largest pressure angle of an in-line roller follower, degrees. */
  pressureAngle: MaximumRule;
  /** Smallest convex cam-surface radius, inches (0 = a cusp: undercut). */
  undercut: MinimumRule;
  /** Finishing stock: the smallest material margin between core and candidate, inches on the radius. */
  finishingStock: MinimumRule;
  /** Metal removed below the deepest damage so the reground surface is clean, inches on the radius. */
  cleanupAllowance: SettingValue;
  /** Largest base-circle cut on the diameter the core's hardened layer allows, inches. */
  largestCut: SettingValue;
  /** Lifter roller diameter, inches (roller lifters). */
  rollerDiameter: SettingValue;
  /** Grinding wheel radius, inches: a concave flank tighter than it cannot be ground. */
  wheelRadius: SettingValue;
}

/** A shop's own limits: any subset of any rule. */
export type CheckLimitOverrides = {
  [K in keyof CheckLimits]?: CheckLimits[K] extends SettingValue ? { value?: number; source?: string } : Partial<CheckLimits[K]>;
};

const COMMON = 'common practice, no source';

/** Lobewright's default limits. All are trade rules of thumb. */
export const DEFAULT_CHECK_LIMITS: Readonly<CheckLimits> = Object.freeze({
  coilBind: Object.freeze({ min: 0.06, watchBand: 0.02, source: COMMON }),
  retainerToSeal: Object.freeze({ min: 0.05, watchBand: 0.02, source: COMMON }),
  ptvIntake: Object.freeze({ min: 0.08, watchBand: 0.02, source: COMMON }),
  ptvExhaust: Object.freeze({ min: 0.1, watchBand: 0.02, source: COMMON }),
  hydraulicPreload: Object.freeze({
    min: 0.02,
    max: 0.06,
    watchBand: 0.005,
    source: `${COMMON}; follow the lifter maker's range where given`,
  }),
  dynamicCompression: Object.freeze({ max: 8.5, watchBand: 0.3, source: `${COMMON}; pump gasoline, iron heads` }),
  degreeing: Object.freeze({ max: 2, watchBand: 1, source: COMMON }),
  wornLobe: Object.freeze({ max: 0.005, watchBand: 0.002, source: COMMON }),
  pressureAngle: Object.freeze({
    max: 30,
    watchBand: 3,
    source: 'R. L. Norton, Design of Machinery, §8.7: keep a translating roller follower under about 30° (from memory)',
  }),
  undercut: Object.freeze({
    min: 0,
    watchBand: 0.05,
    source:
      'geometry: a convex pitch radius below the roller radius, or a flat-tappet radius at or below 0, cannot be ground (Norton, Design of Machinery, §8.8, from memory)',
  }),
  finishingStock: Object.freeze({ min: 0.005, watchBand: 0.005, source: COMMON }),
  cleanupAllowance: Object.freeze({ value: 0.005, source: COMMON }),
  largestCut: Object.freeze({ value: null, source: `not set: the grinder gives the largest cut this core's hardened layer allows (${COMMON})` }),
  rollerDiameter: Object.freeze({ value: null, source: `not set: measure the lifter's roller or take it from the lifter maker (${COMMON})` }),
  wheelRadius: Object.freeze({ value: null, source: `not set: the grinder gives the grinding wheel's radius (${COMMON})` }),
});

/** Where a rule's number came from when a shop changed it. */
export const SHOP_SOURCE = 'shop setting';

const KIND: Record<keyof CheckLimits, 'min' | 'max' | 'range' | 'value'> = {
  coilBind: 'min',
  retainerToSeal: 'min',
  ptvIntake: 'min',
  ptvExhaust: 'min',
  hydraulicPreload: 'range',
  dynamicCompression: 'max',
  degreeing: 'max',
  wornLobe: 'max',
  pressureAngle: 'max',
  undercut: 'min',
  finishingStock: 'min',
  cleanupAllowance: 'value',
  largestCut: 'value',
  rollerDiameter: 'value',
  wheelRadius: 'value',
};

/**
 * Merge a shop's overrides into the defaults and validate them. A rule whose
 * numbers the shop changed takes the source "shop setting" unless the shop
 * names one.
 */
export function resolveCheckLimits(overrides?: CheckLimitOverrides): CheckLimits {
  if (overrides === undefined || overrides === null) return DEFAULT_CHECK_LIMITS;
  requireObject('limits', overrides);
  for (const key of Object.keys(overrides)) {
    if (!(key in DEFAULT_CHECK_LIMITS)) throw new CalcInputError(`limits.${key}`, 'is not a check Lobewright knows', key);
    const patch = (overrides as Record<string, unknown>)[key];
    if (patch !== undefined) requireObject(`limits.${key}`, patch);
  }
  const out = {} as Record<keyof CheckLimits, MinimumRule | MaximumRule | RangeRule | SettingValue>;
  for (const key of Object.keys(DEFAULT_CHECK_LIMITS) as (keyof CheckLimits)[]) {
    const base = DEFAULT_CHECK_LIMITS[key];
    const patch: Record<string, unknown> = { ...(overrides?.[key] ?? {}) };
    const changed = ['min', 'max', 'watchBand', 'value'].some((f) => f in patch && patch[f] !== undefined);
    const merged: Record<string, unknown> = { ...base };
    for (const [f, v] of Object.entries(patch)) if (v !== undefined) merged[f] = v;
    if (changed && typeof patch.source !== 'string') merged.source = SHOP_SOURCE;
    const field = `limits.${key}`;
    if (KIND[key] === 'value') {
      const source = typeof merged.source === 'string' && merged.source.trim() ? merged.source : SHOP_SOURCE;
      out[key] = { value: merged.value === null ? null : requireNonNegative(`${field}.value`, merged.value), source };
      continue;
    }
    const watchBand = requireNonNegative(`${field}.watchBand`, merged.watchBand);
    const source = typeof merged.source === 'string' && merged.source.trim() ? merged.source : SHOP_SOURCE;
    const kind = KIND[key];
    if (kind === 'min') {
      out[key] = { min: requireFinite(`${field}.min`, merged.min), watchBand, source };
    } else if (kind === 'max') {
      out[key] = { max: requireFinite(`${field}.max`, merged.max), watchBand, source };
    } else {
      const min = requireFinite(`${field}.min`, merged.min);
      const max = requireFinite(`${field}.max`, merged.max);
      if (!(max > min)) throw new CalcInputError(`${field}.max`, `must be greater than min (${min})`, max);
      out[key] = { min, max, watchBand, source };
    }
  }
  return out as unknown as CheckLimits;
}
