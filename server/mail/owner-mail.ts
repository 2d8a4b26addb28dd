import { formatCents } from '@/constants/format';

import type { Writer } from '../store/db';
import { jobVehicle } from '../store/jobs';
import { recipients } from '../store/team';
import { composeMail } from './compose';
import { queueEach, type Mailer, type MailMessage } from './index';

/** The owner's page, opened from a share link. */
export function shareUrl(publicUrl: string, token: string) {
  return `${publicUrl.replace(/\/+$/, '')}/share/${token}`;
}

/** The job's owner desk in the app, for the builder. */
export function ownerDeskUrl(publicUrl: string, jobId: string) {
  return `${publicUrl.replace(/\/+$/, '')}/jobs/${encodeURIComponent(jobId)}/owner`;
}

type Person = { email: string; name: string };

/** The link to the owner, from the shop. */
export function shareLinkMail(to: Person, f: { shopName: string; vehicle: string; url: string; expiresAt: Date }): MailMessage {
  return composeMail({
    to,
    subject: `${f.shopName}: the cam options for your ${f.vehicle}`,
    lines: [
      `${f.shopName} has written up what failed in your engine and the camshaft options they propose, with prices.`,
      'Open the page to read it. You can approve an option and pay the deposit there; no account is needed.',
      `The link works until ${f.expiresAt.toUTCString()}. Keep it to yourself: anyone with it can read the page.`,
      'You can also sign up in Lobewright with this e-mail address: the page then shows under Your vehicles, without the link.',
    ],
    action: 'Read the summary',
    link: f.url,
    footer: `Sent by Lobewright for ${f.shopName}.`,
  });
}

export type OwnerEventFacts = {
  publicUrl: string;
  jobId: string;
  vehicle: string;
  optionTitle: string;
  approverName: string;
  checksum: string;
  amountCents?: number;
  currency?: string;
};

/** To the builders: the owner approved an option, or paid the deposit. */
export function ownerEventMail(kind: 'approved' | 'paid', to: Person, f: OwnerEventFacts): MailMessage {
  const amount = f.amountCents === undefined ? '' : formatCents(f.amountCents, f.currency);
  const content =
    kind === 'approved'
      ? {
          subject: `Approved: ${f.optionTitle} for the ${f.vehicle}`,
          lines: [
            `${f.approverName} approved "${f.optionTitle}" for the ${f.vehicle}.`,
            `The approval is bound to the sheet revision with checksum ${f.checksum}.`,
            'The deposit is next; you will hear when it is paid.',
          ],
        }
      : {
          subject: `Deposit paid: ${amount} for the ${f.vehicle}`,
          lines: [`The deposit of ${amount} for "${f.optionTitle}" on the ${f.vehicle} is paid.`, `Approved revision checksum: ${f.checksum}.`],
        };
  return composeMail({
    to,
    ...content,
    action: "Open the job's owner page",
    link: ownerDeskUrl(f.publicUrl, f.jobId),
    footer: 'Sent by Lobewright for your shop.',
  });
}

type BuilderMailDeps = { mailer: Mailer; publicUrl: string };

/** Queues mail to every builder of the shop about the owner's approval or payment, in the transaction that recorded it. */
export function queueBuilderMail(
  tx: Writer,
  { mailer, publicUrl }: BuilderMailDeps,
  kind: 'approved' | 'paid',
  jobId: string,
  shopId: string,
  facts: Omit<OwnerEventFacts, 'publicUrl' | 'jobId' | 'vehicle'>,
) {
  const vehicle = jobVehicle(tx, jobId) ?? 'vehicle';
  queueEach(mailer, tx, recipients(tx, shopId, 'builder'), (person) => ownerEventMail(kind, person, { ...facts, publicUrl, jobId, vehicle }), shopId);
}

/** To the owner: the approval they gave was withdrawn because the shop changed the spec before grinding; they are asked again. */
export function approvalWithdrawnMail(to: Person, f: { shopName: string; vehicle: string; optionTitle: string; reason: string; url: string }): MailMessage {
  return composeMail({
    to,
    subject: `${f.shopName}: please approve again for your ${f.vehicle}`,
    lines: [
      `You approved "${f.optionTitle}" for your ${f.vehicle}. Before the cam was ground, the shop changed its spec sheet.`,
      `Why: ${f.reason}`,
      'Your approval no longer stands, so nothing is ground until you approve again. A deposit you paid is kept and counts toward the new one.',
      'Open the page with the link the shop sent you, or sign in with this address, to read the option as it is now.',
    ],
    action: 'Sign in to Your vehicles',
    link: f.url,
    footer: `Sent by Lobewright for ${f.shopName}.`,
  });
}

/** Queues the "please approve again" mail to each address the job's open links went to, in the transaction. */
export function queueWithdrawnMail(
  tx: Writer,
  { mailer, publicUrl }: BuilderMailDeps,
  withdrawn: { row: { jobId: string; optionTitle: string; withdrawnReason: string | null }; emails: string[] },
  shop: { id: string; name: string },
) {
  const facts = {
    shopName: shop.name,
    vehicle: jobVehicle(tx, withdrawn.row.jobId) ?? 'vehicle',
    optionTitle: withdrawn.row.optionTitle,
    reason: withdrawn.row.withdrawnReason ?? '',
    url: `${publicUrl.replace(/\/+$/, '')}/my`,
  };
  const owners = withdrawn.emails.map((email) => ({ email, name: '' }));
  queueEach(mailer, tx, owners, (person) => approvalWithdrawnMail(person, facts), shop.id);
}
