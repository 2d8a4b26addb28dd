/**
 * Online backup of the database while the server runs, with SQLite's backup
 * API (better-sqlite3's `db.backup()`). The copy is one self-contained file
 * (rollback journal, not WAL) and passes `PRAGMA integrity_check` before it
 * gets its name.
 *
 * Run: npm run db:backup [-- <file>]   (default backups/lobewright-<UTC time>.sqlite)
 */
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import { readConfig } from '@/server/config';

/** UTC time for file names, `2026-12-02T03-34-33-000Z`: sorts by time, safe on every file system. */
export const fileTime = (now: Date) => now.toISOString().replace(/[:.]/g, '-');

/** `backups/lobewright-<UTC time>.sqlite`. */
export function defaultBackupFile(now: Date = new Date()): string {
  return path.join('backups', `lobewright-${fileTime(now)}.sqlite`);
}

/** Opens a database file read-only and throws unless it passes integrity_check and holds Lobewright's tables. */
export function checkDatabaseFile(file: string): { jobs: number; users: number } {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    const check = db.pragma('integrity_check', { simple: true });
    if (check !== 'ok') throw new Error(`${file} failed its integrity check: ${String(check)}`);
    const tables = new Set((db.prepare("select name from sqlite_master where type = 'table'").all() as { name: string }[]).map((t) => t.name));
    if (!tables.has('jobs') || !tables.has('users')) throw new Error(`${file} is not a Lobewright database (no jobs or users table)`);
    const count = (table: string) => (db.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
    return { jobs: count('jobs'), users: count('users') };
  } finally {
    db.close();
  }
}

/**
 * Copies `source` to `target` while other connections (the server) keep writing.
 * The pages go over in one step: SQLite restarts a stepwise backup whenever
 * another connection writes, so small steps could restart for ever on a busy
 * server. In WAL mode the step only holds a read snapshot; writers carry on.
 */
export async function backupDatabase(source: string, target: string): Promise<{ target: string; pages: number; jobs: number }> {
  if (!fs.existsSync(source)) throw new Error(`No database at ${source}: check DATABASE_PATH`);
  if (fs.existsSync(target)) throw new Error(`${target} exists already: name a new file`);
  fs.mkdirSync(path.dirname(path.resolve(target)), { recursive: true });
  const partial = `${target}.partial`;
  fs.rmSync(partial, { force: true });
  const db = new Database(source, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 5000');
    const { totalPages } = await db.backup(partial, { progress: () => 0x7fffffff });
    const copy = new Database(partial);
    try {
      copy.pragma('journal_mode = DELETE');
    } finally {
      copy.close();
    }
    const { jobs } = checkDatabaseFile(partial);
    fs.renameSync(partial, target);
    return { target, pages: totalPages, jobs };
  } catch (error) {
    fs.rmSync(partial, { force: true });
    throw error;
  } finally {
    db.close();
  }
}

if (require.main === module) {
  const { databasePath } = readConfig();
  const target = process.argv[2] || defaultBackupFile();
  backupDatabase(databasePath, target)
    .then(({ pages, jobs }) => console.log(`Backed up ${databasePath} to ${target} (${pages} pages, ${jobs} jobs, integrity ok).`))
    .catch((error: unknown) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    });
}
