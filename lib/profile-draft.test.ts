import { describe, expect, it } from 'vitest';

import { DEMO_TOWING } from '@/calc/demo';

import { profileSpecSchema } from '@/shared/profile';
import { applyDraft, draftText, sameSpec } from '@/lib/profile-draft';

const spec = profileSpecSchema.parse(DEMO_TOWING);

describe('profile drafts', () => {
  it('shows the saved value until something is typed', () => {
    expect(draftText(spec, {}, 'intake.duration050')).toBe('212');
    expect(draftText(spec, { 'intake.duration050': '21' }, 'intake.duration050')).toBe('21');
  });

  it('applies typed numbers without touching the saved spec', () => {
    const result = applyDraft(spec, { 'intake.duration050': '216', lsa: '110.5' });
    expect(result).toMatchObject({ ok: true, spec: { lsa: 110.5, intake: { duration050: 216, lobeLift: 0.333 } } });
    expect(spec.intake.duration050).toBe(212);
  });

  it('names each field that is not a number or out of range', () => {
    const result = applyDraft(spec, { 'intake.duration050': 'abc', icl: '300' });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors['intake.duration050']).toBe('Enter a number');
    if (!result.ok) expect(result.errors.icl).toMatch(/Intake centreline is between 90 and 135/);
  });

  it('catches an advertised duration shorter than the 0.050 in duration', () => {
    const result = applyDraft(spec, { 'exhaust.advertisedDuration': '200' });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors['exhaust.advertisedDuration']).toMatch(/longer than the duration at 0.050/);
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
