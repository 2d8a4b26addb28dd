import { draftsFor, type NumberDraft, type NumberSpec } from '@/lib/number-draft';
import { shareLinkLimits } from '@/shared/owner';

/** The owner's offer: money in dollars and cents (saved as whole cents), lead time in whole days. Ranges follow shared/owner's schema. */
export const offerNumberSpecs = {
  price: { path: 'priceCents', label: 'Price', quantity: null, unit: '$', digits: 2, min: 0, max: 100_000, money: true },
  deposit: {
    path: 'depositCents',
    label: 'Deposit',
    quantity: null,
    unit: '$',
    digits: 2,
    min: 0,
    max: 100_000,
    money: true,
    hint: 'At most the price',
  },
  leadTime: { path: 'leadTimeDays', label: 'Lead time', quantity: null, unit: 'days', digits: 0, min: 0, max: 365, integer: true },
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
