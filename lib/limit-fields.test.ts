import { describe, expect, it } from 'vitest';

import { DEFAULT_CHECK_LIMITS } from '@/calc/checks';
import * as calcUnits from '@/calc/units';
import { limitDraftFrom, limitOverridesSchema, limitRules, limitSpec, limitSpecs, ruleText } from '@/lib/limit-fields';
import { draftFromText, resolveDrafts, type NumberDraft } from '@/lib/number-draft';
import { shopLimitsSaveSchema } from '@/shared/measurements';
import { unitConverter } from '@/state/units';

// Sources: 1 in = 25.4 mm exactly (NIST SP 811, Appendix B.8); the limits form is Lobewright's own (common practice, no source).

const inches = unitConverter(null, 'imperial', 'cc');
const mm = unitConverter(calcUnits, 'metric', 'cc');
const rule = (key: string) => limitRules.find((r) => r.key === key)!;
const resolve = (drafts: unknown, units = inches) => resolveDrafts(limitSpecs, drafts, {}, limitOverridesSchema, units);

describe('shop limits form', () => {
  it('has a field for every part of every rule the server takes, and no other', () => {
    const serverRules = Object.keys(shopLimitsSaveSchema.shape.limits.shape).sort();
    expect(limitRules.map((r) => r.key).sort()).toEqual(serverRules);
    expect(limitSpecs.every((s) => s.optional)).toBe(true);
  });

  it('keeps blank parts out of the overrides: blank is the default, never zero', () => {
    expect(resolve(limitDraftFrom({}))).toEqual({ values: {}, errors: null });
    const drafts = limitDraftFrom({ ptvIntake: { min: 0.09 } });
    expect(drafts.ptvIntake?.watchBand?.value).toBeNull();
    expect(resolve(drafts)).toEqual({ values: { ptvIntake: { min: 0.09 } }, errors: null });
  });

  it('saves a clearance typed in mm as inches', () => {
    const drafts = limitDraftFrom({}) as Record<string, Record<string, NumberDraft>>;
    drafts.ptvExhaust!.min = draftFromText(limitSpec(rule('ptvExhaust'), 'min'), '2.54', mm);
    const result = resolve(drafts, mm);
    expect(result.errors).toBeNull();
    expect(result.values?.ptvExhaust?.min).toBeCloseTo(0.1, 12);
  });

  it('refuses a preload maximum below the minimum, on the maximum', () => {
    const drafts = limitDraftFrom({ hydraulicPreload: { min: 0.05, max: 0.03 } });
    expect(resolve(drafts).errors).toEqual({ 'hydraulicPreload.max': 'Maximum must be above the minimum' });
  });

  it('names a part that is not a number, in the unit shown', () => {
    const drafts = limitDraftFrom({}) as Record<string, Record<string, NumberDraft>>;
    drafts.coilBind!.min = draftFromText(limitSpec(rule('coilBind'), 'min'), 'lots', mm);
    expect(resolve(drafts, mm).errors).toEqual({ 'coilBind.min': 'Shop minimum must be a number, in mm' });
  });

  it('writes a rule in the unit shown, degrees and ratios as they are', () => {
    expect(ruleText(rule('ptvIntake'), DEFAULT_CHECK_LIMITS.ptvIntake, inches)).toBe('minimum 0.08 in, watch band 0.02 in');
    expect(ruleText(rule('ptvIntake'), DEFAULT_CHECK_LIMITS.ptvIntake, mm)).toBe('minimum 2.03 mm, watch band 0.51 mm');
    expect(ruleText(rule('degreeing'), DEFAULT_CHECK_LIMITS.degreeing, mm)).toBe('maximum 2 °, watch band 1 °');
  });
});
