/**
 * Check rules: each fit check compares a computed value with a limit and
 * returns pass / watch / fail, the margin, the limit and the rule's source.
 * Defaults are trade rules of thumb; a shop can override any of them.
 */
import type { DegreeResult } from './degree';
import { CalcInputError, requireFinite, requireNonNegative, requireObject } from './errors';
import { findWornLobesByKind, type LobeMaxLift, type UnjudgedLobe, type WornLobeResult } from './measured';

export type CheckStatus = 'pass' | 'watch' | 'fail';

export type CheckId =
  | 'coilBind'
  | 'retainerToSeal'
  | 'ptvIntake'
  | 'ptvExhaust'
  | 'hydraulicPreload'
  | 'dynamicCompression'
  | 'degreeing'
  | 'wornLobe'
  | 'pressureAngle'
  | 'undercut'
  | 'grindingWheel'
  | 'finishingStock'
  | 'cleanup'
  | 'largestCut';

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

/** Margins within this of a boundary count as on it (inputs carry 0.001 in at best). */
const EPSILON = 1e-9;

function statusFor(margin: number, watchBand: number): CheckStatus {
  return margin < -EPSILON ? 'fail' : margin < watchBand - EPSILON ? 'watch' : 'pass';
}

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

export interface CheckResult {
  id: CheckId;
  /** Which valve or lobe the check is about, e.g. "intake", "exhaust", "3E". */
  subject: string;
  status: CheckStatus;
  /** The computed value checked. */
  value: number;
  /** Distance to the limit in the safe direction; negative = past the limit. */
  margin: number;
  /** The limit the margin is measured from. */
  limit: number;
  /** Unit of value, margin and limit. */
  unit: string;
  /** The rule in words, with its numbers. */
  rule: string;
  /** Where the rule comes from. */
  source: string;
}

export interface SkippedCheck {
  id: CheckId;
  subject: string;
  /** Why the check did not run, e.g. "not measured". */
  note: string;
  /** True when the check does not apply at all (e.g. preload on solid lifters): it is not counted as a check still to run. */
  notApplicable?: true;
}

interface CheckBase {
  id: CheckId;
  subject: string;
  value: number;
  unit: string;
  /** What is being checked, e.g. "Coil-bind margin at max lift". */
  what: string;
}

const ruleTextCache = new WeakMap<object, Map<string, string>>();

type RuleKind = 'min' | 'max' | 'range';

/** The rule in words, with its numbers. */
function ruleWording(kind: RuleKind, rule: MinimumRule | MaximumRule | RangeRule, what: string, unit: string): string {
  if (kind === 'min') {
    const r = rule as MinimumRule;
    return `${what} at least ${fmt(r.min, unit)}; watch under ${fmt(r.min + r.watchBand, unit)}`;
  }
  if (kind === 'max') {
    const r = rule as MaximumRule;
    return `${what} at most ${fmt(r.max, unit)}; watch over ${fmt(r.max - r.watchBand, unit)}`;
  }
  const r = rule as RangeRule;
  return `${what} between ${fmt(r.min, unit)} and ${fmt(r.max, unit)}; watch within ${fmt(r.watchBand, unit)} of either end`;
}

/** Rule wording depends only on the rule and what is checked (which fixes the unit): build it once per pair. */
function ruleText(kind: RuleKind, rule: MinimumRule | MaximumRule | RangeRule, what: string, unit: string): string {
  let byKey = ruleTextCache.get(rule);
  if (!byKey) {
    byKey = new Map();
    ruleTextCache.set(rule, byKey);
  }
  let text = byKey.get(what);
  if (text === undefined) {
    text = ruleWording(kind, rule, what, unit);
    byKey.set(what, text);
  }
  return text;
}

const BASE_TEXT_FIELDS = ['id', 'subject', 'unit', 'what'] as const;

/** Validate what is checked: id, subject, unit and wording as strings, a finite value. */
function requireBase(base: CheckBase): number {
  requireObject('base', base);
  for (const f of BASE_TEXT_FIELDS) {
    if (typeof base[f] !== 'string') throw new CalcInputError(`base.${f}`, 'must be text', base[f]);
  }
  return requireFinite('value', base.value);
}

/** Validate a rule: finite limits, a watch band of 0 or more, a source in words. */
function requireRule(rule: object, keys: readonly ('min' | 'max')[]): void {
  requireObject('rule', rule);
  const r = rule as Record<string, unknown>;
  for (const k of keys) requireFinite(`rule.${k}`, r[k]);
  requireNonNegative('rule.watchBand', r.watchBand);
  if (typeof r.source !== 'string' || !r.source.trim()) throw new CalcInputError('rule.source', 'must name where the rule comes from', r.source);
}

function fmt(v: number, unit: string): string {
  const digits = unit === 'in' ? 3 : unit === ':1' ? 1 : 1;
  return unit === ':1' ? `${v.toFixed(digits)}:1` : `${v.toFixed(digits)} ${unit}`;
}

const MIN = ['min'] as const;
const MAX = ['max'] as const;
const MIN_MAX = ['min', 'max'] as const;

/**
 * Unchecked kernel of checkMinimum, for callers whose wording and rule are
 * already sound (the analysis's own checks, rules from resolveCheckLimits).
 * The value must still be finite.
 */
export function checkMinimumRaw(base: CheckBase, rule: MinimumRule): CheckResult {
  const value = requireFinite('value', base.value);
  const margin = value - rule.min;
  return {
    id: base.id,
    subject: base.subject,
    status: statusFor(margin, rule.watchBand),
    value,
    margin,
    limit: rule.min,
    unit: base.unit,
    rule: ruleText('min', rule, base.what, base.unit),
    source: rule.source,
  };
}

/** Unchecked kernel of checkMaximum (see checkMinimumRaw). */
export function checkMaximumRaw(base: CheckBase, rule: MaximumRule): CheckResult {
  const value = requireFinite('value', base.value);
  const margin = rule.max - value;
  return {
    id: base.id,
    subject: base.subject,
    status: statusFor(margin, rule.watchBand),
    value,
    margin,
    limit: rule.max,
    unit: base.unit,
    rule: ruleText('max', rule, base.what, base.unit),
    source: rule.source,
  };
}

/** Unchecked kernel of checkRange (see checkMinimumRaw). */
export function checkRangeRaw(base: CheckBase, rule: RangeRule): CheckResult {
  const value = requireFinite('value', base.value);
  const low = value - rule.min;
  const high = rule.max - value;
  const margin = Math.min(low, high);
  return {
    id: base.id,
    subject: base.subject,
    status: statusFor(margin, rule.watchBand),
    value,
    margin,
    limit: low <= high ? rule.min : rule.max,
    unit: base.unit,
    rule: ruleText('range', rule, base.what, base.unit),
    source: rule.source,
  };
}

/** A value that must be at least the rule's minimum. */
export function checkMinimum(base: CheckBase, rule: MinimumRule): CheckResult {
  requireBase(base);
  requireRule(rule, MIN);
  return checkMinimumRaw(base, rule);
}

/** A value that must be at most the rule's maximum. */
export function checkMaximum(base: CheckBase, rule: MaximumRule): CheckResult {
  requireBase(base);
  requireRule(rule, MAX);
  return checkMaximumRaw(base, rule);
}

/** A value that must lie inside the rule's range. */
export function checkRange(base: CheckBase, rule: RangeRule): CheckResult {
  requireBase(base);
  requireRule(rule, MIN_MAX);
  if (!(rule.max > rule.min)) throw new CalcInputError('rule.max', `must be greater than min (${rule.min})`, rule.max);
  return checkRangeRaw(base, rule);
}

/** The worst status in a list: fail over watch over pass. */
export function worstStatus(results: readonly { status: CheckStatus }[]): CheckStatus {
  if (!Array.isArray(results)) throw new CalcInputError('results', 'must be a list of check results', results);
  let worst: CheckStatus = 'pass';
  for (const r of results) {
    if (r === null || typeof r !== 'object' || (r.status !== 'pass' && r.status !== 'watch' && r.status !== 'fail')) {
      throw new CalcInputError('results', 'every result needs a status of pass, watch or fail', r);
    }
    if (r.status === 'fail') return 'fail';
    if (r.status === 'watch') worst = 'watch';
  }
  return worst;
}

/** A summary's status: a check verdict when every check ran, else "incomplete" unless what ran already watches or fails. */
export type SummaryStatus = CheckStatus | 'incomplete';

export interface CheckSummary {
  /** The worst verdict when every check ran; with checks still to run, "incomplete" unless one that ran is watch or fail. */
  status: SummaryStatus;
  /** The worst verdict among the checks that ran (pass when none ran). */
  worst: CheckStatus;
  /** Checks that ran. */
  ran: number;
  /** Checks that apply: those that ran and those not run (a check that does not apply is left out). */
  total: number;
  /** True when every check that applies ran. */
  complete: boolean;
  /** The summary in words: "Pass", "Fail", or "5 of 8 checks run", "Fail · 5 of 8 checks run". */
  label: string;
}

const VERDICT_WORDS: Record<CheckStatus, string> = { pass: 'Pass', watch: 'Watch', fail: 'Fail' };

/**
 * The one summary of a list of check results: it reads Pass only when every
 * check ran and passed; otherwise it says how many ran ("5 of 8 checks run"),
 * after the worst verdict when one that ran watches or fails.
 */
export function summarizeChecks(input: { checks: readonly { status: CheckStatus }[]; skipped: readonly SkippedCheck[] }): CheckSummary {
  requireObject('input', input);
  if (!Array.isArray(input.skipped)) throw new CalcInputError('skipped', 'must be a list of checks not run', input.skipped);
  const worst = worstStatus(input.checks);
  const ran = input.checks.length;
  const total = ran + input.skipped.filter((s) => !s.notApplicable).length;
  const complete = ran > 0 && ran === total;
  const count = ran === 0 ? 'No checks run yet' : `${ran} of ${total} checks run`;
  return {
    status: complete ? worst : worst === 'pass' ? 'incomplete' : worst,
    worst,
    ran,
    total,
    complete,
    label: complete ? VERDICT_WORDS[worst] : worst === 'pass' ? count : `${VERDICT_WORDS[worst]} · ${count}`,
  };
}

// ---------------------------------------------------------------------------
// Checks that use measurements outside the profile analysis

/** Check a degreed-in cam against the sheet (|measured ICL − sheet ICL|), degrees. */
export function checkDegreeing(result: DegreeResult, overrides?: CheckLimitOverrides): CheckResult {
  requireObject('result', result);
  const limits = resolveCheckLimits(overrides);
  return checkMaximum(
    { id: 'degreeing', subject: 'intake', value: Math.abs(result.difference), unit: '°', what: 'Installed ICL difference from the sheet' },
    limits.degreeing,
  );
}

/**
 * Worn-lobe detection with the shop's threshold (`findWornLobesByKind`: each kind
 * against its siblings' median or, given `stockLobeLift`, the sheet's stock lobe lift,
 * whichever is more), one check per judged lobe, and the lobes it could not judge. Inches.
 */
export function checkWornLobes(
  lobes: readonly LobeMaxLift[],
  overrides?: CheckLimitOverrides,
  stockLobeLift?: number,
): { result: WornLobeResult; checks: CheckResult[]; unjudged: UnjudgedLobe[] } {
  const limits = resolveCheckLimits(overrides);
  const { unjudged, ...result } = findWornLobesByKind({ lobes, threshold: limits.wornLobe.max, stockLobeLift });
  const what = stockLobeLift === undefined ? 'Max lift below the median of its siblings' : 'Max lift below its siblings or the stock lobe lift';
  const checks = result.lobes.map((row) => checkMaximum({ id: 'wornLobe', subject: row.id, value: row.damageDepth, unit: 'in', what }, limits.wornLobe));
  return { result, checks, unjudged };
}
