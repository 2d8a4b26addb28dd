import { draftsFor, rangeOf, type NumberDraft, type NumberSpec } from '@/lib/number-draft';
import { centsSchema, leadTimeDaysSchema } from '@/shared/numbers';
import { shareLinkLimits } from '@/shared/owner';

const cents = rangeOf(centsSchema('Price'));
/** Money as a person types it: dollars and cents, held in the record as whole cents; the range is the shared schema's, in dollars. */
const dollars = { quantity: null, unit: '$', digits: 2, min: cents.min / 100, max: cents.max / 100, money: true } as const;
/** A lead time in whole days, with the shared schema's range. */
const days = { quantity: null, unit: 'days', digits: 0, ...rangeOf(leadTimeDaysSchema), integer: true } as const;

/** The price and lead time fields, as the owner's offer and the grinder's quote both take them. */
export const priceSpec: NumberSpec = { path: 'priceCents', label: 'Price', ...dollars };
export const leadTimeSpec: NumberSpec = { path: 'leadTimeDays', label: 'Lead time', ...days };

/** The owner's offer: money in dollars and cents (saved as whole cents), lead time in whole days. */
export const offerNumberSpecs = {
  price: priceSpec,
  deposit: { path: 'depositCents', label: 'Deposit', ...dollars, hint: 'At most the price' },
  leadTime: leadTimeSpec,
} as const satisfies Record<string, NumberSpec>;

export const offerNumberList: readonly NumberSpec[] = Object.values(offerNumberSpecs);

/** The add-an-option form: the sheet, the owner's words, and the number drafts. */
export type OfferDraft = { sheetId: string; title: string; ownerNote: string; priceCents: NumberDraft; depositCents: NumberDraft; leadTimeDays: NumberDraft };

export const offerFieldPaths: readonly string[] = ['sheetId', 'title', 'ownerNote', ...offerNumberList.map((s) => s.path)];

export function blankOffer(): OfferDraft {
  return { sheetId: '', title: '', ownerNote: '', ...(draftsFor(offerNumberList, null) as Pick<OfferDraft, 'priceCents' | 'depositCents' | 'leadTimeDays'>) };
}

/** How long a link to the owner's page works, in whole days. */
export const linkDaysSpec: NumberSpec = {
  path: 'expiresInDays',
  label: 'Works for',
  quantity: null,
  unit: 'days',
  digits: 0,
  min: 1,
  max: shareLinkLimits.maxDays,
  integer: true,
};

export type LinkDraft = { expiresInDays: NumberDraft; email: string };

export function blankLink(): LinkDraft {
  return { ...(draftsFor([linkDaysSpec], { expiresInDays: shareLinkLimits.defaultDays }) as Pick<LinkDraft, 'expiresInDays'>), email: '' };
}
