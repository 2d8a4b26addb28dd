import { and, asc, desc, eq, isNull, lt, lte, or, sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { FailedMail, OutboxMessage } from '@/shared/orders';

import type { Reader, Writer } from './db';

export type OutboxRow = typeof schema.outbox.$inferSelect;

export function toOutboxMessage(row: OutboxRow): OutboxMessage {
  return { id: row.id, to: row.to, subject: row.subject, text: row.text, html: row.html, createdAt: row.createdAt.toISOString() };
}

export type QueuedMail = { to: string; subject: string; text: string; html: string };

/**
 * Writes one mail in the caller's transaction: `kept` only in the outbox (no SMTP_URL: the development
 * mailbox shows it) or `pending` for the sender, due at once. A mail without both a text and an HTML part
 * is a bug, not a mail: it is refused and nothing is written.
 */
export function queueMail(tx: Pick<Db, 'insert'>, message: QueuedMail, status: 'kept' | 'pending', shopId: string | null = null): string {
  if (!message.text.trim() || !message.html.trim()) throw new Error('Mail was built without both a text and an HTML part');
  const id = crypto.randomUUID();
  tx.insert(schema.outbox)
    .values({
      id,
      shopId,
      to: message.to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      status,
      nextAttemptAt: status === 'pending' ? new Date() : null,
    })
    .run();
  return id;
}

/**
 * Claims the oldest due pending mail for one sender until `leaseMs` from now, counting the try.
 * A sender that dies holding a claim loses it when the lease runs out, and the next sender takes the mail.
 */
export function claimDueMail(db: Db, now: Date, leaseMs: number): OutboxRow | undefined {
  const o = schema.outbox;
  return db.transaction((tx) => {
    const due = tx
      .select({ id: o.id })
      .from(o)
      .where(and(eq(o.status, 'pending'), lte(o.nextAttemptAt, now), or(isNull(o.claimedUntil), lt(o.claimedUntil, now))))
      .orderBy(asc(o.nextAttemptAt), asc(o.createdAt))
      .limit(1)
      .get();
    if (!due) return undefined;
    return tx
      .update(o)
      .set({ claimedUntil: new Date(now.getTime() + leaseMs), attempts: sql`${o.attempts} + 1` })
      .where(eq(o.id, due.id))
      .returning()
      .get();
  });
}

/** The mail went out. */
export function markMailSent(db: Db, id: string, at: Date) {
  db.update(schema.outbox).set({ status: 'sent', sentAt: at, claimedUntil: null, lastError: null }).where(eq(schema.outbox.id, id)).run();
}

/** The try failed: due again at `retryAt`, or, with no retry left (`retryAt` null), failed for the shop to see. */
export function markMailFailedTry(db: Db, id: string, error: string, retryAt: Date | null) {
  db.update(schema.outbox)
    .set(retryAt ? { nextAttemptAt: retryAt, claimedUntil: null, lastError: error } : { status: 'failed', claimedUntil: null, lastError: error })
    .where(eq(schema.outbox.id, id))
    .run();
}

/** The shop's mail that could not be sent after every try, newest first. */
export function failedMail(db: Reader, shopId: string): FailedMail[] {
  const o = schema.outbox;
  return db
    .select({ id: o.id, to: o.to, subject: o.subject, attempts: o.attempts, lastError: o.lastError, createdAt: o.createdAt })
    .from(o)
    .where(and(eq(o.shopId, shopId), eq(o.status, 'failed')))
    .orderBy(desc(o.createdAt), desc(o.id))
    .limit(200)
    .all()
    .map((m) => ({ ...m, lastError: m.lastError ?? '', createdAt: m.createdAt.toISOString() }));
}

/** Puts one of the shop's failed mails back in line, with its tries counted afresh; another shop's is a 404. */
export function retryFailedMail(db: Writer, shopId: string, id: string): boolean {
  const o = schema.outbox;
  const changed = db
    .update(o)
    .set({ status: 'pending', attempts: 0, nextAttemptAt: new Date(), claimedUntil: null })
    .where(and(eq(o.id, id), eq(o.shopId, shopId), eq(o.status, 'failed')))
    .run();
  return changed.changes === 1;
}

/** Mail addressed to `email`, newest first, after `after` (the last message of the page before), one more than `limit`. */
export function outboxRows(db: Reader, email: string, limit: number, after?: { at: Date; id: string }): OutboxRow[] {
  const mine = eq(schema.outbox.to, email);
  return db
    .select()
    .from(schema.outbox)
    .where(after ? and(mine, or(lt(schema.outbox.createdAt, after.at), and(eq(schema.outbox.createdAt, after.at), lt(schema.outbox.id, after.id)))) : mine)
    .orderBy(desc(schema.outbox.createdAt), desc(schema.outbox.id))
    .limit(limit + 1)
    .all();
}

/** One message addressed to `email`, or undefined. */
export function outboxMessage(db: Reader, email: string, id: string): OutboxMessage | undefined {
  const row = db
    .select()
    .from(schema.outbox)
    .where(and(eq(schema.outbox.id, id), eq(schema.outbox.to, email)))
    .get();
  return row ? toOutboxMessage(row) : undefined;
}
