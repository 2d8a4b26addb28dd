import { quoteSentence } from '@/constants/format';

import type { Order } from '@/shared/orders';

import type { Writer } from '../store/db';
import { recipients } from '../store/team';
import { composeMail } from './compose';
import { queueEach, type Mailer, type MailMessage } from './index';

/** What an order e-mail needs to say; everything here is already checked by the route. */
export type OrderMailFacts = {
  orderId: string;
  publicUrl: string;
  sheetTitle: string;
  revisionNumber: number;
  checksum: string;
  repairShopName: string;
  grinderShopName: string;
  quote?: { priceCents: number; leadTimeDays: number } | null;
  shipping?: { carrier: string; tracking: string } | null;
  message?: string | null;
  /** Whether the order is firm (the one to grind) or a request for a quote, and why it is firm. */
  firm?: { by: 'owner' | 'builder'; reason: string | null } | null;
  /** For a superseded order: the revision that supersedes it, and the stage the order had reached. */
  superseded?: { by: number; stageLabel: string; underWay: boolean } | null;
};

export type OrderMailKind = 'issued' | 'confirmed' | 'quoted' | 'changes-asked' | 'shipped' | 'superseded';

/** The order's page in the app. */
export function orderLink(publicUrl: string, orderId: string) {
  return `${publicUrl.replace(/\/+$/, '')}/orders/${encodeURIComponent(orderId)}`;
}

/** Subject, lines of text and the call to action for each kind of order mail (Lobewright's own wording). */
function content(kind: OrderMailKind, f: OrderMailFacts): { subject: string; lines: string[]; action: string } {
  const sheet = `"${f.sheetTitle}" revision ${f.revisionNumber} (checksum ${f.checksum})`;
  switch (kind) {
    case 'issued':
      return {
        subject: `New spec sheet from ${f.repairShopName}: ${f.sheetTitle}, rev ${f.revisionNumber}`,
        lines: [
          `${f.repairShopName} has sent you ${sheet} to grind.`,
          'The revision is frozen: what you open is exactly what they sent.',
          ...(f.message ? [`Their note: ${f.message}`] : []),
          f.firm
            ? 'This is a firm order: once you have quoted it, you may grind it.'
            : 'This is a request for a quote: quote it, but do not grind it until they confirm it.',
          'Open it to accept with a quote or to ask for changes.',
        ],
        action: 'Open the spec sheet',
      };
    case 'confirmed':
      return {
        subject: `Firm order: ${f.sheetTitle}, rev ${f.revisionNumber} from ${f.repairShopName}`,
        lines: [
          `${f.repairShopName} confirmed ${sheet} as the firm order for this job.`,
          f.firm?.by === 'builder' ? `They go ahead without the owner's approval: ${f.firm.reason ?? ''}` : 'The vehicle owner approved this revision.',
          'Once it is quoted you may start grinding. No other revision of this job will be firm.',
        ],
        action: 'Open the order',
      };
    case 'quoted':
      return {
        subject: `${f.grinderShopName} quoted ${f.sheetTitle}, rev ${f.revisionNumber}`,
        lines: [
          `${f.grinderShopName} accepted ${sheet}.`,
          ...(f.quote ? [`${quoteSentence(f.quote)}.`] : []),
          ...(f.message ? [`Their note: ${f.message}`] : []),
        ],
        action: 'See the quote',
      };
    case 'changes-asked':
      return {
        subject: `${f.grinderShopName} asks for changes to ${f.sheetTitle}, rev ${f.revisionNumber}`,
        lines: [
          `${f.grinderShopName} will not grind ${sheet} as it stands.`,
          `What they ask: ${f.message ?? ''}`,
          'Edit the sheet to start a new revision, then send it again.',
        ],
        action: 'Read their request',
      };
    case 'shipped':
      return {
        subject: `Your cam is on its way: ${f.sheetTitle}, rev ${f.revisionNumber}`,
        lines: [
          `${f.grinderShopName} shipped the cam ground to ${sheet}.`,
          ...(f.shipping ? [`Carrier: ${f.shipping.carrier}. Tracking: ${f.shipping.tracking}.`] : []),
          ...(f.message ? [`Their note: ${f.message}`] : []),
          'Mark it received when it arrives, and check the checksum on the box against your sheet.',
        ],
        action: 'Follow the order',
      };
    case 'superseded': {
      const by = f.superseded?.by;
      return {
        subject: `Superseded: ${f.sheetTitle}, rev ${f.revisionNumber} (now rev ${by})`,
        lines: [
          `${f.repairShopName} issued revision ${by} of "${f.sheetTitle}", which supersedes ${sheet}.`,
          ...(f.superseded?.underWay
            ? [
                `Your order was under way (${f.superseded.stageLabel}), so it stays open.`,
                `Agree with ${f.repairShopName} whether to stop or to finish it, and write down why in the order's thread.`,
              ]
            : [
                `The order was not yet on the grinder (${f.superseded?.stageLabel ?? ''}), so it is now closed and cannot be quoted or moved.`,
                `Do not grind revision ${f.revisionNumber}. If revision ${by} comes to you, it arrives as an order of its own.`,
              ]),
        ],
        action: 'Open the superseded order',
      };
    }
  }
}

/** One order e-mail to one person, with a plain-text and an HTML part that both link to the order. */
export function orderMail(kind: OrderMailKind, to: { email: string; name: string }, facts: OrderMailFacts): MailMessage {
  const { subject, lines, action } = content(kind, facts);
  return composeMail({
    to,
    subject,
    lines,
    action,
    link: orderLink(facts.publicUrl, facts.orderId),
    footer: 'Sent by Lobewright for the shops on this order.',
  });
}

/**
 * Queues order mail in the transaction of the change it tells of: to the grinders on issue, confirmation and
 * supersession, else to the builders.
 */
export function queueOrderMail(
  tx: Writer,
  { mailer, publicUrl }: { mailer: Mailer; publicUrl: string },
  kind: OrderMailKind,
  order: Order,
  extra: Pick<OrderMailFacts, 'message' | 'superseded'> = {},
) {
  const toGrinders = kind === 'issued' || kind === 'confirmed' || kind === 'superseded';
  const shop = toGrinders ? order.grinderShop : order.repairShop;
  const to = recipients(tx, shop.id, toGrinders ? 'grinder' : 'builder');
  const facts: OrderMailFacts = {
    orderId: order.id,
    publicUrl,
    sheetTitle: order.sheetTitle,
    revisionNumber: order.revisionNumber,
    checksum: order.checksum,
    repairShopName: order.repairShop.name,
    grinderShopName: order.grinderShop.name,
    quote: order.quote,
    shipping: order.shipping,
    firm: order.firm,
    ...extra,
  };
  queueEach(mailer, tx, to, (person) => orderMail(kind, person, facts), shop.id);
}
