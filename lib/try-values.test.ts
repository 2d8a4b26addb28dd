import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';

import { DEMO_TOWING } from '@/calc/demo';
import * as calcUnits from '@/calc/units';
import { draftFromText, shownText } from '@/lib/number-draft';
import { profileNumberSpecs } from '@/lib/profile-fields';
import { applyTryValues, sameSpec, tryDraftFrom } from '@/lib/try-values';
import { profileSpecSchema } from '@/shared/profile';
import { unitConverter } from '@/state/units';

// Sources: 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811, Appendix B.8), checked against mathjs units;
// the try-values behaviour is Lobewright's own (common practice, no source).

const spec = profileSpecSchema.parse(DEMO_TOWING);
const inches = unitConverter(null, 'imperial', 'cc');
const mm = unitConverter(calcUnits, 'metric', 'cc');
const lobeLift = profileNumberSpecs.intake.lobeLift;

describe('try values', () => {
  it('starts from the saved values', () => {
    const draft = tryDraftFrom(spec);
    expect(draft.spec.intake.duration050).toMatchObject({ text: '212', value: 212 });
    expect(applyTryValues(spec, draft, inches)).toEqual({ ok: true, spec });
  });

  it('applies tried numbers without touching the saved spec', () => {
    const draft = tryDraftFrom(spec);
    draft.spec.intake.duration050 = draftFromText(profileNumberSpecs.intake.duration050, '216', inches);
    draft.spec.lsa = draftFromText(profileNumberSpecs.lsa, '110,5', inches);
    const result = applyTryValues(spec, draft, inches);
    expect(result).toMatchObject({ ok: true, spec: { lsa: 110.5, intake: { duration050: 216, lobeLift: 0.333 } } });
    expect(spec.intake.duration050).toBe(212);
  });

  it('names each field that is not a number or out of range, in the unit shown', () => {
    const draft = tryDraftFrom(spec);
    draft.spec.intake.duration050 = draftFromText(profileNumberSpecs.intake.duration050, 'abc', inches);
    draft.spec.icl = draftFromText(profileNumberSpecs.icl, '300', inches);
    const result = applyTryValues(spec, draft, inches);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors['spec.intake.duration050']).toBe('Intake duration at 0.050 in must be a number, in ° crank');
    expect(result.errors['spec.icl']).toMatch(/Intake centreline must be between 90 and 135/);
  });

  it('catches an advertised duration shorter than the 0.050 in duration', () => {
    const draft = tryDraftFrom(spec);
    draft.spec.exhaust.advertisedDuration = draftFromText(profileNumberSpecs.exhaust.advertisedDuration, '200', inches);
    const result = applyTryValues(spec, draft, inches);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors['spec.exhaust.advertisedDuration']).toMatch(/longer than the duration at 0.050/);
  });

  // Regression: the try values took every lobe lift as inches whatever the unit toggle said.
  it('shows lobe lift in the toggle’s unit and tries it in inches', () => {
    const saved = tryDraftFrom(spec);
    expect(shownText(lobeLift, saved.spec.intake.lobeLift, mm)).toBe('8.46');
    const draft = tryDraftFrom(spec);
    draft.spec.intake.lobeLift = draftFromText(lobeLift, '9.00', mm);
    const result = applyTryValues(spec, draft, mm);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.spec.intake.lobeLift).toBeCloseTo(9 / 25.4, 9);
    expect(result.spec.intake.lobeLift).toBeCloseTo(unit(9, 'mm').toNumber('inch'), 9);
    expect(shownText(lobeLift, draft.spec.intake.lobeLift, inches)).toBe('0.354');
  });

  it('words a lobe lift out of range in millimetres when they are shown', () => {
    const draft = tryDraftFrom(spec);
    draft.spec.intake.lobeLift = draftFromText(lobeLift, '80', mm);
    const result = applyTryValues(spec, draft, mm);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors['spec.intake.lobeLift']).toMatch(/Intake lobe lift must be between [\d.]+ and [\d.]+ mm/);
  });
});

describe('sameSpec', () => {
  it('ignores key order and notices any changed number', () => {
    const reordered = { icl: spec.icl, lsa: spec.lsa, baseCircle: spec.baseCircle, exhaust: spec.exhaust, intake: { ...spec.intake } };
    expect(sameSpec(spec, reordered)).toBe(true);
    expect(sameSpec(spec, { ...spec, intake: { ...spec.intake, lash: 0.001 } })).toBe(false);
    expect(sameSpec(spec, { ...spec, baseCircle: null })).toBe(false);
  });
});
