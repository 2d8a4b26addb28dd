import { Router } from 'express';
import { and, desc, eq, lt, or } from 'drizzle-orm';
import { z } from 'zod';

import { schema } from '@/db';
import type { OutboxMessage } from '@/shared/orders';

import { requireSignedIn } from '../access';
import type { AppDeps } from '../deps';
import { HttpError, notFound, parse } from '../http';

type OutboxRow = typeof schema.outbox.$inferSelect;

function toOutboxMessage(row: OutboxRow): OutboxMessage {
  return { id: row.id, to: row.to, subject: row.subject, text: row.text, html: row.html, createdAt: row.createdAt.toISOString() };
}

/** A page of the mailbox: newest first; the cursor is the last message's time and id. */
const pageQuery = z.strictObject({
  limit: z.coerce.number({ error: 'limit must be a number' }).int('limit is a whole number').min(1, 'limit is at least 1').max(200, 'limit is at most 200').default(50),
  cursor: z.string().max(200).optional(),
});

const cursorOf = (row: OutboxRow) => Buffer.from(JSON.stringify([row.createdAt.getTime(), row.id])).toString('base64url');

function readCursor(cursor: string) {
  try {
    const [at, id] = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')) as unknown[];
    if (typeof at === 'number' && Number.isFinite(at) && typeof id === 'string') return { at: new Date(at), id };
  } catch {
    // falls through to the 400
  }
  throw new HttpError(400, 'invalid', 'cursor: Not a cursor this list gave out', { cursor: 'Not a cursor this list gave out' });
}

/**
 * The development mailbox: the mail the local transport kept, each person seeing only
 * mail addressed to them. Mounted only when createApp's `devTools` is on (demo mode).
 */
export function devOutboxRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/dev/outbox', async (req, res) => {
    const { user } = await requireSignedIn(auth, db, req);
    const query = parse(pageQuery, req.query);
    const after = query.cursor ? readCursor(query.cursor) : undefined;
    const mine = eq(schema.outbox.to, user.email);
    const rows = db
      .select()
      .from(schema.outbox)
      .where(after ? and(mine, or(lt(schema.outbox.createdAt, after.at), and(eq(schema.outbox.createdAt, after.at), lt(schema.outbox.id, after.id)))) : mine)
      .orderBy(desc(schema.outbox.createdAt), desc(schema.outbox.id))
      .limit(query.limit + 1)
      .all();
    const page = rows.slice(0, query.limit);
    res.json({ messages: page.map(toOutboxMessage), nextCursor: rows.length > query.limit ? cursorOf(page[page.length - 1]!) : null });
  });

  router.get('/dev/outbox/:id', async (req, res) => {
    const { user } = await requireSignedIn(auth, db, req);
    const row = db
      .select()
      .from(schema.outbox)
      .where(and(eq(schema.outbox.id, req.params.id), eq(schema.outbox.to, user.email)))
      .get();
    if (!row) throw notFound('Message');
    res.json({ message: toOutboxMessage(row) });
  });

  return router;
}
