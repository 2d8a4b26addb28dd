import { and, desc, eq, lt, or } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { OutboxMessage } from '@/shared/orders';

import type { Reader } from './db';

export type OutboxRow = typeof schema.outbox.$inferSelect;

export function toOutboxMessage(row: OutboxRow): OutboxMessage {
  return { id: row.id, to: row.to, subject: row.subject, text: row.text, html: row.html, createdAt: row.createdAt.toISOString() };
}

/** Keeps one built message in the development mailbox. */
export function keepInOutbox(db: Pick<Db, 'insert'>, message: { to: string; subject: string; text: string; html: string }) {
  db.insert(schema.outbox)
    .values({ id: crypto.randomUUID(), to: message.to, subject: message.subject, text: message.text, html: message.html })
    .run();
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
