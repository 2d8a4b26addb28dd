import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';

import * as schema from './schema';

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

export const defaultDatabasePath = path.join('data', 'lobewright.sqlite');
const migrationsFolder = path.resolve(__dirname, '..', 'drizzle');

/** Opens (or creates) the SQLite file, turns on WAL and foreign keys, and applies every migration. */
export function openDb(file: string = process.env.DATABASE_PATH || defaultDatabasePath): Db {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const client = new Database(file);
  client.pragma('journal_mode = WAL');
  client.pragma('foreign_keys = ON');
  client.pragma('busy_timeout = 5000');
  client.pragma('synchronous = NORMAL');
  const db = immediateByDefault(drizzle({ client, schema }));
  migrate(db, { migrationsFolder });
  return db;
}

/**
 * Every transaction opened through `db.transaction` begins IMMEDIATE unless it asks otherwise: it takes the
 * write lock at BEGIN, so a second connection (another worker process on the same file) waits its turn
 * (busy_timeout) instead of failing half-way. A DEFERRED transaction that reads, then writes after another
 * connection committed, fails with SQLITE_BUSY_SNAPSHOT, and waiting cannot save it
 * (https://www.sqlite.org/lang_transaction.html, "Deferred, Immediate, and Exclusive Transactions").
 * Nested calls are savepoints and take no lock of their own.
 */
function immediateByDefault(db: Db): Db {
  const begin = db.transaction.bind(db);
  db.transaction = ((run, config) => begin(run, { behavior: 'immediate', ...config })) as Db['transaction'];
  return db;
}

export { schema };
