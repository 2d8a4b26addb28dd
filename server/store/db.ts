import type { Db } from '@/db';

/** Reads only: the database handle or a transaction. */
export type Reader = Pick<Db, 'select'>;
/** A transaction's (or the handle's) reads and writes. */
export type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete'>;

/** Who writes, in which shop: the scope of every shop record and the audit row's who. */
export type Actor = { shopId: string; userId: string };

/** Answers when the database does (the health check). */
export function pingDatabase(db: Db) {
  db.$client.prepare('select 1').get();
}
