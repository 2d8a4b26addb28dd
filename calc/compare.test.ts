import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeProfile } from './analysis';
import { compareProfilesForOwner, OWNER_CAUTIONS } from './compare';
import { DEMO_ANALYSIS_INPUT, DEMO_STOCK_REGRIND, DEMO_TOWING } from './demo';

// No promises of power, economy or mileage (product rule); hedged wording only.
const FORBIDDEN = /horsepower|\bhp\b|torque gain|\bmpg\b|mileage|economy|guarantee|will (gain|make|increase|improve)|more power/i;

const stock = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, profile: DEMO_STOCK_REGRIND });
const towing = analyzeProfile(DEMO_ANALYSIS_INPUT);

describe('compareProfilesForOwner (demo data, invented)', () => {
  const c = compareProfilesForOwner({ current: stock, candidate: towing, currentName: 'stock-spec regrind', candidateName: 'towing' });

  it('is built from the computed differences', () => {
    // Hand-worked from the demo sheets: intake 212 − 204 = 8°, exhaust 220 − 210 = 10°;
    // valve lift (0.333 − 0.305) × 1.6 = 0.0448 in intake; overlap at 0.050:
    // towing (212+220)/2 − 224 = −8, stock (204+210)/2 − 228 = −21 → +13°; ICL 108 − 110 = −2.
    expect(c.differences.intakeDuration050).toBe(8);
    expect(c.differences.exhaustDuration050).toBe(10);
    expect(c.differences.intakeValveLift).toBeCloseTo(0.0448, 12);
    expect(c.differences.overlap050).toBeCloseTo(13, 12);
    expect(c.differences.icl).toBe(-2);
    const text = c.points.map((p) => p.text).join(' ');
    expect(text).toContain('intake valve open about 8° longer');
    expect(text).toContain('exhaust valve about 10° longer');
    expect(text).toContain('0.045 in');
    expect(text).toContain('13° more');
    expect(text).toContain('2° earlier (advanced)');
    expect(c.headline).toMatch(/towing cam is a little larger than the stock-spec regrind/);
  });

  it('hedges, makes no power or mileage promise, and carries the cautions', () => {
    const all = [c.headline, ...c.points.map((p) => p.text), ...c.cautions].join(' ');
    expect(all).not.toMatch(FORBIDDEN);
    expect(all).toMatch(/tends to|can|may/);
    expect(c.cautions).toEqual([...OWNER_CAUTIONS]);
  });

  it('reads the other way round when the candidate is milder', () => {
    const back = compareProfilesForOwner({ current: towing, candidate: stock });
    expect(back.headline).toMatch(/milder/);
    expect(back.points.map((p) => p.text).join(' ')).toContain('intake valve open about 8° shorter');
  });

  it('says "about the same" for identical profiles', () => {
    const same = compareProfilesForOwner({ current: towing, candidate: towing });
    expect(same.headline).toMatch(/very close/);
    expect(same.points[0]?.text).toMatch(/about the same time/);
  });

  it('mentions checks still to be measured', () => {
    const noBaseline = analyzeProfile({ ...DEMO_ANALYSIS_INPUT, ptvBaseline: undefined });
    const r = compareProfilesForOwner({ current: stock, candidate: noBaseline });
    expect(r.points.find((p) => p.topic === 'fit')?.text).toMatch(
      /Still to be measured on the engine: intake valve clearance to the piston and exhaust valve clearance to the piston/,
    );
  });

  it('property: the direction words follow the sign of the duration change', () => {
    fc.assert(
      fc.property(fc.integer({ min: -20, max: 20 }), (delta) => {
        const other = analyzeProfile({
          ...DEMO_ANALYSIS_INPUT,
          profile: {
            ...DEMO_TOWING,
            intake: { ...DEMO_TOWING.intake, duration050: 212 + delta, advertisedDuration: 270 + delta },
          },
        });
        const r = compareProfilesForOwner({ current: towing, candidate: other });
        const text = r.points.map((p) => p.text).join(' ');
        expect(text).not.toMatch(FORBIDDEN);
        if (delta >= 1) expect(text).toContain(`intake valve open about ${delta}° longer`);
        else if (delta <= -1) expect(text).toContain(`intake valve open about ${-delta}° shorter`);
        else expect(text).not.toMatch(/intake valve open about/);
      }),
      { numRuns: 25 },
    );
  });
});
