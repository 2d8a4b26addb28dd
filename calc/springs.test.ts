import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { helicalSpringRate, retainerToSealMargin, springCheck } from './springs';

describe('springCheck', () => {
  it('matches a hand-worked spring through its free length', () => {
    // Hooke's law F = k·y (Shigley's Mechanical Engineering Design, ch. 10 — from memory).
    // Worked via free length rather than the seat-plus-rate shortcut:
    // free length = 1.800 + 130/350 = 2.171429 in; open height = 1.800 − 0.550 = 1.250 in;
    // deflection at open = 2.171429 − 1.250 = 0.921429 in; load = 350 × 0.921429 = 322.5 lbf.
    // Coil-bind margin = 1.250 − 1.100 = 0.150 in.
    const r = springCheck({ seatLoad: 130, rate: 350, installedHeight: 1.8, coilBindHeight: 1.1, valveLift: 0.55 });
    expect(r.openHeight).toBeCloseTo(1.25, 12);
    expect(r.openLoad).toBeCloseTo(322.5, 9);
    expect(r.coilBindMargin).toBeCloseTo(0.15, 12);
  });

  it('property: load is proportional to deflection from the free length', () => {
    // Hooke's law, checked through free length (an independent route from seat load + rate × lift).
    fc.assert(
      fc.property(
        fc.double({ min: 60, max: 200, noNaN: true }),
        fc.double({ min: 150, max: 600, noNaN: true }),
        fc.double({ min: 0.2, max: 0.65, noNaN: true }),
        (seat, rate, lift) => {
          const r = springCheck({ seatLoad: seat, rate, installedHeight: 1.8, coilBindHeight: 1.05, valveLift: lift });
          const free = 1.8 + seat / rate;
          expect(r.openLoad).toBeCloseTo(rate * (free - r.openHeight), 8);
        },
      ),
    );
  });

  it('returns a negative margin when the spring would go solid', () => {
    const r = springCheck({ seatLoad: 130, rate: 350, installedHeight: 1.7, coilBindHeight: 1.2, valveLift: 0.55 });
    expect(r.coilBindMargin).toBeCloseTo(-0.05, 12);
  });

  it('rejects impossible springs', () => {
    const ok = { seatLoad: 130, rate: 350, installedHeight: 1.8, coilBindHeight: 1.1, valveLift: 0.55 };
    expect(() => springCheck({ ...ok, rate: 0 })).toThrow(/rate/);
    expect(() => springCheck({ ...ok, coilBindHeight: 1.9 })).toThrow(/coilBindHeight/);
    expect(() => springCheck({ ...ok, valveLift: 2 })).toThrow(/valveLift/);
    expect(() => springCheck({ ...ok, seatLoad: -5 })).toThrow(/seatLoad/);
    expect(() => springCheck({ ...ok, installedHeight: Number.NaN })).toThrow(CalcInputError);
  });
});

describe('retainerToSealMargin', () => {
  it('takes the lift off the installed clearance (hand-worked)', () => {
    // Hand-worked: 0.650 in installed clearance − 0.544 in lift = 0.106 in left at max lift.
    expect(retainerToSealMargin({ retainerToSeal: 0.65, valveLift: 0.544 }).clearanceAtMaxLift).toBeCloseTo(0.106, 12);
  });

  it('rejects non-positive and non-finite inputs', () => {
    expect(() => retainerToSealMargin({ retainerToSeal: 0, valveLift: 0.5 })).toThrow(/retainerToSeal/);
    expect(() => retainerToSealMargin({ retainerToSeal: 0.6, valveLift: Infinity })).toThrow(/valveLift/);
  });
});

describe('helicalSpringRate', () => {
  it('matches a hand-worked Shigley rate', () => {
    // Shigley's Mechanical Engineering Design, ch. 10, k = d⁴G / (8D³N) (from memory).
    // Hand-worked: d = 0.192 in → d⁴ = 0.00135895; × 11.5e6 = 15627.97;
    // 8 × 1.1³ × 5 = 53.24; k = 15627.97 / 53.24 = 293.54 lbf/in.
    expect(helicalSpringRate({ wireDiameter: 0.192, meanCoilDiameter: 1.1, activeCoils: 5 })).toBeCloseTo(293.54, 2);
  });

  it('property: halving the active coils doubles the rate (springs in series)', () => {
    // Series springs: 1/k = 1/k₁ + 1/k₂, so one spring of N coils is two of N/2 in series.
    fc.assert(
      fc.property(fc.double({ min: 2, max: 10, noNaN: true }), (n) => {
        const whole = helicalSpringRate({ wireDiameter: 0.18, meanCoilDiameter: 1.05, activeCoils: n });
        const half = helicalSpringRate({ wireDiameter: 0.18, meanCoilDiameter: 1.05, activeCoils: n / 2 });
        expect(1 / (1 / half + 1 / half)).toBeCloseTo(whole, 8);
      }),
    );
  });

  it('rejects a coil smaller than its wire', () => {
    expect(() => helicalSpringRate({ wireDiameter: 0.2, meanCoilDiameter: 0.15, activeCoils: 5 })).toThrow(/meanCoilDiameter/);
  });
});
