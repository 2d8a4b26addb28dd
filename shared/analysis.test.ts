import { describe, expect, it } from 'vitest';

import { DEMO_ENGINE, DEMO_TOWING } from '@/calc/demo';

import { analyzeRecords, revisionResults, toAnalysisInput } from './analysis';
import { engineSchema } from './engine';
import { profileSpecSchema } from './profile';

const engine = engineSchema.parse({ ...DEMO_ENGINE, firingOrder: '1-8-4-3-6-5-7-2' });
const spec = profileSpecSchema.parse(DEMO_TOWING);

describe('records to calc', () => {
  it('drops the firing order and a null base circle, keeps everything else', () => {
    const input = toAnalysisInput(engine, { ...spec, baseCircle: null });
    expect(input.engine).not.toHaveProperty('firingOrder');
    expect(input.profile).not.toHaveProperty('baseCircle');
    expect(input.engine.bore).toBe(DEMO_ENGINE.bore);
    expect(toAnalysisInput(engine, spec).profile.baseCircle).toBe(DEMO_TOWING.baseCircle);
  });

  it('keeps the 0.050 in events a revision shows', () => {
    const results = revisionResults(analyzeRecords(engine, spec));
    // Hand-worked (common practice, no source for the convention): ICL 108, LSA 112, 212°/220° at 0.050 in.
    // IVO = 212/2 - 108 = -2 (after TDC); IVC = 212/2 + 108 - 180 = 34; ECL = 2·112 - 108 = 116;
    // EVO = 220/2 + 116 - 180 = 46; EVC = 220/2 - 116 = -6; overlap = IVO + EVC = -8.
    expect(results.events050.ivoBtdc).toBeCloseTo(-2, 9);
    expect(results.events050.ivcAbdc).toBeCloseTo(34, 9);
    expect(results.events050.ecl).toBeCloseTo(116, 9);
    expect(results.events050.evoBbdc).toBeCloseTo(46, 9);
    expect(results.events050.evcAtdc).toBeCloseTo(-6, 9);
    expect(results.events050.overlap).toBeCloseTo(-8, 9);
    // Valve lift = lobe lift × rocker ratio (hydraulic, no lash): 0.333 × 1.6 = 0.5328 in.
    expect(results.valveLift.intake).toBeCloseTo(0.5328, 9);
    expect(JSON.parse(JSON.stringify(results))).toEqual(results);
  });
});
