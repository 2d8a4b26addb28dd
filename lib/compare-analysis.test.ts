import { describe, expect, it } from 'vitest';

import { DEMO_ENGINE, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { analyzeColumn, summarizeColumns } from '@/lib/compare-analysis';
import { chosenProfiles, toggleChoice } from '@/lib/compare-selection';
import { draftFromText } from '@/lib/number-draft';
import { profileNumberSpecs } from '@/lib/profile-fields';
import { tryDraftFrom } from '@/lib/try-values';
import { unitConverter } from '@/state/units';
import { engineSchema } from '@/shared/engine';
import { profileSpecSchema, type Profile } from '@/shared/profile';

const engine = engineSchema.parse({ ...DEMO_ENGINE, firingOrder: '1-8-4-3-6-5-7-2' });
const profile = (id: string, label: string, spec: unknown): Profile => ({
  id,
  shopId: 'shop-1',
  jobId: 'job-1',
  sourceProfileId: null,
  label,
  coreNotes: '',
  spec: profileSpecSchema.parse(spec),
  version: 1,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
});
const stock = profile('p-stock', 'Stock regrind', DEMO_STOCK_REGRIND);
const towing = profile('p-towing', 'Towing grind', DEMO_TOWING);
const inches = unitConverter(null, 'imperial', 'cc');

/** The try-values form after typing `text` into the intake duration at 0.050 in. */
function typedDuration(text: string) {
  const draft = tryDraftFrom(towing.spec);
  draft.spec.intake.duration050 = draftFromText(profileNumberSpecs.intake.duration050, text, inches);
  return draft;
}

describe('compare columns', () => {
  it('analyzes the typed values without changing the saved profile', () => {
    const column = analyzeColumn(engine, towing, typedDuration('216'), inches);
    expect(column.error).toBeNull();
    expect(column.fieldErrors).toEqual({});
    expect(column.spec.intake.duration050).toBe(216);
    expect(towing.spec.intake.duration050).toBe(212);
    expect(column.analysis).not.toBeNull();
  });

  it('keeps the saved spec and names the field when a typed value is not a number', () => {
    const column = analyzeColumn(engine, towing, typedDuration('abc'), inches);
    expect(column.spec).toEqual(towing.spec);
    expect(Object.keys(column.fieldErrors)).toEqual(['spec.intake.duration050']);
  });

  it('compares the first two worked-out profiles for the owner', () => {
    const summary = summarizeColumns([analyzeColumn(engine, stock, undefined, inches), analyzeColumn(engine, towing, undefined, inches)]);
    expect(summary.names).toEqual(['Stock regrind', 'Towing grind']);
    expect(summary.analyses).toHaveLength(2);
    expect(summary.owner?.headline).toEqual(expect.any(String));
    expect(summarizeColumns([analyzeColumn(engine, stock, undefined, inches)]).owner).toBeNull();
  });
});

describe('choosing profiles', () => {
  it('starts with the first two and keeps the three picked last', () => {
    const third = profile('p-3', 'Third', DEMO_TOWING);
    const fourth = profile('p-4', 'Fourth', DEMO_TOWING);
    const all = [stock, towing, third, fourth];
    expect(chosenProfiles(undefined, all).map((p) => p.id)).toEqual(['p-stock', 'p-towing']);
    expect(chosenProfiles(['p-4', 'gone'], all).map((p) => p.id)).toEqual(['p-4']);
    expect(toggleChoice(['p-stock', 'p-towing', 'p-3'], 'p-4')).toEqual(['p-towing', 'p-3', 'p-4']);
    expect(toggleChoice(['p-stock', 'p-towing'], 'p-stock')).toEqual(['p-towing']);
  });
});
