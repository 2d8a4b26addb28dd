import { describe, expect, it } from 'vitest';

import { draftFromText, resolveDrafts } from '@/lib/number-draft';
import { blankMove, moveFieldPaths, moveRules, quoteNumberSpecs, type MoveDraft } from '@/lib/order-move-fields';
import { orderMoveSchema, type OrderStage } from '@/shared/orders';
import { calcUnits } from '@/state/units';

// Sources: the move rules are Lobewright's own (shared/orders' orderMoves; common practice, no source).

/** What the form's resolver does on submit: the move's own numbers, record and schema, in the units the form uses. */
function resolve(to: OrderStage, draft: MoveDraft) {
  const rules = moveRules(7, to);
  return resolveDrafts(rules.specs, draft, rules.others(draft), rules.schema, calcUnits);
}

function quote(price: string, days: string): MoveDraft {
  const blank = blankMove();
  return {
    ...blank,
    quote: {
      priceCents: draftFromText(quoteNumberSpecs.price, price, calcUnits),
      leadTimeDays: draftFromText(quoteNumberSpecs.leadTime, days, calcUnits),
    },
  };
}

describe('the grinder quote form', () => {
  it('sends dollars and cents as whole cents with the version it read', () => {
    expect(resolve('quoted', quote('485.00', '6'))).toEqual({
      values: { version: 7, to: 'quoted', quote: { priceCents: 48_500, leadTimeDays: 6 } },
      errors: null,
    });
    // 0.29 × 100 is 28.999999999999996 in binary floating point; the quote must still be 29 cents.
    expect(resolve('quoted', quote('$1,050.29', '0')).values?.quote).toEqual({ priceCents: 105_029, leadTimeDays: 0 });
  });

  it('asks for a blank price in dollars and names a price or lead time it cannot take', () => {
    expect(resolve('quoted', quote('', '')).errors).toEqual({
      'quote.priceCents': 'Enter the price in dollars, like 485.00',
      'quote.leadTimeDays': 'Enter the lead time',
    });
    expect(resolve('quoted', quote('4.555', '6.5')).errors).toEqual({
      'quote.priceCents': 'Price must be an amount in dollars, like 485.00',
      'quote.leadTimeDays': 'Lead time is a whole number',
    });
    expect(resolve('quoted', quote('-5', '366')).errors).toEqual({
      'quote.priceCents': 'Price must be an amount in dollars, like 485.00',
      'quote.leadTimeDays': 'Lead time must be between 0 and 365 days',
    });
    expect(resolve('quoted', quote('100000.01', '3')).errors).toEqual({ 'quote.priceCents': 'Price must be between $0 and $100000' });
  });

  it('takes the range the server takes, so a quote the form passes is never refused for its numbers', () => {
    const server = orderMoveSchema.shape.quote.unwrap().shape;
    expect(quoteNumberSpecs.price.max * 100).toBe(server.priceCents.maxValue);
    expect(quoteNumberSpecs.price.min).toBe(server.priceCents.minValue);
    expect([quoteNumberSpecs.leadTime.min, quoteNumberSpecs.leadTime.max]).toEqual([server.leadTimeDays.minValue, server.leadTimeDays.maxValue]);
    for (const price of ['0', '0.01', '99999.99', '100000']) {
      const body = resolve('quoted', quote(price, '365')).values;
      expect(orderMoveSchema.safeParse(body).success, price).toBe(true);
    }
  });
});

describe('the other move forms', () => {
  it('sends no quote with any other move, whatever the quote fields hold', () => {
    const draft = { ...quote('485', '6'), message: '  Ready Monday  ' };
    expect(resolve('grinding', draft)).toEqual({ values: { version: 7, to: 'grinding', message: 'Ready Monday' }, errors: null });
  });

  it('needs what should change before asking for changes', () => {
    expect(resolve('changes-asked', { ...blankMove(), message: '   ' }).errors).toEqual({ message: 'Say what should change on the sheet' });
    expect(resolve('changes-asked', { ...blankMove(), message: 'Lash 0.016 on the exhaust' }).values).toEqual({
      version: 7,
      to: 'changes-asked',
      message: 'Lash 0.016 on the exhaust',
    });
  });

  it('needs a carrier and tracking to ship, and sends them trimmed', () => {
    expect(resolve('shipped', blankMove()).errors).toEqual({ 'shipping.carrier': 'Name the carrier', 'shipping.tracking': 'Enter the tracking text' });
    const draft = { ...blankMove(), shipping: { carrier: ' Test Freight ', tracking: ' TF-001 ' } };
    expect(resolve('shipped', draft)).toEqual({
      values: { version: 7, to: 'shipped', shipping: { carrier: 'Test Freight', tracking: 'TF-001' } },
      errors: null,
    });
  });

  it('places every field the server may name on the form', () => {
    expect(moveFieldPaths).toEqual(['quote.priceCents', 'quote.leadTimeDays', 'message', 'shipping.carrier', 'shipping.tracking']);
  });
});
