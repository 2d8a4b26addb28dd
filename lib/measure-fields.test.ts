import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import * as calcUnits from '@/calc/units';
import { degreeConfig, ptvConfig, pushrodConfig, springsConfig } from '@/lib/measure-configs';
import { draftNumber, knownPaths, measureDraftFrom, measureRules, numberSpecs, rowDraft, type MeasureConfig, type MeasureDraft } from '@/lib/measure-fields';
import { draftFromText, resolveDrafts, setAt, type DraftResult, type NumberDraft, type ShownUnits } from '@/lib/number-draft';
import { ptvBaselineSchema } from '@/shared/measurements';
import { unitConverter } from '@/state/units';

// Sources: 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811, 2008 edition, Appendix B.8, "inch (in) = 2.54 E+00 centimeter (cm)",
// an exact factor). Which readings are optional is Lobewright's own (shared/measurements; common practice, no source).
const MM_PER_INCH = 25.4;

const inches = unitConverter(null, 'imperial', 'cc');
const mm = unitConverter(calcUnits, 'metric', 'cc');

/** What the form's resolver does on submit, through the same rules the form is built with. */
function resolve(config: MeasureConfig, draft: MeasureDraft, units: ShownUnits = inches): DraftResult<Record<string, unknown>> {
  const rules = measureRules(config);
  return resolveDrafts<Record<string, unknown>>(rules.specs(draft), draft, rules.others(draft), rules.schema(draft), units);
}

/** Types `text` into the field at `path`, in the units shown. */
function type(config: MeasureConfig, draft: MeasureDraft, path: string, text: string, units: ShownUnits = inches): MeasureDraft {
  const spec = numberSpecs(config, draft).find((s) => s.path === path);
  if (!spec) throw new Error(`no field ${path}`);
  const next = structuredClone(draft);
  setAt(next, path, draftFromText(spec, text, units));
  return next;
}

const pushrod = {
  checkingLength: 7.8,
  currentLength: null,
  plungerTravel: 0.08,
  targetPreload: 0.03,
  originalPreload: null,
  stockBaseCircle: 1.2,
  checkedOn: 'old-cam',
};

describe('measurement drafts to the saved record', () => {
  it('gives back a saved record unchanged, with its unmeasured readings still null', () => {
    const draft = measureDraftFrom(pushrodConfig, pushrod);
    expect((draft.currentLength as NumberDraft).value).toBeNull();
    expect(resolve(pushrodConfig, draft)).toEqual({ values: pushrod, errors: null });
  });

  it('saves a blank optional reading as null, never 0, and asks for a blank required one', () => {
    let draft: MeasureDraft = { ...measureDraftFrom(pushrodConfig, null), checkedOn: 'reground-cam' };
    for (const [path, text] of [
      ['checkingLength', '7.8'],
      ['plungerTravel', '0.08'],
      ['targetPreload', '0.03'],
      ['stockBaseCircle', '1.2'],
    ] as const) {
      draft = type(pushrodConfig, draft, path, text);
    }
    const saved = resolve(pushrodConfig, draft).values;
    expect(saved?.currentLength).toBeNull();
    expect(saved?.originalPreload).toBeNull();
    expect(saved?.originalPreload).not.toBe(0);
    const missing = resolve(pushrodConfig, type(pushrodConfig, draft, 'plungerTravel', ''));
    expect(missing).toEqual({ values: null, errors: { plungerTravel: 'Enter the lifter plunger travel' } });
    const unsaid = resolve(pushrodConfig, { ...draft, checkedOn: '' });
    expect(unsaid).toEqual({ values: null, errors: { checkedOn: 'Say which cam the checking pushrod was read on' } });
  });

  it('keeps a measured zero as zero, apart from a blank', () => {
    const draft = type(pushrodConfig, measureDraftFrom(pushrodConfig, pushrod), 'originalPreload', '0');
    expect(resolve(pushrodConfig, draft).values?.originalPreload).toBe(0);
  });

  it('leaves a blank "use the default" reading to the shared schema instead of saving null', () => {
    const draft = measureDraftFrom(ptvConfig, null);
    const filled = type(ptvConfig, type(ptvConfig, draft, 'intake.0.clearance', '0.120'), 'exhaust.0.clearance', '0.140');
    const saved = resolve(ptvConfig, filled).values as { intake: { valveLift: number }[] } | null;
    expect(saved?.intake[0]?.valveLift).toBe(ptvBaselineSchema.shape.intake.element.shape.valveLift.parse(undefined));
    expect(saved).toMatchObject({ method: 'clay', intake: [{ crankAngle: -10, clearance: 0.12 }], exhaust: [{ crankAngle: 10, clearance: 0.14 }] });
  });
});

describe('measurements typed in millimetres', () => {
  const lengthFields = numberSpecs(pushrodConfig, measureDraftFrom(pushrodConfig, pushrod)).filter((s) => s.quantity === 'length');

  it('stores a length typed in mm within 1e-9 in of the same length typed in inches', () => {
    fc.assert(
      fc.property(fc.constantFrom(...lengthFields), fc.double({ min: 0, max: 1, noNaN: true }), (spec, t) => {
        const typedInches = spec.min + t * (spec.max - spec.min);
        const mmText = String(typedInches * MM_PER_INCH);
        const inMm = resolve(pushrodConfig, type(pushrodConfig, measureDraftFrom(pushrodConfig, pushrod), spec.path, mmText, mm), mm);
        const inIn = resolve(pushrodConfig, type(pushrodConfig, measureDraftFrom(pushrodConfig, pushrod), spec.path, String(typedInches)));
        const fromMm = inMm.values?.[spec.path] as number;
        const fromIn = inIn.values?.[spec.path] as number;
        expect(Math.abs(fromMm - fromIn)).toBeLessThan(1e-9);
        expect(Math.abs(fromMm - Number(mmText) / MM_PER_INCH)).toBeLessThan(1e-9);
      }),
    );
  });

  it('turns 50.8 mm of installed height into 2 in, and says a range in mm', () => {
    const draft = type(springsConfig, measureDraftFrom(springsConfig, null), 'springs.0.installedHeight', '50.8', mm);
    expect((draft.springs as Record<string, NumberDraft>[])[0]?.installedHeight?.value).toBe(2);
    const low = resolve(springsConfig, type(springsConfig, draft, 'springs.0.installedHeight', '20', mm), mm);
    // The shared schema's 0.9 to 2.6 in is 22.86 to 66.04 mm.
    expect(low.errors?.['springs.0.installedHeight']).toBe('Installed height must be between 22.86 and 66.04 mm');
  });

  it('keeps degrees in degrees whatever the length unit', () => {
    const draft = type(degreeConfig, measureDraftFrom(degreeConfig, null), 'stopBefore', '20', mm);
    expect((draft.stopBefore as NumberDraft).value).toBe(20);
  });
});

describe('rows of readings', () => {
  it('checks a row as soon as it is added, and places the coil-bind rule on its field', () => {
    const one = measureDraftFrom(springsConfig, {
      springs: [{ where: '3E', installedHeight: 1.8, seatLoad: 110, rate: 300, coilBindHeight: 1.1, retainerToSeal: 0.6 }],
    });
    expect(resolve(springsConfig, one).errors).toBeNull();
    const two = { ...one, springs: [...(one.springs as unknown[]), rowDraft(springsConfig.groups![0]!.columns, {})] };
    expect(numberSpecs(springsConfig, two).map((s) => s.path)).toContain('springs.1.seatLoad');
    const errors = resolve(springsConfig, two).errors ?? {};
    expect(errors['springs.1.seatLoad']).toBe('Enter the seat load');
    expect(errors['springs.1.where']).toBe('Say which valve or head, e.g. "3E" or "left head"');
    const bound = type(springsConfig, one, 'springs.0.coilBindHeight', '1.9');
    expect(resolve(springsConfig, bound).errors).toEqual({ 'springs.0.coilBindHeight': 'Coil-bind height must be below the installed height' });
  });

  it('names every field the form shows, so a server message finds its field', () => {
    const draft = measureDraftFrom(ptvConfig, null);
    expect(knownPaths(ptvConfig, draft)).toEqual(
      expect.arrayContaining(['method', 'intake', 'exhaust', 'intake.0.crankAngle', 'intake.0.clearance', 'exhaust.0.valveLift']),
    );
  });
});

describe('draftNumber', () => {
  it('reads a typed number for the live read-outs, and nothing for a blank or a typo', () => {
    const stopBefore = numberSpecs(degreeConfig, {})[0]!;
    expect(draftNumber(draftFromText(stopBefore, '22', inches))).toBe(22);
    expect(draftNumber({ text: '', unit: '°', value: null })).toBeNull();
    expect(draftNumber({ text: '2x', unit: '°', value: Number.NaN })).toBeNull();
    expect(draftNumber(undefined)).toBeNull();
  });
});
