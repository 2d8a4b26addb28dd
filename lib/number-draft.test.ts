import * as fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';

import { DEMO_ENGINE, DEMO_TOWING } from '@/calc/demo';
import * as calcUnits from '@/calc/units';

import { engineSchema } from '@/shared/engine';
import { engineDraftFrom, engineNumberList, engineNumberSpecs } from '@/lib/engine-fields';
import { offerNumberList, offerNumberSpecs } from '@/lib/offer-fields';
import { ownerOptionCreateSchema } from '@/shared/owner';
import { unitConverter } from '@/state/units';
import {
  centsFromText,
  checkDraft,
  draftFromText,
  draftFromValue,
  formatNumber,
  parseNumberText,
  placeServerFields,
  rangeText,
  resolveDrafts,
  shownText,
  type Quantity,
  type ShownUnits,
} from '@/lib/number-draft';
import { profileCreateSchema, profileSpecSchema } from '@/shared/profile';
import { profileDraftFrom, profileNumberList, profileNumberSpecs } from '@/lib/profile-fields';

// Sources: conversions by mathjs units through calc/units; form behaviour is Lobewright's own (common practice, no source).

const imperial: ShownUnits = {
  toShown: (_q, v) => v,
  fromShown: (_q, v) => v,
  label: (q: Quantity) => ({ length: 'in', volume: 'cc', force: 'lbf', rate: 'lbf/in' })[q],
  digits: (_q, d) => d,
};

/** The converter the unit toggle builds (state/units) for mm, N, N/mm and cubic inches. */
const metric: ShownUnits = unitConverter(calcUnits, 'metric', 'in3');

const bore = engineNumberSpecs.bore;
const demoEngine = engineSchema.parse({ ...DEMO_ENGINE, firingOrder: '1-8-4-3-6-5-7-2' });
const demoTowing = profileSpecSchema.parse(DEMO_TOWING);

describe('parseNumberText', () => {
  it('reads plain, signed, leading-dot and decimal-comma numbers', () => {
    expect(parseNumberText('4.030')).toBe(4.03);
    expect(parseNumberText(' -0.005 ')).toBe(-0.005);
    expect(parseNumberText('−12')).toBe(-12);
    expect(parseNumberText('.050')).toBe(0.05);
    expect(parseNumberText('102,36')).toBe(102.36);
  });
  it('gives null for blank and NaN for anything else', () => {
    expect(parseNumberText('  ')).toBeNull();
    expect(parseNumberText('4.0x')).toBeNaN();
    expect(parseNumberText('1.2.3')).toBeNaN();
    expect(parseNumberText('abc')).toBeNaN();
  });
});

describe('parseNumberText for money', () => {
  it('reads dollars with a sign and thousands commas, at most two decimals, never negative', () => {
    expect(parseNumberText('$1,050.50', { money: true })).toBe(1050.5);
    expect(parseNumberText('225', { money: true })).toBe(225);
    expect(parseNumberText('', { money: true })).toBeNull();
    for (const text of ['-5', '4.555', '1e3', '12.', '1,05', 'abc']) expect(parseNumberText(text, { money: true }), text).toBeNaN();
  });
  it('turns dollars into whole cents without float noise', () => {
    // 0.29 × 100 is 28.999999999999996 in binary floating point; the cents must still be 29.
    expect(centsFromText('0.29')).toBe(29);
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000 }), (cents) => {
        const text = `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
        return centsFromText(text) === cents;
      }),
    );
  });
});

describe('parseNumberText for counts', () => {
  it('reads a whole number with thousands commas, and nothing else', () => {
    expect(parseNumberText('98,500', { count: true })).toBe(98_500);
    expect(parseNumberText(' 123456 ', { count: true })).toBe(123_456);
    expect(parseNumberText('', { count: true })).toBeNull();
    // A single comma is a decimal comma elsewhere; in a count it is a typo, never 12.5 or 125.
    for (const text of ['12,5', '1,2345', '-5', '12.5', '1e3', 'abc']) expect(parseNumberText(text, { count: true }), text).toBeNaN();
  });
});

describe('money fields', () => {
  const price = offerNumberSpecs.price;
  it('shows saved cents as dollars and saves what is typed as cents', () => {
    expect(draftFromValue(price, 48_500)).toEqual({ text: '485.00', unit: '$', value: 485 });
    const drafts = {
      priceCents: draftFromText(price, '1,050.50', imperial),
      depositCents: draftFromText(offerNumberSpecs.deposit, '300', imperial),
      leadTimeDays: draftFromText(offerNumberSpecs.leadTime, '3', imperial),
    };
    const result = resolveDrafts(offerNumberList, drafts, { sheetId: 's1', title: 'Quick', ownerNote: '' }, ownerOptionCreateSchema, imperial);
    expect(result).toEqual({
      values: { sheetId: 's1', title: 'Quick', ownerNote: '', priceCents: 105_050, depositCents: 30_000, leadTimeDays: 3 },
      errors: null,
    });
  });
  it('names an amount that is not dollars and cents, and a deposit above the price', () => {
    expect(checkDraft(price, draftFromText(price, '4.555', imperial), imperial)).toBe('Price must be an amount in dollars, like 485.00');
    expect(rangeText(price, imperial)).toBe('$0 to $100000');
    const drafts = {
      priceCents: draftFromText(price, '100', imperial),
      depositCents: draftFromText(offerNumberSpecs.deposit, '200', imperial),
      leadTimeDays: draftFromText(offerNumberSpecs.leadTime, '3', imperial),
    };
    const result = resolveDrafts(offerNumberList, drafts, { sheetId: 's1', title: 'Quick', ownerNote: '' }, ownerOptionCreateSchema, imperial);
    expect(result.errors).toEqual({ depositCents: 'The deposit cannot be more than the price' });
  });
});

describe('units round trip', () => {
  // 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811, Appendix B.8), with mathjs units as a second reference.
  const lengthSpecs = engineNumberList.filter((spec) => spec.quantity === 'length');
  it('stores a length typed in mm as the same inches as typing the inches', () => {
    fc.assert(
      fc.property(fc.constantFrom(...lengthSpecs), fc.double({ min: 0, max: 1, noNaN: true }), (spec, t) => {
        const inchesTyped = spec.min + t * (Math.min(spec.max, 20) - spec.min);
        const mmText = String(unit(inchesTyped, 'inch').toNumber('mm'));
        const fromMm = draftFromText(spec, mmText, metric).value!;
        const fromInches = draftFromText(spec, String(inchesTyped), imperial).value!;
        expect(Math.abs(fromMm - fromInches)).toBeLessThan(1e-9);
        expect(Math.abs(fromMm - Number(mmText) / 25.4)).toBeLessThan(1e-9);
      }),
    );
  });
});

describe('formatNumber', () => {
  it('keeps fixed decimals and never shows a negative zero', () => {
    expect(formatNumber(4.03, 3)).toBe('4.030');
    expect(formatNumber(-0.0001, 3)).toBe('0.000');
    expect(formatNumber(-5, 1)).toBe('-5.0');
  });
});

describe('switching units', () => {
  it('shows a typed value converted, and the typed text again when switched back', () => {
    const typed = draftFromText(bore, '4.0305', imperial);
    expect(typed.value).toBe(4.0305);
    expect(shownText(bore, typed, metric)).toBe('102.37');
    expect(shownText(bore, typed, imperial)).toBe('4.0305');
  });

  it('keeps the full value when nothing is edited in the other unit', () => {
    const saved = draftFromValue(bore, 4.0305);
    expect(saved.text).toBe('4.0305');
    expect(shownText(bore, saved, metric)).toBe('102.37');
    expect(saved.value).toBe(4.0305);
  });

  it('converts text typed in mm back to inches without float noise', () => {
    const typed = draftFromText(bore, '50.8', metric);
    expect(typed.unit).toBe('mm');
    expect(typed.value).toBe(2);
    expect(checkDraft(bore, typed, metric)).toBeNull();
    expect(shownText(bore, typed, imperial)).toBe('2.000');
  });

  it('converts volumes to cubic inches and forces to newtons', () => {
    const chamber = draftFromValue(engineNumberSpecs.chamberCc, 68);
    expect(shownText(engineNumberSpecs.chamberCc, chamber, metric)).toBe('4.150');
    const seat = draftFromValue(engineNumberSpecs.seatLoad, 115);
    expect(shownText(engineNumberSpecs.seatLoad, seat, metric)).toBe('512');
  });

  it('leaves fixed-unit fields alone', () => {
    const angle = draftFromText(engineNumberSpecs.valveAngle, '18', imperial);
    expect(shownText(engineNumberSpecs.valveAngle, angle, metric)).toBe('18');
  });

  it('keeps text that is not a number as typed, whatever the unit', () => {
    const bad = draftFromText(bore, '4.0x', imperial);
    expect(shownText(bore, bad, metric)).toBe('4.0x');
  });
});

describe('checkDraft', () => {
  it('names the field and the unit shown', () => {
    expect(checkDraft(bore, draftFromText(bore, '', imperial), imperial)).toBe('Enter the bore');
    expect(checkDraft(bore, draftFromText(bore, 'four', metric), metric)).toBe('Bore must be a number, in mm');
    expect(checkDraft(bore, draftFromText(bore, '40', metric), metric)).toBe('Bore must be between 50.8 and 152.4 mm');
  });

  it('gives the range in the shown unit', () => {
    expect(rangeText(bore, imperial)).toBe('2 to 6 in');
    expect(rangeText(bore, metric)).toBe('50.8 to 152.4 mm');
    expect(rangeText(engineNumberSpecs.pistonCc, imperial)).toBe('−80 to 80 cc');
  });

  it('asks for whole cylinders and allows a blank optional field', () => {
    const cylinders = engineNumberSpecs.cylinders;
    expect(checkDraft(cylinders, draftFromText(cylinders, '7.5', imperial), imperial)).toBe('Cylinders is a whole number');
    const baseCircle = profileNumberSpecs.baseCircle;
    expect(checkDraft(baseCircle, draftFromText(baseCircle, '', imperial), imperial)).toBeNull();
  });
});

describe('resolveDrafts', () => {
  const extras = (draft: ReturnType<typeof engineDraftFrom>) => ({ lifterType: draft.lifterType, firingOrder: draft.firingOrder });

  it('round-trips the demo engine exactly', () => {
    const draft = engineDraftFrom(demoEngine);
    const result = resolveDrafts(engineNumberList, draft, extras(draft), engineSchema, imperial);
    expect(result.errors).toBeNull();
    expect(result.values).toEqual(demoEngine);
  });

  it('names every blank field of a new engine', () => {
    const draft = engineDraftFrom(null);
    const result = resolveDrafts(engineNumberList, draft, extras(draft), engineSchema, imperial);
    expect(result.values).toBeNull();
    expect(Object.keys(result.errors ?? {})).toHaveLength(engineNumberList.length);
    expect(result.errors?.['spring.seatLoad']).toBe('Enter the seat load');
  });

  it('reports a text field alongside number fields', () => {
    const draft = profileDraftFrom(null);
    const result = resolveDrafts(profileNumberList, draft, { label: ' ', coreNotes: '' }, profileCreateSchema, imperial);
    expect(result.errors?.label).toBe('Name the profile');
    expect(result.errors?.['spec.intake.duration050']).toBe('Enter the intake duration at 0.050 in');
    expect(result.errors?.['spec.baseCircle']).toBeUndefined();
    expect(result.errors?.['spec.intake.lash']).toBeUndefined();
  });

  it('puts the schema rule on coil-bind height', () => {
    const draft = engineDraftFrom(demoEngine);
    draft.spring.coilBindHeight = draftFromText(engineNumberSpecs.coilBindHeight, '1.900', imperial);
    const result = resolveDrafts(engineNumberList, draft, extras(draft), engineSchema, imperial);
    expect(result.errors).toEqual({ 'spring.coilBindHeight': 'Coil-bind height must be below the installed height' });
  });

  it('checks a profile, with a blank base circle saved as null', () => {
    const draft = profileDraftFrom({ label: 'Towing', coreNotes: '', spec: { ...demoTowing, baseCircle: null } });
    const result = resolveDrafts(profileNumberList, draft, { label: draft.label, coreNotes: draft.coreNotes }, profileCreateSchema, imperial);
    expect(result.errors).toBeNull();
    expect(result.values?.spec.baseCircle).toBeNull();
    expect(result.values?.spec.intake.duration050).toBe(212);
    expect(result.values?.label).toBe('Towing');
  });

  it('blames advertised duration when it is not longer than the 0.050 in duration', () => {
    const draft = profileDraftFrom({ label: 'Towing', coreNotes: '', spec: demoTowing });
    draft.spec.intake.advertisedDuration = draftFromText(profileNumberSpecs.intake.advertisedDuration, '200', imperial);
    const result = resolveDrafts(profileNumberList, draft, { label: draft.label, coreNotes: draft.coreNotes }, profileCreateSchema, imperial);
    expect(result.errors).toEqual({ 'spec.intake.advertisedDuration': 'Advertised duration must be longer than the duration at 0.050 in' });
  });
});

describe('placeServerFields', () => {
  it('strips the prefix and keeps what the form does not show', () => {
    const { placed, other } = placeServerFields(
      { 'engine.spring.coilBindHeight': 'Coil-bind height must be below the installed height', version: 'Send the version you edited' },
      engineNumberList.map((s) => s.path),
      'engine.',
    );
    expect(placed).toEqual({ 'spring.coilBindHeight': 'Coil-bind height must be below the installed height' });
    expect(other).toEqual(['version: Send the version you edited']);
  });
});
