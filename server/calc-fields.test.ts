import { describe, expect, it } from 'vitest';

import { CalcInputError } from '@/calc/errors';

import { calcInputAnswer, renamePrefixes } from './calc-fields';

describe('renamePrefixes', () => {
  const rename = renamePrefixes([
    ['regrind.regrindBaseCircle', 'spec.baseCircle'],
    ['regrind', 'pushrod'],
    [/^ptv-baseline\.(intake|exhaust)\.(\d+)\.baseline(?=\.|$)/, 'ptv-baseline.$1.$2'],
  ]);

  it('renames whole leading segments by the first rule that matches, and leaves other paths alone', () => {
    expect(rename('regrind.regrindBaseCircle')).toBe('spec.baseCircle');
    expect(rename('regrind.originalPreload')).toBe('pushrod.originalPreload');
    expect(rename('regrindX.originalPreload')).toBe('regrindX.originalPreload');
    expect(rename('engine.bore')).toBe('engine.bore');
  });

  it('keeps the parts of the path a pattern captures', () => {
    expect(rename('ptv-baseline.exhaust.2.baseline.clearance')).toBe('ptv-baseline.exhaust.2.clearance');
    expect(rename('ptv-baseline.intake.0.stroke')).toBe('ptv-baseline.intake.0.stroke');
  });
});

describe('calcInputAnswer', () => {
  it('is a 400 naming the field in the request terms, with the message as a sentence', () => {
    const answer = calcInputAnswer(new CalcInputError('profile.intake.lash', 'must be 0 in or more (got -1)'), renamePrefixes([['profile', 'spec']]));
    expect(answer.status).toBe(400);
    expect(answer.code).toBe('invalid_input');
    expect(answer.message).toBe('spec.intake.lash: must be 0 in or more (got -1)');
    expect(answer.fields).toEqual({ 'spec.intake.lash': 'Must be 0 in or more (got -1)' });
  });
});
