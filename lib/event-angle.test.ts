import { describe, expect, it } from 'vitest';

import { eventAngle } from './event-angle';

describe('event angles in words', () => {
  it('puts a negative figure on the other side of its dead centre', () => {
    // Opening before TDC is positive BTDC; a valve that opens 16° after TDC is "16° ATDC", not "−16° BTDC"
    // (common practice on cam cards, no source).
    expect(eventAngle(-16, 'BTDC')).toBe('16.0° ATDC');
    expect(eventAngle(-4.25, 'ATDC', 2)).toBe('4.25° BTDC');
    expect(eventAngle(-2, 'BBDC')).toBe('2.0° ABDC');
    expect(eventAngle(-30, 'ABDC')).toBe('30.0° BBDC');
  });

  it('keeps a positive figure, and zero at the shown precision, on its own side', () => {
    expect(eventAngle(36, 'ABDC')).toBe('36.0° ABDC');
    expect(eventAngle(-0.04, 'BTDC')).toBe('0.0° BTDC');
    expect(eventAngle(0, 'ATDC')).toBe('0.0° ATDC');
  });

  it('never shows a minus sign', () => {
    for (const v of [-720, -90.5, -0.05, 0.05, 12, 300])
      for (const side of ['BTDC', 'ATDC', 'BBDC', 'ABDC'] as const) expect(eventAngle(v, side)).not.toMatch(/[-−]/);
  });
});
