import { z } from 'zod';

import type { OwnerComparison } from '@/calc/compare';

import type { OwnerCoreAnswer } from './fits-core';

import type { CheckStatus, CheckSummary } from '@/calc/checks';
import { emailAddress } from './me';
import { centsSchema, leadTimeDaysSchema, versionSchema } from './numbers';

/**
 * What the vehicle's owner sees: the shop's plain-words account of what failed,
 * the options the builder offers (each bound to one sheet revision), a price,
 * an approval and a deposit. Opened from a share link; no account needed.
 */

export const shareLinkLimits = { defaultDays: 30, maxDays: 90, tokenBytes: 32 } as const;

const ownerText = (max: number) => z.string({ error: 'Must be text' }).trim().max(max, `Keep it under ${max} characters`);

/** The builder's words for the owner about what failed (never the internal findings). */
export const ownerPageSchema = z.strictObject({
  version: versionSchema,
  whatFailed: ownerText(4000),
});
export type OwnerPageSave = z.input<typeof ownerPageSchema>;

const optionFields = {
  title: z.string({ error: 'Name the option' }).trim().min(1, 'Name the option').max(120, 'Keep the name under 120 characters'),
  ownerNote: ownerText(2000).default(''),
  priceCents: centsSchema('Price'),
  depositCents: centsSchema('Deposit'),
  leadTimeDays: leadTimeDaysSchema,
};

function depositWithinPrice(value: { priceCents?: number; depositCents?: number }, ctx: z.RefinementCtx) {
  if (value.priceCents !== undefined && value.depositCents !== undefined && value.depositCents > value.priceCents) {
    ctx.addIssue({ code: 'custom', path: ['depositCents'], message: 'The deposit cannot be more than the price' });
  }
}

/** Offer one of the job's spec sheets to the owner; it is bound to the sheet's latest revision. */
export const ownerOptionCreateSchema = z
  .strictObject({ sheetId: z.string({ error: 'Choose the spec sheet' }).min(1, 'Choose the spec sheet'), ...optionFields })
  .superRefine(depositWithinPrice);
export type OwnerOptionCreate = z.input<typeof ownerOptionCreateSchema>;

export const ownerOptionPatchSchema = z
  .strictObject({
    version: versionSchema,
    title: optionFields.title.optional(),
    ownerNote: ownerText(2000).optional(),
    priceCents: optionFields.priceCents.optional(),
    depositCents: optionFields.depositCents.optional(),
    leadTimeDays: optionFields.leadTimeDays.optional(),
    /** Bind the option to the sheet's latest revision (after the builder changed the sheet). */
    refreshRevision: z.boolean().optional(),
  })
  .superRefine(depositWithinPrice);
export type OwnerOptionPatch = z.input<typeof ownerOptionPatchSchema>;

export const shareLinkCreateSchema = z.strictObject({
  expiresInDays: z
    .number({ error: 'Days must be a number' })
    .int('Days are whole days')
    .min(1, 'A link lasts at least 1 day')
    .max(shareLinkLimits.maxDays, `A link lasts at most ${shareLinkLimits.maxDays} days`)
    .default(shareLinkLimits.defaultDays),
  /** Send the link to the owner by e-mail as well; an owner signed in with this address (customer role) also finds the page under their account. */
  email: emailAddress.optional(),
});
export type ShareLinkCreate = z.input<typeof shareLinkCreateSchema>;

/** The owner approves one option, naming the exact revision they read by its checksum and the whole offer by its offer checksum. */
export const approveSchema = z.strictObject({
  optionId: z.string({ error: 'Choose an option' }).min(1, 'Choose an option'),
  checksum: z.string({ error: 'Send the checksum shown with the option' }).regex(/^[0-9a-f]{12}$/, 'The checksum is 12 hex digits'),
  offer: z.string({ error: 'Send the offer checksum of the option you read' }).regex(/^[0-9a-f]{12}$/, 'The offer checksum is 12 hex digits'),
  name: z.string({ error: 'Type your name' }).trim().min(1, 'Type your name').max(120, 'Keep the name under 120 characters'),
  agree: z.literal(true, { error: 'Tick the box to approve' }),
});
export type ApproveBody = z.input<typeof approveSchema>;

export const depositConfirmSchema = z.strictObject({
  sessionId: z.string({ error: 'Send the payment session' }).min(1, 'Send the payment session').max(255),
});

export type OwnerOption = {
  id: string;
  sheetId: string;
  revisionId: string;
  revisionNumber: number;
  /** Checksum of the bound revision (shared/checksum.ts): the owner approves exactly this. */
  checksum: string;
  title: string;
  ownerNote: string;
  priceCents: number;
  depositCents: number;
  leadTimeDays: number;
  version: number;
  /** True when the sheet has a newer revision than the one the owner would see. */
  stale: boolean;
};

export type ShareLinkState = 'active' | 'expired' | 'revoked';

export type ShareLink = {
  id: string;
  state: ShareLinkState;
  email: string | null;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  lastOpenedAt: string | null;
};

export type Approval = {
  id: string;
  optionId: string;
  optionTitle: string;
  revisionId: string;
  checksum: string;
  /** The terms approved, as the owner read them. */
  priceCents: number;
  depositCents: number;
  currency: string;
  leadTimeDays: number;
  offer: string;
  name: string;
  at: string;
};

/** `refund-due`/`refunded`: a second payment of a deposit already paid, given back. */
export type PaymentState = 'open' | 'paid' | 'expired' | 'refund-due' | 'refunded';

export type Payment = {
  id: string;
  state: PaymentState;
  amountCents: number;
  currency: string;
  paidAt: string | null;
  createdAt: string;
};

/** The builder's view of everything the owner sees and did. */
export type OwnerDesk = {
  jobId: string;
  whatFailed: string;
  version: number;
  options: OwnerOption[];
  links: ShareLink[];
  approval: Approval | null;
  /** The approval last withdrawn, while no other has taken its place: the owner is being asked again. */
  withdrawn: WithdrawnApproval | null;
  payments: Payment[];
};

/** An approval the shop withdrew because its revision was superseded before grinding began. */
export type WithdrawnApproval = { optionTitle: string; checksum: string; at: string; reason: string };

/** One option as the owner reads it. */
export type OwnerViewOption = {
  id: string;
  title: string;
  ownerNote: string;
  priceCents: number;
  depositCents: number;
  leadTimeDays: number;
  checksum: string;
  /** Checksum of the whole offer (shared/checksum.ts offerChecksum); the approval quotes it. */
  offer: string;
  revisionNumber: number;
  /**
   * Why the shop must offer this option again before it can be approved (its sheet has a newer revision, or its
   * draft was edited after it was offered; optionStaleness in server/store/owner-page.ts), or null when it can be.
   */
  updating: string | null;
  /** Worst fit-check status worked out from the numbers. */
  status: CheckStatus;
  /**
   * The one summary shown (summarizeChecks): of the latest fit-check run on the engine against this
   * revision when there is one, else of the checks worked out from the numbers.
   */
  summary: CheckSummary;
  /** The latest fit-check run against this option's revision: when, by whom; null when not run on the engine yet. */
  checkedOnEngine: { revisionNumber: number; at: string; by: string | null } | null;
  /** Plain words against the first option (the reference); null for the reference itself. */
  comparison: OwnerComparison | null;
  /** The fit sentence for every option, the reference included. */
  fit: string;
  /** Whether the option can be ground from the owner's old camshaft or needs a new core, in plain words. */
  core: OwnerCoreAnswer;
  /** Key figures in owner-readable units. */
  figures: { intakeLiftIn: number; exhaustLiftIn: number; intakeDuration050: number; exhaustDuration050: number };
};

/** The share page: only what the owner should see. */
export type OwnerView = {
  shopName: string;
  vehicle: string;
  customerName: string;
  whatFailed: string;
  photos: { id: string; caption: string; url: string }[];
  options: OwnerViewOption[];
  cautions: string[];
  approval: Approval | null;
  /** The approval last withdrawn, while no other has taken its place (see OwnerDesk). */
  withdrawn: WithdrawnApproval | null;
  payment: Payment | null;
  /** Currency of every price and deposit on the page. */
  currency: string;
  /** Whether this server takes card deposits; when off, the shop takes the deposit in person. */
  depositsOn: boolean;
  expiresAt: string;
};

/** What the owner reads about an option the shop has to offer again (OwnerViewOption.updating), on the page and in the 409. */
export const ownerUpdatingText = (reason: string) =>
  `The shop is still updating this option (${reason}), so it cannot be approved yet. Ask the shop to offer the current revision, then reload this page.`;
