import { describe, expect, it } from 'vitest';

import { checkWornLobes } from '@/calc/checks';
import { tableMaxLifts } from '@/calc/measured';

import { analyzeLobes } from './lobe-analysis';

/** A symmetric lobe table peaking at `top` inches, in 10° steps: enough points for calc to analyse. */
const lobe = (id: string, top: number) => ({
  id,
  points: [-60, -50, -40, -30, -20, -10, 0, 10, 20, 30, 40, 50, 60].map((angle) => ({ angle: angle + 110, lift: Math.max(0, top * (1 - (angle / 60) ** 2)) })),
});

describe('analyzeLobes', () => {
  it('judges wear exactly as the fit checks do, a lobe whose table cannot be analysed included', () => {
    const lobes = [
      lobe('1I', 0.3),
      lobe('2I', 0.302),
      lobe('3I', 0.27),
      {
        id: '4I',
        points: [
          { angle: 100, lift: 0.299 },
          { angle: 110, lift: 0.299 },
        ],
      },
      lobe('1E', 0.29),
    ];
    const rows = analyzeLobes({ lobes } as never, 0.01);
    const fitChecks = checkWornLobes(tableMaxLifts(lobes), { wornLobe: { max: 0.01 } });
    for (const row of rows) {
      expect(row.wear, row.id).toEqual(fitChecks.result.lobes.find((w) => w.id === row.id) ?? null);
    }
    expect(rows.find((r) => r.id === '4I')!.analysis).toBeNull();
    expect(rows.find((r) => r.id === '4I')!.wear?.maxLift).toBe(0.299);
    expect(rows.filter((r) => r.wear?.worn).map((r) => r.id)).toEqual(['3I']);
    // The lone exhaust has nothing to compare with, on the screen as in the fit checks.
    expect(rows.find((r) => r.id === '1E')!.wear).toBeNull();
    expect(fitChecks.unjudged.map((u) => u.id)).toEqual(['1E']);
  });
});
