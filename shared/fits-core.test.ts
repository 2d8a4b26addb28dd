import { describe, expect, it } from 'vitest';

import { DEMO_ENGINE, DEMO_FEASIBILITY_INPUT, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { analyzeProfile } from '@/calc/analysis';

import { feasibilityResults } from './analysis';
import { coreView, flankOf, ownerCoreText, pushrodAdviceText } from './fits-core';
import { pushrodAdviceOf } from './job-core';

const from = { from: 'measured lobe table', missing: [] };
const towing = feasibilityResults(analyzeProfile(DEMO_FEASIBILITY_INPUT), from);
// The stock-spec regrind copies the core's lobes onto a 0.040 in smaller base circle: 0.020 in of metal everywhere on the lobe.
const stock = feasibilityResults(analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, profile: DEMO_STOCK_REGRIND }), from);

describe('the fits-the-core words', () => {
  it('says the towing profile cannot be ground from the demo core, where it stands outside, and that it needs a new core', () => {
    const view = coreView(towing);
    expect(view.verdict).toBe('fail');
    expect(view.fromOldCam).toBe('no');
    const worst = [towing.intake.envelope!, towing.exhaust.envelope!].reduce((a, b) => (a.minMargin < b.minMargin ? a : b));
    expect(view.tightest?.margin).toBe(worst.minMargin);
    expect(worst.minMargin).toBeLessThan(0);
    expect(view.headline).toContain(`${(-worst.minMargin).toFixed(3)} in outside the old one`);
    expect(view.headline).toContain(`${towing.cut!.toFixed(3)} in cut`);
    expect(view.headline).toMatch(/needs a new core/);
    expect(view.figures.find((f) => f.key === 'cleanup')?.value).toBe(`${towing.cleanup!.cleanupCut.toFixed(3)} in`);
    expect(view.figures.find((f) => f.key === 'largestLift')?.value).toBe(`${towing.cleanup!.largestLift.toFixed(3)} in`);
    expect(view.lifter).toContain(`preload falls to ${towing.lifter!.preloadLeft.toFixed(3)} in`);
    // Without the checking pushrod reading there is no pushrod length to give: it says what it lacks (issue 14, finding 5).
    expect(view.lifter).toContain('Pushrod length: record the checking pushrod at zero lash, the target preload and which cam it was read on.');
    expect(ownerCoreText(towing, 'Towing').answer).toBe('new-core');
  });

  it('says the stock-spec regrind fits, with its metal to spare, and tells the owner the old cam will do', () => {
    const view = coreView(stock);
    expect(view.verdict).toBe('pass');
    // Hand-worked: (1.240 − 1.200) / 2 = 0.020 in on the radius, the same lobe on both.
    expect(view.tightest?.margin).toBeCloseTo(0.02, 4);
    expect(view.headline).toMatch(/^Can be ground from the old cam at a 0\.040 in cut, with 0\.020 in of metal/);
    expect(ownerCoreText(stock, 'Stock').answer).toBe('old-cam');
  });

  it('says NOT RUN and names what is lacking, never a pass, when the core or its damage is not known', () => {
    const bare = feasibilityResults(analyzeProfile({ engine: DEMO_ENGINE, profile: DEMO_TOWING, grinding: {} }), {
      from: null,
      missing: ["upload the core's lobe table (CSV)"],
    });
    const view = coreView(bare);
    expect(view.verdict).toBe('not-run');
    expect(view.headline).toContain("upload the core's lobe table (CSV)");
    expect(ownerCoreText(bare, 'Towing').answer).toBe('unknown');
    expect(coreView(undefined).verdict).toBe('not-run');
    expect(coreView(undefined, ['record the stock base circle']).headline).toBe('Not worked out: record the stock base circle.');
  });

  it('names the flank from the cam angle (negative = before the nose)', () => {
    expect(flankOf(-14)).toBe('14° cam before the nose, opening flank');
    expect(flankOf(22)).toBe('22° cam after the nose, closing flank');
    expect(flankOf(1)).toBe('at the nose');
  });

  describe('the pushrod advice on "fits the core?"', () => {
    it('is the same advice, in the same words, as the fit checks give from the same readings', () => {
      const regrind = { ...DEMO_FEASIBILITY_INPUT.regrind!, pushrodCheck: { checkingLength: 7.352, targetPreload: 0.045, checkedOn: 'old-cam' as const } };
      const f = feasibilityResults(analyzeProfile({ ...DEMO_FEASIBILITY_INPUT, regrind }), from);
      const advice = f.lifter!.pushrod!;
      // By hand (geometry in calc/regrind.test.ts, from memory): base circle 1.240 → 1.200 in, so 7.352 + 0.020 + 0.045 = 7.417 in.
      expect(advice.length).toBeCloseTo(7.417, 12);
      const { advice: fromFitCheck } = pushrodAdviceOf(
        {
          checkingLength: 7.352,
          targetPreload: 0.045,
          checkedOn: 'old-cam',
          stockBaseCircle: 1.24,
          currentLength: 7.4,
          plungerTravel: 0.12,
          originalPreload: 0.045,
        },
        1.2,
      );
      expect(fromFitCheck?.length).toBeCloseTo(advice.length, 12);
      expect(coreView(f).lifter).toContain(pushrodAdviceText(advice));
    });
  });
});

describe('the plotted margins a revision keeps', () => {
  it('are calc’s margins to a millionth of an inch, with the minimum and its angle exactly as calc gave them', () => {
    const analysis = analyzeProfile(DEMO_FEASIBILITY_INPUT);
    const json = feasibilityResults(analysis, from);
    for (const side of ['intake', 'exhaust'] as const) {
      const calcEnvelope = analysis.feasibility[side].envelope!;
      const kept = json[side].envelope!;
      expect(kept.margin).toHaveLength(calcEnvelope.margin.length);
      kept.margin.forEach((m, i) => {
        expect(Math.abs(m - calcEnvelope.margin[i]!)).toBeLessThanOrEqual(5e-7);
        expect(String(m)).toMatch(/^-?\d+(\.\d{1,6})?$/);
      });
      expect(kept.minMargin).toBe(calcEnvelope.minMargin);
      expect(kept.minAt).toBe(calcEnvelope.minAt);
    }
  });
});
