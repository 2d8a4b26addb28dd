import { Router } from 'express';
import { and, desc, eq } from 'drizzle-orm';

import { schema } from '@/db';
import type { OutboxMessage } from '@/shared/orders';

import { requireSignedIn } from '../access';
import type { AppDeps } from '../deps';
import { notFound } from '../http';

type OutboxRow = typeof schema.outbox.$inferSelect;

function toOutboxMessage(row: OutboxRow): OutboxMessage {
  return { id: row.id, to: row.to, subject: row.subject, text: row.text, html: row.html, createdAt: row.createdAt.toISOString() };
}

/**
 * The development mailbox: every mail the local transport kept, for any signed-in person.
 * Mounted only when createApp's `devTools` is on (never in production).
 */
export function devOutboxRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/dev/outbox', async (req, res) => {
    await requireSignedIn(auth, db, req);
    const rows = db.select().from(schema.outbox).orderBy(desc(schema.outbox.createdAt), desc(schema.outbox.id)).limit(200).all();
    res.json({ messages: rows.map(toOutboxMessage) });
  });

  router.get('/dev/outbox/:id', async (req, res) => {
    await requireSignedIn(auth, db, req);
    const row = db.select().from(schema.outbox).where(and(eq(schema.outbox.id, req.params.id))).get();
    if (!row) throw notFound('Message');
    res.json({ message: toOutboxMessage(row) });
  });

  return router;
}
