import { describe, expect, it } from 'vitest';

import { analyzeProfile } from '@/calc/analysis';
import { DEMO_ENGINE, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';

import { cellText, compareRows, delta, formatValue } from '@/lib/compare-rows';

const stock = analyzeProfile({ engine: DEMO_ENGINE, profile: DEMO_STOCK_REGRIND });
const towing = analyzeProfile({ engine: DEMO_ENGINE, profile: DEMO_TOWING });
const row = (key: string) => {
  const found = compareRows.find((r) => r.key === key);
  if (!found) throw new Error(`no row ${key}`);
  return found;
};

describe('comparison rows', () => {
  it('reads overlap at 0.050 in as (Di + De)/2 − 2·LSA for each demo profile', () => {
    // Overlap identity (common practice, no source): stock (204 + 210)/2 − 2·114 = −21; towing (212 + 220)/2 − 2·112 = −8.
    expect(row('at050.overlap').value(stock)).toBeCloseTo(-21, 9);
    expect(row('at050.overlap').value(towing)).toBeCloseTo(-8, 9);
    expect(delta(row('at050.overlap').value(stock), row('at050.overlap').value(towing), 1)).toEqual({ text: '+13.0', trend: 'up' });
  });

  it('reads advance as LSA − ICL', () => {
    // Stock: 114 − 110 = 4; towing: 112 − 108 = 4 (hand-worked).
    expect(row('advance').value(stock)).toBeCloseTo(4, 9);
    expect(delta(row('advance').value(stock), row('advance').value(towing), 1)).toEqual({ text: 'same', trend: 'same' });
  });

  it('gives every row a finite value', () => {
    for (const r of compareRows) expect(Number.isFinite(r.value(towing)), r.key).toBe(true);
    expect(new Set(compareRows.map((r) => r.key)).size).toBe(compareRows.length);
  });

  it('formats negative values with a minus sign and rounds tiny deltas to "same"', () => {
    expect(formatValue(-8, 1)).toBe('−8.0');
    expect(formatValue(-0.0001, 2)).toBe('0.00');
    expect(delta(0.5, 0.5004, 3)).toEqual({ text: 'same', trend: 'same' });
    expect(delta(0.5, 0.47, 3)).toEqual({ text: '−0.030', trend: 'down' });
  });

  it('shows each valve event on its side of the dead centre, never as a negative figure', () => {
    // Stock intake at 0.050 in: opens D/2 − ICL = 102 − 110 = −8° BTDC, that is 8° after TDC; closes
    // D/2 + ICL − 180 = 102 + 110 − 180 = 32° ABDC (event identities, common practice, no source).
    expect(row('at050.ivo').value(stock)).toBeCloseTo(-8, 9);
    expect(cellText(row('at050.ivo'), stock)).toBe('8.0° ATDC');
    expect(cellText(row('at050.ivc'), stock)).toBe('32.0° ABDC');
    expect(cellText(row('icl'), stock)).toBe('110.0° ATDC');
    for (const r of compareRows.filter((x) => x.side)) expect(cellText(r, stock), r.key).not.toMatch(/[-−]/);
    // Other rows stay plain numbers with their sign.
    expect(cellText(row('at050.overlap'), stock)).toBe('−21.0');
  });
});
