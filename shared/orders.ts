import { z } from 'zod';

import type { Revision, Supersession } from './sheets';
import { centsSchema, leadTimeDaysSchema, versionSchema } from './numbers';

/**
 * A grind order: one issued revision of a spec sheet, sent to one grinding shop.
 * Lobewright's own stage names; the server enforces the moves in `orderMoves`.
 */
export const orderStages = ['sent', 'quoted', 'changes-asked', 'grinding', 'shipped', 'received', 'installed'] as const;
export type OrderStage = (typeof orderStages)[number];

export const orderStageLabels: Record<OrderStage, string> = {
  sent: 'Sent to grinder',
  quoted: 'Accepted and quoted',
  'changes-asked': 'Changes asked',
  grinding: 'On the grinder',
  shipped: 'Shipped',
  received: 'Received at the shop',
  installed: 'Installed',
};

/** Who may make each move, from which stage. Anything else is a 409. */
export const orderMoves: Record<OrderStage, { to: OrderStage; by: 'grinder' | 'builder' }[]> = {
  sent: [
    { to: 'quoted', by: 'grinder' },
    { to: 'changes-asked', by: 'grinder' },
  ],
  quoted: [{ to: 'grinding', by: 'grinder' }],
  'changes-asked': [],
  grinding: [{ to: 'shipped', by: 'grinder' }],
  shipped: [{ to: 'received', by: 'builder' }],
  received: [{ to: 'installed', by: 'builder' }],
  installed: [],
};

/**
 * Stages where the grinder has started on the metal: an order there stays on the grinder's list and may go on even
 * when its revision is superseded. Before them, a superseded order is closed: off the list and refused every move.
 */
export const underWayStages: readonly OrderStage[] = ['grinding', 'shipped', 'received', 'installed'];

/** Whether the order is still one to work on: its revision is live, or the grinding had started before it was superseded. */
export const orderIsLive = (order: Pick<Order, 'stage' | 'supersededBy'>) => order.supersededBy === null || underWayStages.includes(order.stage);

/**
 * Why an order may be ground. An order starts as a request for a quote (`firm: null`); it becomes the job's one firm
 * order when the owner approves its revision (`owner`), or when a builder confirms it without the owner (`builder`,
 * with the reason, also kept in the audit log).
 */
export type Firmness = { by: 'owner' | 'builder'; at: string; reason: string | null };

/** The one move that needs a firm order: the grinder starts on the metal only for the revision the job goes ahead with. */
export const firmOnlyStage: OrderStage = 'grinding';

/** Stages from which a builder may confirm a request for a quote as the firm order (the server refuses any other). */
export const confirmableStages: readonly OrderStage[] = ['sent', 'quoted'];

/** The builder's reason for going ahead without the owner's approval (a fleet account, an owner who said yes by phone…). */
export const firmReasonSchema = z
  .string({ error: 'Say why this goes ahead without the owner’s approval' })
  .trim()
  .min(8, 'Say in a few words why this goes ahead without the owner’s approval')
  .max(500, 'Keep the reason under 500 characters');

/** Builder issues the sheet's current draft revision to one grinding shop: a request for a quote, or with `confirm` a firm order. */
export const issueSchema = z.strictObject({
  version: versionSchema,
  grinderShopId: z.string({ error: 'Choose the grinding shop' }).min(1, 'Choose the grinding shop'),
  note: z.string().trim().max(2000, 'Keep the note under 2000 characters').default(''),
  /** Firm from the start without the owner's approval. Not needed for the owner's approved revision, which is firm anyway. */
  confirm: z.strictObject({ reason: firmReasonSchema }).optional(),
});

/** A builder makes a request for a quote the job's firm order without the owner's approval. */
export const confirmOrderSchema = z.strictObject({ version: versionSchema, reason: firmReasonSchema });
export type ConfirmOrderBody = z.input<typeof confirmOrderSchema>;
export type IssueBody = z.input<typeof issueSchema>;

/** One move of an order; the fields a move needs are required by the server for that move. */
export const orderMoveSchema = z.strictObject({
  version: versionSchema,
  to: z.enum(orderStages, { error: `Stage is one of: ${orderStages.join(', ')}` }),
  /** Required to quote. */
  quote: z
    .strictObject({
      priceCents: centsSchema('Price'),
      leadTimeDays: leadTimeDaysSchema,
    })
    .optional(),
  /** Required to ask for changes; optional otherwise. */
  message: z.string().trim().max(4000, 'Keep the message under 4000 characters').optional(),
  /** Required to ship. */
  shipping: z
    .strictObject({
      carrier: z.string().trim().min(1, 'Name the carrier').max(80),
      tracking: z.string().trim().min(1, 'Enter the tracking text').max(120),
    })
    .optional(),
});
export type OrderMove = z.input<typeof orderMoveSchema>;

export const messageSchema = z.strictObject({
  body: z.string({ error: 'Write a message' }).trim().min(1, 'Write a message').max(4000, 'Keep the message under 4000 characters'),
});

export type OrderMessage = {
  id: string;
  orderId: string;
  body: string;
  author: { id: string | null; name: string; shopName: string; side: 'builder' | 'grinder' };
  createdAt: string;
};

export type OrderEvent = { id: number; action: string; by: string; at: string; detail: Record<string, unknown> | null };

export type Order = {
  id: string;
  sheetId: string;
  sheetTitle: string;
  revisionId: string;
  revisionNumber: number;
  /** Short checksum of the issued revision's content (first 12 hex of SHA-256 over its canonical JSON). */
  checksum: string;
  repairShop: { id: string; name: string };
  grinderShop: { id: string; name: string };
  stage: OrderStage;
  quote: { priceCents: number; leadTimeDays: number } | null;
  shipping: { carrier: string; tracking: string } | null;
  issuedAt: string;
  updatedAt: string;
  version: number;
  /** A later revision of the sheet was issued: the order's revision is no longer the one to grind. */
  supersededBy: Supersession | null;
  /** Null for a request for a quote; the grinder may start grinding only a firm order. */
  firm: Firmness | null;
};

/** What the grinder and the builder see on an order's page. */
export type OrderDetail = Order & {
  revision: Revision;
  /** The job's vehicle line (no owner details go to the grinder). */
  vehicle: string;
  messages: OrderMessage[];
  events: OrderEvent[];
};

/** A stored e-mail in the local outbox (the default transport). */
/** A mail about the shop that could not be sent after every try. */
export type FailedMail = {
  id: string;
  to: string;
  subject: string;
  attempts: number;
  /** What the mail server answered last. */
  lastError: string;
  createdAt: string;
};

export type OutboxMessage = {
  id: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  createdAt: string;
};
