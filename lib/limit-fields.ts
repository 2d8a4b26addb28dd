import { z } from 'zod';

import type { CheckLimitOverrides, CheckLimits } from '@/calc/checks';
import { draftsFor, formatCompact, shownUnit, type NumberDraft, type NumberSpec, type Quantity, type ShownUnits } from '@/lib/number-draft';
import { shopLimitsSaveSchema } from '@/shared/measurements';

export type LimitRuleKey = keyof CheckLimitOverrides & keyof z.input<typeof shopLimitsSaveSchema>['limits'];
/** A check's minimum, maximum and watch band, or a grinding number the shop sets (`value`). */
export type LimitPart = 'min' | 'max' | 'watchBand' | 'value';

/** One rule on the shop's limits form. A new rule is one more entry in `limitRules`; the form is built from the list. */
export type LimitRule = {
  key: LimitRuleKey;
  title: string;
  /** What the rule measures, in a few words. */
  what: string;
  /** Lengths follow the unit toggle; degrees and ratios keep `unit`. */
  quantity: Quantity | null;
  /** calc's unit: in, °, :1. */
  unit: string;
  digits: number;
  parts: readonly LimitPart[];
  /** What a shop may set for the minimum or maximum, in calc's unit; a watch band runs from 0 to `watchMax`. */
  range: readonly [number, number];
  watchMax: number;
};

const inches = { quantity: 'length', unit: 'in', digits: 3 } as const;

export const limitRules: readonly LimitRule[] = [
  {
    key: 'ptvIntake',
    title: 'Piston-to-valve, intake',
    what: 'least clearance through overlap',
    ...inches,
    parts: ['min', 'watchBand'],
    range: [0, 0.5],
    watchMax: 0.25,
  },
  {
    key: 'ptvExhaust',
    title: 'Piston-to-valve, exhaust',
    what: 'least clearance through overlap',
    ...inches,
    parts: ['min', 'watchBand'],
    range: [0, 0.5],
    watchMax: 0.25,
  },
  {
    key: 'coilBind',
    title: 'Coil-bind margin',
    what: 'spring height above coil bind at max lift',
    ...inches,
    parts: ['min', 'watchBand'],
    range: [0, 0.5],
    watchMax: 0.25,
  },
  { key: 'retainerToSeal', title: 'Retainer-to-seal', what: 'clearance at max lift', ...inches, parts: ['min', 'watchBand'], range: [0, 0.5], watchMax: 0.25 },
  {
    key: 'hydraulicPreload',
    title: 'Lifter preload',
    what: 'plunger travel used by preload',
    ...inches,
    parts: ['min', 'max', 'watchBand'],
    range: [0, 0.25],
    watchMax: 0.1,
  },
  {
    key: 'degreeing',
    title: 'Cam degreed in',
    what: 'measured ICL away from the sheet',
    quantity: null,
    unit: '°',
    digits: 1,
    parts: ['max', 'watchBand'],
    range: [0, 10],
    watchMax: 5,
  },
  { key: 'wornLobe', title: 'Lobe wear', what: 'max lift below its siblings', ...inches, parts: ['max', 'watchBand'], range: [0, 0.1], watchMax: 0.05 },
  {
    key: 'dynamicCompression',
    title: 'Dynamic compression',
    what: 'for pump fuel',
    quantity: null,
    unit: ':1',
    digits: 1,
    parts: ['max', 'watchBand'],
    range: [5, 14],
    watchMax: 2,
  },
  // Fits the core: what the grinding needs (calc/checks.ts holds each default and its source).
  {
    key: 'finishingStock',
    title: 'Finishing stock',
    what: 'metal left between the old lobe and the new one, on the radius',
    ...inches,
    parts: ['min', 'watchBand'],
    range: [0, 0.1],
    watchMax: 0.05,
  },
  {
    key: 'cleanupAllowance',
    title: 'Cleanup allowance',
    what: 'ground off below the deepest damage so the new surface is clean',
    ...inches,
    parts: ['value'],
    range: [0, 0.05],
    watchMax: 0,
  },
  {
    key: 'largestCut',
    title: 'Largest cut',
    what: 'base-circle cut on the diameter the hardened layer allows',
    ...inches,
    parts: ['value'],
    range: [0, 0.3],
    watchMax: 0,
  },
  {
    key: 'pressureAngle',
    title: 'Largest pressure angle',
    what: 'push of the lobe against the roller, sideways',
    quantity: null,
    unit: '°',
    digits: 1,
    parts: ['max', 'watchBand'],
    range: [0, 60],
    watchMax: 10,
  },
  {
    key: 'rollerDiameter',
    title: 'Lifter roller diameter',
    what: 'for pressure angle and lobe radius',
    ...inches,
    parts: ['value'],
    range: [0, 1.5],
    watchMax: 0,
  },
  {
    key: 'wheelRadius',
    title: 'Grinding wheel radius',
    what: 'a concave flank tighter than the wheel cannot be ground',
    ...inches,
    parts: ['value'],
    range: [0, 20],
    watchMax: 0,
  },
];

export const limitPartLabels: Record<LimitPart, string> = { min: 'Minimum', max: 'Maximum', watchBand: 'Watch band', value: 'Value' };

/** The number field for one part of a rule. Every part is optional: blank uses Lobewright's default. */
export function limitSpec(rule: LimitRule, part: LimitPart): NumberSpec {
  const [min, max] = part === 'watchBand' ? [0, rule.watchMax] : rule.range;
  return {
    path: `${rule.key}.${part}`,
    label: `Shop ${limitPartLabels[part].toLowerCase()}`,
    quantity: rule.quantity,
    unit: rule.unit,
    digits: rule.digits,
    min,
    max,
    optional: true,
  };
}

export const limitSpecs: readonly NumberSpec[] = limitRules.flatMap((rule) => rule.parts.map((part) => limitSpec(rule, part)));
export const limitFieldPaths: readonly string[] = limitSpecs.map((spec) => spec.path);

/** The form's values: a draft per part of each rule, blank where the shop uses the default. */
export type LimitDraft = Partial<Record<LimitRuleKey, Partial<Record<LimitPart, NumberDraft>>>>;

export function limitDraftFrom(limits: CheckLimitOverrides): LimitDraft {
  return draftsFor(limitSpecs, limits) as LimitDraft;
}

/** Drops the parts left blank (null) and the rules with nothing set: a shop's overrides hold only what it changed. */
function onlySet(record: unknown): unknown {
  if (typeof record !== 'object' || record === null) return record;
  const out: Record<string, Record<string, unknown>> = {};
  for (const [key, rule] of Object.entries(record as Record<string, Record<string, unknown> | undefined>)) {
    const set = Object.fromEntries(Object.entries(rule ?? {}).filter(([, v]) => v !== null));
    if (Object.keys(set).length > 0) out[key] = set;
  }
  return out;
}

/** The overrides as the server takes them, checked with its schema (a preload maximum above its minimum, and so on). */
export const limitOverridesSchema = z.preprocess(onlySet, shopLimitsSaveSchema.shape.limits);

/** A rule's numbers as read-only text in the unit shown now: "minimum 2.03 mm, watch band 0.51 mm". */
export function ruleText(rule: LimitRule, values: CheckLimits[keyof CheckLimits], units: ShownUnits): string {
  return rule.parts
    .map((part) => {
      const spec = limitSpec(rule, part);
      const value = (values as unknown as Record<string, unknown>)[part];
      if (typeof value !== 'number') return `${limitPartLabels[part].toLowerCase()} not set`;
      const shown = spec.quantity ? units.toShown(spec.quantity, value) : value;
      const digits = spec.quantity ? units.digits(spec.quantity, spec.digits) : spec.digits;
      return `${limitPartLabels[part].toLowerCase()} ${formatCompact(shown, digits)} ${shownUnit(spec, units)}`;
    })
    .join(', ');
}
