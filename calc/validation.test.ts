import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CalcInputError,
  centerlineFromReadings,
  degreeCam,
  displacement,
  dynamicCompression,
  helicalSpringRate,
  isCalcInputError,
  pistonDepth,
  preloadAfterRegrind,
  pushrodChangeForRegrind,
  retainerToSealMargin,
  springCheck,
  staticCompression,
  sweptVolume,
  synthesizeLiftCurve,
  synthesizeLobe,
  timingFromEvents,
  valveEvents,
  valveLift,
  analyzeLiftTable,
  analyzeProfile,
  checkDegreeing,
  compareProfilesForOwner,
  findWornLobes,
  lifterSideOfCut,
  liftCurveFromTable,
  pistonCurve,
  pistonMotion,
  pitchCurvature,
  pressureAngle,
  ptvSweep,
  regrindCleanup,
  regrindEnvelope,
  resolveCheckLimits,
} from './index';

type Fn = (input: Record<string, number>) => unknown;

// One valid call per public function that takes an object of numbers (demo-like values).
const cases: [string, Fn, Record<string, number>][] = [
  ['valveEvents', (i) => valveEvents(i as never), { intakeDuration: 212, exhaustDuration: 220, lsa: 112, icl: 108 }],
  ['timingFromEvents', (i) => timingFromEvents(i as never), { ivoBtdc: 2, ivcAbdc: 34, evoBbdc: 46, evcAtdc: -6 }],
  ['valveLift', (i) => valveLift(i as never), { lobeLift: 0.333, rockerRatio: 1.6, lash: 0 }],
  ['pistonDepth', (i) => pistonDepth(i as never), { stroke: 3.6, rodLength: 6, crankAngle: 30 }],
  ['sweptVolume', (i) => sweptVolume(i as never), { bore: 4.03, stroke: 3.6 }],
  ['displacement', (i) => displacement(i as never), { bore: 4.03, stroke: 3.6, cylinders: 8 }],
  [
    'staticCompression',
    (i) => staticCompression(i as never),
    { bore: 4.03, stroke: 3.6, chamberCc: 68, gasketBore: 4.1, gasketThickness: 0.04, deckClearance: 0.01, pistonCc: 5 },
  ],
  [
    'dynamicCompression',
    (i) => dynamicCompression(i as never),
    { bore: 4.03, stroke: 3.6, chamberCc: 68, gasketBore: 4.1, gasketThickness: 0.04, deckClearance: 0.01, pistonCc: 5, rodLength: 6, ivcAbdc: 60 },
  ],
  ['springCheck', (i) => springCheck(i as never), { seatLoad: 115, rate: 320, installedHeight: 1.8, coilBindHeight: 1.15, valveLift: 0.53 }],
  ['retainerToSealMargin', (i) => retainerToSealMargin(i as never), { retainerToSeal: 0.64, valveLift: 0.53 }],
  ['helicalSpringRate', (i) => helicalSpringRate(i as never), { wireDiameter: 0.19, meanCoilDiameter: 1.1, activeCoils: 5 }],
  ['centerlineFromReadings', (i) => centerlineFromReadings(i as never), { openingAngle: 84, closingAngle: 130 }],
  ['degreeCam', (i) => degreeCam(i as never), { openingAngle: 84, closingAngle: 130, sheetIcl: 106 }],
  ['pushrodChangeForRegrind', (i) => pushrodChangeForRegrind(i as never), { baseCircleReduction: 0.04 }],
  ['preloadAfterRegrind', (i) => preloadAfterRegrind(i as never), { originalPreload: 0.045, stockBaseCircle: 1.24, regrindBaseCircle: 1.2 }],
  ['synthesizeLobe', (i) => synthesizeLobe(i as never), { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333 }],
  [
    'synthesizeLiftCurve',
    (i) => synthesizeLiftCurve(i as never),
    { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333, centerline: 108, rockerRatio: 1.6, lash: 0 },
  ],
];

describe('every public function rejects bad numbers', () => {
  it('accepts each valid example', () => {
    for (const [, fn, ok] of cases) expect(() => fn(ok)).not.toThrow();
  });

  it('property: NaN or ±Infinity in any field throws a CalcInputError naming that field', () => {
    const pick = fc
      .constantFrom(...cases)
      .chain(([name, fn, ok]) =>
        fc.tuple(fc.constant(name), fc.constant(fn), fc.constant(ok), fc.constantFrom(...Object.keys(ok)), fc.constantFrom(Number.NaN, Infinity, -Infinity)),
      );
    fc.assert(
      fc.property(pick, ([name, fn, ok, field, bad]) => {
        let thrown: unknown = null;
        try {
          fn({ ...ok, [field]: bad });
        } catch (error) {
          thrown = error;
        }
        expect(thrown, `${name}.${field} = ${bad}`).toBeInstanceOf(CalcInputError);
        expect(isCalcInputError(thrown)).toBe(true);
        expect((thrown as CalcInputError).field).toBe(field);
        expect((thrown as CalcInputError).message).toMatch(/finite number/);
      }),
      { numRuns: 300 },
    );
  });

  it('property: a negative size (bore, stroke, rod, rate, lift) is rejected', () => {
    const sizes: [string, Fn, Record<string, number>, string][] = [];
    for (const [name, fn, ok] of cases) {
      for (const field of ['bore', 'stroke', 'rodLength', 'rate', 'lobeLift', 'wireDiameter', 'installedHeight', 'chamberCc']) {
        if (field in ok) sizes.push([name, fn, ok, field]);
      }
    }
    fc.assert(
      fc.property(fc.constantFrom(...sizes), fc.double({ min: -100, max: 0, noNaN: true }), ([, fn, ok, field], v) => {
        expect(() => fn({ ...ok, [field]: v })).toThrow(CalcInputError);
      }),
    );
  });
});

// Every public function that takes an object argument.
const objectTaking: [string, (input: unknown) => unknown][] = [
  ...cases.map(([name, fn]) => [name, (i: unknown) => fn(i as never)] as [string, (input: unknown) => unknown]),
  ['pistonMotion', (i) => pistonMotion(i as never)],
  ['pistonCurve', (i) => pistonCurve(i as never)],
  ['analyzeProfile', (i) => analyzeProfile(i as never)],
  ['analyzeLiftTable', (i) => analyzeLiftTable(i as never)],
  ['liftCurveFromTable', (i) => liftCurveFromTable(i as never)],
  ['findWornLobes', (i) => findWornLobes(i as never)],
  ['ptvSweep', (i) => ptvSweep(i as never)],
  ['checkDegreeing', (i) => checkDegreeing(i as never)],
  ['compareProfilesForOwner', (i) => compareProfilesForOwner(i as never)],
  ['pressureAngle', (i) => pressureAngle(i as never)],
  ['pitchCurvature', (i) => pitchCurvature(i as never)],
  ['regrindEnvelope', (i) => regrindEnvelope(i as never)],
  ['regrindCleanup', (i) => regrindCleanup(i as never)],
  ['lifterSideOfCut', (i) => lifterSideOfCut(i as never)],
];

describe('finding 5 (regression): bad arguments are CalcInputErrors', () => {
  it('missing or non-object arguments throw a CalcInputError, never a TypeError', () => {
    // The old functions read fields off undefined and threw TypeError.
    for (const [name, fn] of objectTaking) {
      for (const bad of [undefined, null, 42, 'text', [1, 2]]) {
        let thrown: unknown = null;
        try {
          fn(bad);
        } catch (error) {
          thrown = error;
        }
        expect(thrown, `${name}(${JSON.stringify(bad)})`).toBeInstanceOf(CalcInputError);
      }
    }
    expect(() => resolveCheckLimits('tight' as never)).toThrow(CalcInputError);
  });

  it('huge inputs are refused naming the field instead of coming back as Infinity or NaN', () => {
    // The old displacement answered Infinity for a 1e200 in bore.
    expect(() => displacement({ bore: 1e200, stroke: 3.6, cylinders: 8 })).toThrow(/^bore: is too large/);
    expect(() => sweptVolume({ bore: 4, stroke: 1e300 })).toThrow(/^stroke/);
    expect(() => springCheck({ seatLoad: 1e308, rate: 320, installedHeight: 1.8, coilBindHeight: 1.15, valveLift: 0.5 })).toThrow(/^seatLoad/);
    fc.assert(
      fc.property(fc.constantFrom(...cases), fc.double({ min: 1e9 * 1.0001, max: 1e308, noNaN: true }), ([, fn, ok], big) => {
        for (const field of Object.keys(ok)) {
          let result: unknown;
          try {
            result = fn({ ...ok, [field]: big });
          } catch (error) {
            expect(error).toBeInstanceOf(CalcInputError);
            continue;
          }
          expect(JSON.stringify(result)).not.toMatch(/null|NaN|Infinity/);
        }
      }),
      { numRuns: 30 },
    );
  });
});
