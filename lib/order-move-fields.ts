import { draftsFor, type NumberDraft, type NumberSpec } from '@/lib/number-draft';
import { leadTimeSpec, priceSpec } from '@/lib/offer-fields';
import { orderMoveSchema, type OrderStage } from '@/shared/orders';

/** The grinder's quote: the price in dollars and cents (sent as whole cents) and the lead time in whole days. */
export const quoteNumberSpecs = {
  price: { ...priceSpec, path: 'quote.priceCents' },
  leadTime: { ...leadTimeSpec, path: 'quote.leadTimeDays' },
} as const satisfies Record<string, NumberSpec>;

const quoteNumberList: readonly NumberSpec[] = Object.values(quoteNumberSpecs);

/** What a move's form holds: the quote as number drafts, the message and the shipping as typed. */
export type MoveDraft = {
  quote: { priceCents: NumberDraft; leadTimeDays: NumberDraft };
  message: string;
  shipping: { carrier: string; tracking: string };
};

export function blankMove(): MoveDraft {
  return { ...(draftsFor(quoteNumberList, null) as Pick<MoveDraft, 'quote'>), message: '', shipping: { carrier: '', tracking: '' } };
}

/** Every field a move's form shows, by the name the server gives it in a 400. */
export const moveFieldPaths: readonly string[] = [...quoteNumberList.map((s) => s.path), 'message', 'shipping.carrier', 'shipping.tracking'];

/**
 * How the form for a move to `to` becomes its request body: which numbers it
 * checks (the quote's, only when quoting), the record around them, and the
 * schema, the server's own with what this move needs on top.
 */
export function moveRules(version: number, to: OrderStage) {
  const specs: readonly NumberSpec[] = to === 'quoted' ? quoteNumberList : [];
  const schema = orderMoveSchema.superRefine((move, ctx) => {
    if (to === 'changes-asked' && !move.message) ctx.addIssue({ code: 'custom', path: ['message'], message: 'Say what should change on the sheet' });
  });
  const others = (draft: MoveDraft): Record<string, unknown> => {
    const message = draft.message.trim();
    return {
      version,
      to,
      ...(message || to === 'changes-asked' ? { message } : {}),
      ...(to === 'shipped' ? { shipping: { carrier: draft.shipping.carrier, tracking: draft.shipping.tracking } } : {}),
    };
  };
  return { specs, schema, others };
}
