import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from './errors';
import { timingFromEvents, valveEvents, valveLift } from './events';

const duration = fc.double({ min: 150, max: 320, noNaN: true });
const lsa = fc.double({ min: 100, max: 122, noNaN: true });
const icl = fc.double({ min: 95, max: 125, noNaN: true });

describe('valveEvents', () => {
  it('matches a hand-worked timing diagram (equal durations)', () => {
    // Hand-worked on a 720° timing circle (common practice of reading a cam card, no source):
    // intake 224° centred 108° ATDC opens at 108 − 112 = −4° (4° BTDC) and closes at
    // 108 + 112 = 220° = 40° ABDC. The exhaust centre is 2·112 − 108 = 116° BTDC, so it opens
    // at −116 − 112 = −228° (48° before BDC at −180°) and closes at −116 + 112 = −4° (4° BTDC,
    // i.e. −4° ATDC). Overlap = 4 + (−4) = 0. Advance = 112 − 108 = 4°.
    const e = valveEvents({ intakeDuration: 224, exhaustDuration: 224, lsa: 112, icl: 108 });
    expect(e.ivoBtdc).toBeCloseTo(4, 12);
    expect(e.ivcAbdc).toBeCloseTo(40, 12);
    expect(e.ecl).toBeCloseTo(116, 12);
    expect(e.evoBbdc).toBeCloseTo(48, 12);
    expect(e.evcAtdc).toBeCloseTo(-4, 12);
    expect(e.overlap).toBeCloseTo(0, 12);
    expect(e.advance).toBeCloseTo(4, 12);
  });

  it('matches a hand-worked split-duration example', () => {
    // Hand-worked: intake 276° adv., exhaust 284°, LSA 110, ICL 106.
    // Intake: opens 106 − 138 = −32° → 32° BTDC; closes 106 + 138 = 244° → 64° ABDC.
    // Exhaust centre 220 − 106 = 114° BTDC; opens −114 − 142 = −256° → 76° BBDC;
    // closes −114 + 142 = 28° ATDC. Overlap 32 + 28 = 60°. Advance 4°.
    const e = valveEvents({ intakeDuration: 276, exhaustDuration: 284, lsa: 110, icl: 106 });
    expect(e.ivoBtdc).toBeCloseTo(32, 12);
    expect(e.ivcAbdc).toBeCloseTo(64, 12);
    expect(e.evoBbdc).toBeCloseTo(76, 12);
    expect(e.evcAtdc).toBeCloseTo(28, 12);
    expect(e.overlap).toBeCloseTo(60, 12);
    expect(e.advance).toBeCloseTo(4, 12);
  });

  it('property: overlap = IVO + EVC = (Di + De)/2 − 2·LSA', () => {
    // Identity of the timing circle (the trade's overlap rule; derived in the hand-worked cases above).
    fc.assert(
      fc.property(duration, duration, lsa, icl, (di, de, l, c) => {
        const e = valveEvents({ intakeDuration: di, exhaustDuration: de, lsa: l, icl: c });
        expect(e.overlap).toBeCloseTo(e.ivoBtdc + e.evcAtdc, 9);
        expect(e.overlap).toBeCloseTo((di + de) / 2 - 2 * l, 9);
      }),
    );
  });

  it('property: each event pair spans its duration (opening + 180 + closing)', () => {
    // Geometry of the timing circle: intake runs from IVO before TDC through the whole
    // 180° stroke to IVC after BDC; exhaust from EVO before BDC to EVC after TDC.
    fc.assert(
      fc.property(duration, duration, lsa, icl, (di, de, l, c) => {
        const e = valveEvents({ intakeDuration: di, exhaustDuration: de, lsa: l, icl: c });
        expect(e.ivoBtdc + 180 + e.ivcAbdc).toBeCloseTo(di, 9);
        expect(e.evoBbdc + 180 + e.evcAtdc).toBeCloseTo(de, 9);
        expect((e.ecl + c) / 2).toBeCloseTo(l, 9);
      }),
    );
  });

  it('property: events round-trip to durations, centrelines and LSA', () => {
    fc.assert(
      fc.property(duration, duration, lsa, icl, (di, de, l, c) => {
        const e = valveEvents({ intakeDuration: di, exhaustDuration: de, lsa: l, icl: c });
        const t = timingFromEvents(e);
        expect(t.intakeDuration).toBeCloseTo(di, 9);
        expect(t.exhaustDuration).toBeCloseTo(de, 9);
        expect(t.icl).toBeCloseTo(c, 9);
        expect(t.ecl).toBeCloseTo(e.ecl, 9);
        expect(t.lsa).toBeCloseTo(l, 9);
      }),
    );
  });

  it('property: advancing the cam opens and closes the intake earlier by the same amount', () => {
    fc.assert(
      fc.property(duration, lsa, icl, fc.double({ min: 0.5, max: 8, noNaN: true }), (d, l, c, shift) => {
        const a = valveEvents({ intakeDuration: d, exhaustDuration: d, lsa: l, icl: c });
        const b = valveEvents({ intakeDuration: d, exhaustDuration: d, lsa: l, icl: c - shift });
        expect(b.ivoBtdc - a.ivoBtdc).toBeCloseTo(shift, 9);
        expect(a.ivcAbdc - b.ivcAbdc).toBeCloseTo(shift, 9);
        expect(b.advance - a.advance).toBeCloseTo(shift, 9);
      }),
    );
  });

  it('rejects impossible and non-finite inputs naming the field', () => {
    const ok = { intakeDuration: 220, exhaustDuration: 226, lsa: 112, icl: 108 };
    const bad: [Partial<typeof ok>, string][] = [
      [{ intakeDuration: 0 }, 'intakeDuration'],
      [{ intakeDuration: 361 }, 'intakeDuration'],
      [{ exhaustDuration: Number.NaN }, 'exhaustDuration'],
      [{ lsa: Number.POSITIVE_INFINITY }, 'lsa'],
      [{ lsa: -110 }, 'lsa'],
      [{ icl: 200 }, 'icl'],
    ];
    for (const [patch, field] of bad) {
      try {
        valveEvents({ ...ok, ...patch });
        expect.unreachable(`expected ${field} to be rejected`);
      } catch (error) {
        expect(error).toBeInstanceOf(CalcInputError);
        expect((error as CalcInputError).field).toBe(field);
      }
    }
  });

  it('property: rejects any non-finite or out-of-range duration', () => {
    fc.assert(
      fc.property(fc.oneof(fc.constantFrom(Number.NaN, Infinity, -Infinity, 0), fc.double({ min: 360, max: 1e6 }), fc.double({ min: -1e6, max: 0 })), (d) => {
        expect(() => valveEvents({ intakeDuration: d, exhaustDuration: 220, lsa: 110, icl: 106 })).toThrow(CalcInputError);
      }),
    );
  });
});

describe('valveLift', () => {
  it('multiplies by the rocker ratio and takes off lash (hand-worked)', () => {
    // Hand-worked: 0.3400 in lobe × 1.6 = 0.5440 in gross; hydraulic, no lash → 0.5440 in.
    expect(valveLift({ lobeLift: 0.34, rockerRatio: 1.6, lash: 0 })).toBeCloseTo(0.544, 12);
    // Solid lifter: 0.3300 × 1.5 = 0.4950 gross, less 0.016 lash at the valve = 0.4790 in.
    expect(valveLift({ lobeLift: 0.33, rockerRatio: 1.5, lash: 0.016 })).toBeCloseTo(0.479, 12);
  });

  it('rejects impossible inputs', () => {
    expect(() => valveLift({ lobeLift: -0.3, rockerRatio: 1.6, lash: 0 })).toThrow(/lobeLift/);
    expect(() => valveLift({ lobeLift: 0.3, rockerRatio: 0, lash: 0 })).toThrow(/rockerRatio/);
    expect(() => valveLift({ lobeLift: 0.3, rockerRatio: 1.5, lash: -0.01 })).toThrow(/lash/);
    expect(() => valveLift({ lobeLift: 0.01, rockerRatio: 1.5, lash: 0.02 })).toThrow(/lash/);
    expect(() => valveLift({ lobeLift: Number.NaN, rockerRatio: 1.5, lash: 0 })).toThrow(CalcInputError);
  });
});
