/**
 * Check rules: each fit check compares a computed value with a limit and
 * returns pass / watch / fail, the margin, the limit and the rule's source.
 * Defaults are trade rules of thumb; a shop can override any of them.
 */
import type { DegreeResult } from './degree';
import { CalcInputError, requireFinite, requireNonNegative, requireObject } from './errors';
import { findWornLobesByKind, type LobeMaxLift, type UnjudgedLobe, type WornLobeResult } from './measured';
import { resolveCheckLimits, type CheckLimitOverrides, type MaximumRule, type MinimumRule, type RangeRule } from './check-limits';

export * from './check-limits';
export * from './check-summary';

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

/** Margins within this of a boundary count as on it (inputs carry 0.001 in at best). */
const EPSILON = 1e-9;

function statusFor(margin: number, watchBand: number): CheckStatus {
  return margin < -EPSILON ? 'fail' : margin < watchBand - EPSILON ? 'watch' : 'pass';
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
