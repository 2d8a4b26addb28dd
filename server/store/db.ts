import type { Db } from '@/db';

/** Reads only: the database handle or a transaction. */
export type Reader = Pick<Db, 'select'>;
/** A transaction's (or the handle's) reads and writes. */
export type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete'>;

/**
 * Runs inside a write's transaction, after the write: what must commit with it or not at all (a route's
 * mail goes to the outbox this way).
 */
export type AfterWrite<T> = (tx: Writer, written: T) => void;

/** Who writes, in which shop: the scope of every shop record and the audit row's who. */
export type Actor = { shopId: string; userId: string };

/** Answers when the database does (the health check). */
export function pingDatabase(db: Db) {
  db.$client.prepare('select 1').get();
}
