import { describe, expect, it } from 'vitest';

import { centsFromText } from '@/lib/number-draft';

import { formatCents, quoteSentence } from './format';

describe('money', () => {
  it('reads what people type as whole cents, and nothing that is not an amount', () => {
    expect(centsFromText('485')).toBe(48_500);
    expect(centsFromText('$1,050.50')).toBe(105_050);
    expect(centsFromText(' 0.07 ')).toBe(7);
    // 0.29 × 100 is 28.999999999999996 in binary floating point; the cents must still be 29.
    expect(centsFromText('0.29')).toBe(29);
    for (const text of ['', 'abc', '-5', '4.555', '1e3', '12.']) expect(centsFromText(text), text).toBeNaN();
  });

  it('writes cents as the currency people read, the same in mail and on screen', () => {
    // The en-US currency format of the ECMAScript Internationalization API (ECMA-402): symbol, grouping, two decimals.
    expect(formatCents(48_500)).toBe('$485.00');
    expect(formatCents(105_050, 'usd')).toBe('$1,050.50');
    expect(formatCents(2_250, 'eur')).toBe('€22.50');
  });
});

describe('quoteSentence', () => {
  it('says the price and the lead time, with one day in the singular', () => {
    expect(quoteSentence({ priceCents: 48_500, leadTimeDays: 8 })).toBe('Quote $485.00, ready in 8 days');
    expect(quoteSentence({ priceCents: 105_050, leadTimeDays: 1 })).toBe('Quote $1,050.50, ready in 1 day');
  });
});
