import type { Db } from '@/db';

import type { Writer } from '../store/db';
import { queueMail } from '../store/outbox';

export type MailMessage = { to: string; subject: string; text: string; html: string };

/**
 * Where a route's mail goes. It is written to the `outbox` table in the same transaction as the change
 * it tells of, so a change never commits without its mail, nor a mail without its change.
 */
export type Mailer = {
  /** 'outbox': kept in the database for the development mailbox (no SMTP_URL); 'smtp': sent by the mail sender. */
  readonly kind: 'outbox' | 'smtp';
  /** Writes one mail inside the caller's transaction; `shopId` is the shop that sees it if it fails. */
  queue(tx: Writer, message: MailMessage, shopId?: string | null): void;
  /** Writes one mail on its own, for mail the sign-in library asks for outside our transactions. */
  send(message: MailMessage, shopId?: string | null): Promise<void>;
  /** Called after each queued mail, so a sender in this process starts on it at once (set by the sender). */
  onQueued?: () => void;
};

export type CreateMailerOptions = {
  db: Db;
  /** With an SMTP URL mail waits in the outbox for the sender; without it, it is only kept there. */
  smtpUrl?: string;
};

export const defaultMailFrom = 'Lobewright <lobewright@localhost>';

export function createMailer({ db, smtpUrl }: CreateMailerOptions): Mailer {
  const status = smtpUrl ? 'pending' : 'kept';
  const mailer: Mailer = {
    kind: smtpUrl ? 'smtp' : 'outbox',
    queue(tx, message, shopId = null) {
      queueMail(tx, message, status, shopId);
      // The sender runs on a later turn of the event loop, after this synchronous transaction commits.
      if (mailer.onQueued) setImmediate(mailer.onQueued);
    },
    async send(message, shopId = null) {
      mailer.queue(db, message, shopId);
    },
  };
  return mailer;
}

/** Queues one message to each person in the caller's transaction; returns how many were queued. */
export function queueEach<P extends { email: string }>(
  mailer: Mailer,
  tx: Writer,
  people: readonly P[],
  build: (person: P) => MailMessage,
  shopId: string | null,
): number {
  for (const person of people) mailer.queue(tx, build(person), shopId);
  return people.length;
}
