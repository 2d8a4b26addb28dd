import { describe, expect, it } from 'vitest';

import { analyzeProfile } from '@/calc/analysis';
import { DEMO_FEASIBILITY_INPUT } from '@/calc/demo';
import { feasibilityResults } from '@/shared/analysis';

import { buildMarginPaths, MARGIN_WINDOW } from './margin-plot-paths';

const f = feasibilityResults(analyzeProfile(DEMO_FEASIBILITY_INPUT), { from: 'table', missing: [] });
const frame = { width: 600, height: 220, padding: { top: 10, right: 10, bottom: 30, left: 50 } };

describe('margin plot paths', () => {
  it('draws both lobes over the window and marks each tightest point where calc put it', () => {
    const p = buildMarginPaths(f, frame);
    expect(p.intake).toMatch(/^M/);
    expect(p.exhaust).toMatch(/^M/);
    expect(p.marks.map((m) => m.lobe)).toEqual(['intake', 'exhaust']);
    const intake = p.marks[0]!;
    expect(intake.at).toBe(f.intake.envelope!.minAt);
    expect(intake.margin).toBe(f.intake.envelope!.minMargin);
    expect(intake.px).toBeCloseTo(p.x(f.intake.envelope!.minAt), 9);
    expect(intake.py).toBeCloseTo(p.y(f.intake.envelope!.minMargin), 9);
  });

  it('keeps zero, the finishing stock and every margin in the window inside the plot', () => {
    const p = buildMarginPaths(f, frame);
    const inWindow = f.intake.envelope!.margin.filter((_, i) => {
      const deg = f.intake.envelope!.start + i * f.intake.envelope!.step;
      return deg >= MARGIN_WINDOW.from && deg <= MARGIN_WINDOW.to;
    });
    for (const v of [0, f.limits.finishingStock.min, ...inWindow]) {
      expect(v).toBeGreaterThanOrEqual(p.yMin);
      expect(v).toBeLessThanOrEqual(p.yMax);
    }
    expect(p.x(MARGIN_WINDOW.from)).toBe(frame.padding.left);
    expect(p.x(MARGIN_WINDOW.to)).toBe(frame.width - frame.padding.right);
  });

  it('draws nothing for a lobe without an envelope', () => {
    const p = buildMarginPaths({ ...f, exhaust: { ...f.exhaust, envelope: null } }, frame);
    expect(p.exhaust).toBeNull();
    expect(p.marks.map((m) => m.lobe)).toEqual(['intake']);
  });
});
