import type { Db } from '@/db';

type Reader = Pick<Db, 'select'>;

const statements = new WeakMap<Reader, Map<string, unknown>>();

/**
 * A query built and prepared once per database handle, then reused. Drizzle
 * otherwise builds the SQL and better-sqlite3 prepares it on every call, which
 * costs more than running it on the hot read paths (session, membership, sheet).
 * Parameters go in through `sql.placeholder(name)`.
 */
export function prepared<T>(db: Reader, key: string, build: (db: Reader) => T): T {
  let byKey = statements.get(db);
  if (!byKey) statements.set(db, (byKey = new Map()));
  let statement = byKey.get(key) as T | undefined;
  if (statement === undefined) byKey.set(key, (statement = build(db)));
  return statement;
}
