import { and, eq, like, lte, sql } from 'drizzle-orm';
import type { Store } from 'express-rate-limit';

import type { Db } from '@/db';
import { schema } from '@/db';

const hits = schema.rateLimitHits;

/**
 * A hit counter for express-rate-limit kept in the database, so every server process
 * (WEB_CONCURRENCY workers on one file) counts one client's requests together. Each
 * increment is one upsert statement, atomic in SQLite: a window that has ended starts
 * again at one. Ended windows are swept at most once a window per process.
 *
 * `prefix` names the limiter ("calc:", "share:"), so limiters never share a row.
 */
export function databaseRateLimitStore(db: Db, prefix: string): Store {
  let windowMs = 60_000;
  let swept = 0;
  const full = (key: string) => `${prefix}${key}`;
  return {
    prefix,
    localKeys: false,
    init: (options) => {
      windowMs = options.windowMs;
    },
    get: (key) => {
      const row = db
        .select()
        .from(hits)
        .where(eq(hits.key, full(key)))
        .get();
      return row && row.resetAt > Date.now() ? { totalHits: row.hits, resetTime: new Date(row.resetAt) } : undefined;
    },
    increment: (key) => {
      const now = Date.now();
      if (now - swept >= windowMs) {
        swept = now;
        db.delete(hits)
          .where(and(like(hits.key, `${prefix}%`), lte(hits.resetAt, now)))
          .run();
      }
      const ended = sql`${hits.resetAt} <= ${now}`;
      const row = db
        .insert(hits)
        .values({ key: full(key), hits: 1, resetAt: now + windowMs })
        .onConflictDoUpdate({
          target: hits.key,
          set: {
            hits: sql`case when ${ended} then 1 else ${hits.hits} + 1 end`,
            resetAt: sql`case when ${ended} then ${now + windowMs} else ${hits.resetAt} end`,
          },
        })
        .returning({ hits: hits.hits, resetAt: hits.resetAt })
        .get();
      return { totalHits: row.hits, resetTime: new Date(row.resetAt) };
    },
    decrement: (key) => {
      db.update(hits)
        .set({ hits: sql`max(${hits.hits} - 1, 0)` })
        .where(eq(hits.key, full(key)))
        .run();
    },
    resetKey: (key) => {
      db.delete(hits)
        .where(eq(hits.key, full(key)))
        .run();
    },
  };
}
