import { describe, expect, it } from 'vitest';
import { checkMaximum, checkMinimum, checkRange, DEFAULT_CHECK_LIMITS, resolveCheckLimits, SHOP_SOURCE, summarizeChecks, worstStatus } from './checks';
import { CalcInputError } from './errors';

const base = { id: 'coilBind' as const, subject: 'intake', unit: 'in', what: 'Coil-bind margin at max lift' };

describe('default limits', () => {
  it('carry the trade rules of thumb, marked as having no source', () => {
    // Common practice, no source: coil-bind margin ≥ 0.060 in, retainer-to-seal ≥ 0.050 in,
    // PTV ≥ 0.080 in intake and ≥ 0.100 in exhaust, hydraulic preload 0.020–0.060 in.
    expect(DEFAULT_CHECK_LIMITS.coilBind.min).toBe(0.06);
    expect(DEFAULT_CHECK_LIMITS.retainerToSeal.min).toBe(0.05);
    expect(DEFAULT_CHECK_LIMITS.ptvIntake.min).toBe(0.08);
    expect(DEFAULT_CHECK_LIMITS.ptvExhaust.min).toBe(0.1);
    expect(DEFAULT_CHECK_LIMITS.hydraulicPreload.min).toBe(0.02);
    expect(DEFAULT_CHECK_LIMITS.hydraulicPreload.max).toBe(0.06);
    for (const rule of Object.values(DEFAULT_CHECK_LIMITS)) expect(rule.source).toMatch(/common practice, no source|from memory/);
    // Norton, Design of Machinery, §8.7 (from memory): about 30° for a translating roller follower.
    expect(DEFAULT_CHECK_LIMITS.pressureAngle.max).toBe(30);
    expect(DEFAULT_CHECK_LIMITS.pressureAngle.source).toMatch(/Norton/);
  });
});

describe('check functions validate their rules (finding 5)', () => {
  it('regression: a NaN rule is refused, never a pass', () => {
    // The old checkMinimum compared against NaN, found no margin below zero and answered "pass".
    const nanRule = { min: Number.NaN, watchBand: 0.02, source: 'test rule' };
    expect(() => checkMinimum({ ...base, value: 0.15 }, nanRule)).toThrow(CalcInputError);
    expect(() => checkMinimum({ ...base, value: 0.15 }, nanRule)).toThrow(/rule\.min/);
    expect(() => checkMaximum({ ...base, value: 1 }, { max: Infinity, watchBand: 0, source: 'x' })).toThrow(/rule\.max/);
    expect(() => checkRange({ ...base, value: 0.03 }, { min: 0.02, max: 0.06, watchBand: Number.NaN, source: 'x' })).toThrow(/rule\.watchBand/);
    expect(() => checkRange({ ...base, value: 0.03 }, { min: 0.06, max: 0.02, watchBand: 0, source: 'x' })).toThrow(/rule\.max/);
    expect(() => checkMinimum({ ...base, value: 0.15 }, { min: 0.06, watchBand: 0.02, source: '' })).toThrow(/rule\.source/);
  });

  it('regression: missing or non-object arguments are a CalcInputError, not a TypeError', () => {
    expect(() => checkMinimum(undefined as never, DEFAULT_CHECK_LIMITS.coilBind)).toThrow(CalcInputError);
    expect(() => checkMinimum({ ...base, value: 0.1 }, undefined as never)).toThrow(CalcInputError);
    expect(() => checkMaximum({ ...base, value: 0.1 }, 'strict' as never)).toThrow(CalcInputError);
    expect(() => resolveCheckLimits({ coilBind: 5 } as never)).toThrow(/limits\.coilBind/);
    expect(() => resolveCheckLimits({ springSurge: {} } as never)).toThrow(/limits\.springSurge/);
    expect(() => worstStatus(undefined as never)).toThrow(CalcInputError);
  });
});

describe('checkMinimum', () => {
  it('passes, watches and fails around the limit', () => {
    const rule = DEFAULT_CHECK_LIMITS.coilBind;
    const pass = checkMinimum({ ...base, value: 0.15 }, rule);
    expect(pass.status).toBe('pass');
    expect(pass.margin).toBeCloseTo(0.09, 12);
    expect(pass.limit).toBe(0.06);
    expect(pass.rule).toContain('0.060 in');
    expect(pass.source).toBe('common practice, no source');
    expect(checkMinimum({ ...base, value: 0.07 }, rule).status).toBe('watch');
    expect(checkMinimum({ ...base, value: 0.06 }, rule).status).toBe('watch');
    const fail = checkMinimum({ ...base, value: 0.04 }, rule);
    expect(fail.status).toBe('fail');
    expect(fail.margin).toBeCloseTo(-0.02, 12);
  });
});

describe('checkMaximum and checkRange', () => {
  it('measures margins in the safe direction', () => {
    const dyn = checkMaximum(
      { id: 'dynamicCompression', subject: 'engine', unit: ':1', what: 'Dynamic compression', value: 8.0 },
      DEFAULT_CHECK_LIMITS.dynamicCompression,
    );
    expect(dyn.status).toBe('pass');
    expect(dyn.margin).toBeCloseTo(0.5, 12);
    expect(
      checkMaximum({ id: 'dynamicCompression', subject: 'engine', unit: ':1', what: 'x', value: 8.4 }, DEFAULT_CHECK_LIMITS.dynamicCompression).status,
    ).toBe('watch');
    expect(
      checkMaximum({ id: 'dynamicCompression', subject: 'engine', unit: ':1', what: 'x', value: 8.9 }, DEFAULT_CHECK_LIMITS.dynamicCompression).status,
    ).toBe('fail');
    const pre = { id: 'hydraulicPreload' as const, subject: 'intake', unit: 'in', what: 'Lifter preload' };
    const mid = checkRange({ ...pre, value: 0.04 }, DEFAULT_CHECK_LIMITS.hydraulicPreload);
    expect(mid.status).toBe('pass');
    expect(mid.margin).toBeCloseTo(0.02, 12);
    const low = checkRange({ ...pre, value: 0.022 }, DEFAULT_CHECK_LIMITS.hydraulicPreload);
    expect(low.status).toBe('watch');
    expect(low.limit).toBe(0.02);
    const high = checkRange({ ...pre, value: 0.07 }, DEFAULT_CHECK_LIMITS.hydraulicPreload);
    expect(high.status).toBe('fail');
    expect(high.limit).toBe(0.06);
    expect(high.margin).toBeCloseTo(-0.01, 12);
  });

  it('rejects a non-finite value', () => {
    expect(() => checkMinimum({ ...base, value: Number.NaN }, DEFAULT_CHECK_LIMITS.coilBind)).toThrow(CalcInputError);
  });
});

describe('resolveCheckLimits', () => {
  it('merges a shop override and marks it as the shop setting', () => {
    const limits = resolveCheckLimits({ ptvIntake: { min: 0.1 }, coilBind: { watchBand: 0.03, source: 'our spring supplier sheet' } });
    expect(limits.ptvIntake).toEqual({ min: 0.1, watchBand: 0.02, source: SHOP_SOURCE });
    expect(limits.coilBind.source).toBe('our spring supplier sheet');
    expect(limits.ptvExhaust).toEqual(DEFAULT_CHECK_LIMITS.ptvExhaust);
  });

  it('rejects bad overrides naming the field', () => {
    expect(() => resolveCheckLimits({ ptvIntake: { min: Number.NaN } })).toThrow(/limits.ptvIntake.min/);
    expect(() => resolveCheckLimits({ coilBind: { watchBand: -1 } })).toThrow(/limits.coilBind.watchBand/);
    expect(() => resolveCheckLimits({ hydraulicPreload: { min: 0.08 } })).toThrow(/limits.hydraulicPreload.max/);
  });
});

describe('worstStatus', () => {
  it('takes fail over watch over pass', () => {
    expect(worstStatus([])).toBe('pass');
    expect(worstStatus([{ status: 'pass' }, { status: 'watch' }])).toBe('watch');
    expect(worstStatus([{ status: 'watch' }, { status: 'fail' }, { status: 'pass' }])).toBe('fail');
  });
});

describe('summarizeChecks (issue 14, finding 7)', () => {
  const pass = { status: 'pass' as const };
  const fail = { status: 'fail' as const };
  const notRun = (id: 'ptvIntake' | 'degreeing') => ({ id, subject: 'intake', note: 'not measured: record it' });

  it('reads Pass only when every check ran and passed', () => {
    expect(summarizeChecks({ checks: [pass, pass], skipped: [] })).toMatchObject({ status: 'pass', complete: true, ran: 2, total: 2, label: 'Pass' });
  });

  it('says how many ran when some did not, and never Pass', () => {
    const five = [pass, pass, pass, pass, pass];
    const s = summarizeChecks({ checks: five, skipped: [notRun('ptvIntake'), notRun('degreeing'), notRun('ptvIntake')] });
    expect(s).toMatchObject({ status: 'incomplete', complete: false, ran: 5, total: 8, label: '5 of 8 checks run' });
  });

  it('puts a failure first even when checks are still to run', () => {
    expect(summarizeChecks({ checks: [pass, fail], skipped: [notRun('degreeing')] })).toMatchObject({ status: 'fail', label: 'Fail · 2 of 3 checks run' });
  });

  it('leaves out a check that does not apply, and says when none ran', () => {
    const solid = { id: 'hydraulicPreload' as const, subject: 'lifters', note: 'solid lifters: set lash instead of preload', notApplicable: true as const };
    expect(summarizeChecks({ checks: [pass], skipped: [solid] })).toMatchObject({ status: 'pass', total: 1, label: 'Pass' });
    expect(summarizeChecks({ checks: [], skipped: [notRun('degreeing')] })).toMatchObject({ status: 'incomplete', ran: 0, label: 'No checks run yet' });
  });
});
