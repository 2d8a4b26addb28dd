import { Router } from 'express';
import { z } from 'zod';

import { requireSignedIn } from '../access';
import type { AppDeps } from '../deps';
import { HttpError, notFound, parse } from '../http';
import { outboxMessage, outboxRows, toOutboxMessage, type OutboxRow } from '../store/outbox';

/** A page of the mailbox: newest first; the cursor is the last message's time and id. */
const pageQuery = z.strictObject({
  limit: z.coerce
    .number({ error: 'limit must be a number' })
    .int('limit is a whole number')
    .min(1, 'limit is at least 1')
    .max(200, 'limit is at most 200')
    .default(50),
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
    const rows = outboxRows(db, user.email, query.limit, after);
    const page = rows.slice(0, query.limit);
    res.json({ messages: page.map(toOutboxMessage), nextCursor: rows.length > query.limit ? cursorOf(page[page.length - 1]!) : null });
  });

  router.get('/dev/outbox/:id', async (req, res) => {
    const { user } = await requireSignedIn(auth, db, req);
    const message = outboxMessage(db, user.email, req.params.id);
    if (!message) throw notFound('Message');
    res.json({ message });
  });

  return router;
}
